/**
 * What a teardown report or build sheet shows, gathered from a run's pinned steps and its log
 * (replayed through the run machine) plus signatures and the records kept beside the log.
 * Pure: no I/O, so the benchmark and the tests build it from plain data.
 */
import { isMarkedExample } from '../../domain/procedure/example-data';
import type { Step, StepOf } from '../../domain/procedure/schema';
import { expandPasses, describePassTarget } from '../../domain/passes';
import { measureDetail, replay, stepStates, type RunEvent } from '../../domain/run';
import { formatQuantity } from '../../domain/units';

export type ReportKind = 'teardown' | 'build';

export type ReportEvent = { seq: number; type: string; payload: RunEvent; actorName: string; actorRole: string; recordedAt: string };
export type ReportSignature = { scope: string; signerName: string; signerRole: string; meaning: string; signedAt: string; recordHash: string; matches: boolean };
/** A tag as kept beside the log (tags service) or as recorded when a tag-part step completed. */
export type ReportTag = { stepId: string | null; part: string; position: string; disposition: string; bin: string; photos: number; label?: string };
export type ReportFinding = { title: string; severity: string; description: string; parts: string[]; photos: Array<{ caption: string; jpeg?: Uint8Array; png?: Uint8Array }> };

export type ReportInput = {
  shopName: string;
  job: { code: string; unitDescription: string; serial: string; hoursOrOdometer: string; customer: string };
  procedure: { name: string; kind: string; revisionNumber: number; description: string };
  run: { id: string; status: string; createdAt: string };
  steps: Step[];
  events: ReportEvent[];
  signatures: ReportSignature[];
  tags?: ReportTag[];
  findings?: ReportFinding[];
  extraParts?: Array<{ part: string; quantity: number; why: string }>;
  photos?: number;
  generatedAt: string;
  /** The replayed run, when the caller has it already (saves a second replay). */
  snapshot?: ReturnType<typeof replay>;
};

export type ReadingRow = { stepId: string; step: string; position: string; readings: string; result: string; spec: string; inSpec: boolean | null };
export type PassRow = { step: string; pass: number; target: string; fastener: string; by: string; at: string };
export type ReportData = {
  kind: ReportKind;
  title: string;
  exampleData: boolean;
  shopName: string;
  job: ReportInput['job'];
  procedure: ReportInput['procedure'];
  run: ReportInput['run'] & { done: number; total: number };
  steps: Array<{ stepId: string; n: number; title: string; kind: string; state: string; by: string; at: string; note: string }>;
  readings: ReadingRow[];
  passes: PassRow[];
  torques: Array<{ step: string; target: string; applied: string; by: string; at: string }>;
  shims: Array<{ step: string; position: string; measured: string; installed: string; chosen: string }>;
  deviations: Array<{ stepId: string; step: string; kind: string; reason: string; requestedBy: string; decision: string }>;
  tags: ReportTag[];
  findings: ReportFinding[];
  parts: Array<{ part: string; quantity: number; why: string }>;
  signatures: ReportSignature[];
  photos: number;
  generatedAt: string;
};

/** Teardown report for teardown (and inspection) procedures; build sheet for assembly ones. */
export const reportKindOf = (procedureKind: string): ReportKind => (procedureKind === 'assembly' ? 'build' : 'teardown');
export const REPORT_TITLES: Record<ReportKind, string> = { teardown: 'Teardown report', build: 'Build sheet' };

const when = (iso: string) => iso.replace('T', ' ').slice(0, 16);
const specText = (s: StepOf<'measure'>) => `${s.spec.nominal} (${s.spec.min} to ${s.spec.max}) ${s.spec.unit}`;

/** Everything a report shows, from the run's data. */
export function buildReportData(input: ReportInput): ReportData {
  const kind = reportKindOf(input.procedure.kind);
  const snapshot = input.snapshot ?? replay(input.steps, input.events.map((e) => e.payload));
  const states = stepStates(snapshot);
  const titleOf = new Map(input.steps.map((s, i) => [s.id, `${i + 1}. ${s.title}`]));
  const byStep = new Map<string, ReportEvent[]>();
  for (const e of input.events) {
    const list = byStep.get(e.payload.stepId) ?? [];
    list.push(e);
    byStep.set(e.payload.stepId, list);
  }

  const steps = input.steps.map((s, i) => {
    const evs = byStep.get(s.id) ?? [];
    const last = evs.at(-1);
    const complete = [...evs].reverse().find((e) => e.type === 'step.complete' || e.type === 'hold.sign' || e.type === 'measure.submit' || e.type === 'deviation.approve');
    const note = complete?.payload.type === 'step.complete' ? complete.payload.note ?? '' : complete?.payload.type === 'hold.sign' ? complete.payload.meaning : '';
    return { stepId: s.id, n: i + 1, title: s.title, kind: s.kind, state: states[i]?.state ?? 'locked', by: (complete ?? last)?.actorName ?? '', at: (complete ?? last) ? when((complete ?? last)!.recordedAt) : '', note };
  });

  const readings: ReadingRow[] = [];
  const shims: ReportData['shims'] = [];
  for (const s of input.steps) {
    if (s.kind !== 'measure') continue;
    const detail = measureDetail(snapshot, s.id);
    if (!detail) continue;
    const resultByPos = new Map((detail.result?.positions ?? []).map((p) => [p.position, p]));
    for (const position of s.positions) {
      const slots = detail.slots.filter((sl) => sl.position === position);
      const values = slots.map((sl) => (detail.readings[sl.key] === undefined ? `${sl.label}: not read` : `${sl.label}: ${detail.readings[sl.key]} ${s.unit}`));
      const r = resultByPos.get(position);
      readings.push({ stepId: s.id, step: titleOf.get(s.id)!, position, readings: values.join('; '), result: r?.detail ?? 'not read', spec: specText(s), inSpec: r?.inSpec ?? null });
      if (s.method.kind === 'valve-shim' && r?.shim) {
        shims.push({
          step: titleOf.get(s.id)!, position, measured: r.value === null ? '' : `${r.value} ${s.unit}`,
          installed: r.readings?.shim === undefined ? '' : `${r.readings.shim} ${s.unit}`,
          chosen: r.shim.chosen === null ? 'no stocked size fits' : `${r.shim.chosen} ${s.unit}${r.shim.resultingClearance === null ? '' : ` (gives ${r.shim.resultingClearance} ${s.unit})`}`,
        });
      }
    }
  }

  const passes: PassRow[] = [];
  const torques: ReportData['torques'] = [];
  const deviations: ReportData['deviations'] = [];
  const tags: ReportTag[] = [...(input.tags ?? [])];
  const parts = new Map<string, { part: string; quantity: number; why: string }>();
  const addPart = (part: string, quantity: number, why: string) => {
    const key = `${part}|${why}`;
    const p = parts.get(key);
    if (p) p.quantity += quantity;
    else parts.set(key, { part, quantity, why });
  };
  for (const s of input.steps) {
    const evs = byStep.get(s.id) ?? [];
    if (s.kind === 'fastener-sequence') {
      const actions = expandPasses(s);
      const labels = new Map(s.map.fasteners.map((f) => [f.id, f.label]));
      for (const e of evs) {
        if (e.payload.type !== 'fastener.confirm') continue;
        const { pass, fastenerId } = e.payload;
        const action = actions.find((a) => a.pass === pass && a.fastenerId === fastenerId);
        passes.push({ step: titleOf.get(s.id)!, pass, target: action ? describePassTarget(action.target) : '', fastener: labels.get(fastenerId) ?? fastenerId, by: e.actorName, at: when(e.recordedAt) });
      }
      if (s.torqueToYield && steps[input.steps.indexOf(s)]?.state !== 'locked') addPart(s.fastenerPart || `Fastener (${s.title})`, s.map.fasteners.length, 'torque-to-yield: never reused');
    }
    if (s.kind === 'torque') {
      const applied = [...evs].reverse().find((e) => e.payload.type === 'torque.confirm' || (e.payload.type === 'step.complete' && e.payload.applied));
      const q = applied?.payload.type === 'torque.confirm' ? applied.payload.applied : applied?.payload.type === 'step.complete' ? applied.payload.applied : undefined;
      torques.push({ step: titleOf.get(s.id)!, target: `${formatQuantity(s.target)}${s.angleDegrees ? ` + ${s.angleDegrees}°` : ''}`, applied: q ? formatQuantity(q) : 'not recorded', by: applied?.actorName ?? '', at: applied ? when(applied.recordedAt) : '' });
    }
    if (s.kind === 'tag-part' && !input.tags) {
      const done = [...evs].reverse().find((e) => e.payload.type === 'step.complete');
      for (const t of done?.payload.type === 'step.complete' ? done.payload.tags ?? [] : []) tags.push({ stepId: s.id, part: s.partName, position: t.position, disposition: t.disposition, bin: t.bin ?? s.bin, photos: 0 });
    }
    if (s.kind === 'replace' && steps[input.steps.indexOf(s)]?.state === 'done') for (const p of s.parts) addPart(p.part, p.quantity, kind === 'build' ? `replaced (${s.title})` : `listed in ${s.title}`);
    let open: { kind: string; reason: string; by: string } | null = null;
    for (const e of evs) {
      if (e.payload.type === 'deviation.request') open = { kind: e.payload.kind, reason: e.payload.reason, by: e.actorName };
      else if ((e.payload.type === 'deviation.approve' || e.payload.type === 'deviation.reject') && open) {
        const decision = e.payload.type === 'deviation.approve' ? `approved by ${e.actorName}${e.payload.note ? `: ${e.payload.note}` : ''}` : `rejected by ${e.actorName}: ${e.payload.reason}`;
        deviations.push({ stepId: s.id, step: titleOf.get(s.id)!, kind: open.kind, reason: open.reason, requestedBy: open.by, decision });
        open = null;
      }
    }
    if (open) deviations.push({ stepId: s.id, step: titleOf.get(s.id)!, kind: open.kind, reason: open.reason, requestedBy: open.by, decision: 'waiting for a lead' });
  }
  for (const t of tags) if (t.disposition === 'replace') addPart(t.part, 1, `tag ${t.position}: replace`);
  for (const f of input.findings ?? []) for (const p of f.parts) addPart(p, 1, `finding: ${f.title}`);
  for (const p of input.extraParts ?? []) addPart(p.part, p.quantity, p.why);

  return {
    kind,
    title: REPORT_TITLES[kind],
    exampleData: isMarkedExample(input.procedure.description) || input.steps.some((s) => isMarkedExample(s.body)),
    shopName: input.shopName,
    job: input.job,
    procedure: input.procedure,
    run: { ...input.run, done: steps.filter((s) => s.state === 'done' || s.state === 'signed' || s.state === 'deviated').length, total: steps.length },
    steps, readings, passes, torques, shims, deviations, tags,
    findings: input.findings ?? [],
    parts: [...parts.values()],
    signatures: input.signatures,
    photos: input.photos ?? 0,
    generatedAt: input.generatedAt,
  };
}
