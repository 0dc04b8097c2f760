/**
 * The job's one list of parts to replace, merged from the work: replace steps of its runs,
 * torque-to-yield fastener sequences (never reused), findings, and tags set to "replace".
 * Lines with the same part name (case and spacing ignored) become one row; a lead's stored
 * quantity overrides the computed one and is shown as such.
 */
import type { Disposition, Step } from './procedure/schema';

export type PartsSourceKind = 'replace-step' | 'torque-to-yield' | 'finding' | 'tag';
export type PartsSource = { kind: PartsSourceKind; quantity: number; reason: string; runId?: string; stepId?: string; stepTitle?: string; findingId?: string; tagId?: string };
export type PartsRow = { key: string; part: string; quantity: number; computed: number; overridden: boolean; sources: PartsSource[] };

export type PartsWork = {
  runs: ReadonlyArray<{ id: string; procedureName: string; steps: readonly Step[] }>;
  tags: ReadonlyArray<{ id: string; code: string; partName: string; position: string; disposition: Disposition; runId: string; stepId: string }>;
  findings: ReadonlyArray<{ id: string; what: string; runId?: string | null; stepId?: string | null; partsToReplace: ReadonlyArray<{ part: string; quantity: number }> }>;
  overrides: ReadonlyArray<{ partKey: string; quantity: number }>;
};

/** The key parts merge on: trimmed, lower case, single spaces. */
export const partKey = (name: string) => name.trim().toLowerCase().replace(/\s+/g, ' ');

/** Every line of work that asks for a part, before merging. */
export function partsSources(work: Omit<PartsWork, 'overrides'>): Array<PartsSource & { part: string }> {
  const out: Array<PartsSource & { part: string }> = [];
  for (const run of work.runs) {
    for (const s of run.steps) {
      if (s.kind === 'replace')
        for (const p of s.parts) out.push({ part: p.part, kind: 'replace-step', quantity: p.quantity, reason: p.note ? `Replace step: ${p.note}` : 'Replace step', runId: run.id, stepId: s.id, stepTitle: s.title });
      if (s.kind === 'fastener-sequence' && s.torqueToYield && s.fastenerPart.trim())
        out.push({ part: s.fastenerPart, kind: 'torque-to-yield', quantity: s.map.fasteners.length, reason: `Torque-to-yield: ${s.map.fasteners.length} fasteners, never reused`, runId: run.id, stepId: s.id, stepTitle: s.title });
    }
  }
  for (const t of work.tags)
    if (t.disposition === 'replace') out.push({ part: t.partName, kind: 'tag', quantity: 1, reason: `Tag ${t.code} (${t.position}) set to replace`, runId: t.runId, stepId: t.stepId, tagId: t.id });
  for (const f of work.findings)
    for (const p of f.partsToReplace) out.push({ part: p.part, kind: 'finding', quantity: p.quantity, reason: `Finding: ${f.what}`, findingId: f.id, ...(f.runId ? { runId: f.runId } : {}), ...(f.stepId ? { stepId: f.stepId } : {}) });
  return out;
}

/**
 * Merges the sources into rows. Torque-to-yield fasteners are counted once per part across
 * runs (the largest run's count), because a teardown and the assembly built from it list the
 * same bolts; every other source adds up.
 */
export function buildPartsList(work: PartsWork): PartsRow[] {
  const rows = new Map<string, { part: string; sources: PartsSource[] }>();
  for (const { part, ...src } of partsSources(work)) {
    const key = partKey(part);
    if (!key) continue;
    const row = rows.get(key) ?? { part: part.trim(), sources: [] };
    row.sources.push(src);
    rows.set(key, row);
  }
  const overrides = new Map(work.overrides.map((o) => [o.partKey, o.quantity]));
  return [...rows.entries()]
    .map(([key, { part, sources }]) => {
      const ttyByRun = new Map<string, number>();
      let computed = 0;
      for (const s of sources) {
        if (s.kind === 'torque-to-yield') ttyByRun.set(s.runId ?? '', (ttyByRun.get(s.runId ?? '') ?? 0) + s.quantity);
        else computed += s.quantity;
      }
      computed += Math.max(0, ...ttyByRun.values());
      const o = overrides.get(key);
      return { key, part, quantity: o ?? computed, computed, overridden: o !== undefined, sources };
    })
    .sort((a, b) => a.part.localeCompare(b.part));
}

/** Rows for the CSV export and the order sheet: part, quantity, reasons. */
export const partsCsvRows = (rows: readonly PartsRow[]) =>
  rows.map((r) => [r.part, r.quantity, r.overridden ? `${r.computed} (set by hand to ${r.quantity})` : r.computed, r.sources.map((s) => s.reason + (s.stepTitle ? ` — ${s.stepTitle}` : '')).join('; ')] as const);
export const PARTS_CSV_HEADER = ['Part', 'Quantity', 'Computed', 'Reasons'] as const;
