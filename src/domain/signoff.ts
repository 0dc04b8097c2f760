/**
 * Sign-off rules, pure: the meanings a signature can state, the canonical record a signature
 * covers (and its hash, given a hash function), and who may sign what. The server loads the
 * data, hashes with node:crypto and stores; the review pages and the reports show the result.
 */
import { canonicalJson } from './canonical-json';

/** The stated meanings of a signature, in Torquetrail's words. */
export const SIGNOFF_MEANINGS = ['reviewed', 'approved-for-assembly', 'approved-for-release'] as const;
export type SignoffMeaning = (typeof SIGNOFF_MEANINGS)[number];

export const MEANING_LABELS: Record<SignoffMeaning, string> = {
  reviewed: 'Reviewed',
  'approved-for-assembly': 'Approved for assembly',
  'approved-for-release': 'Approved for release to customer',
};

/** What a signature covers: the whole run, or the work before one hold point. */
export type SignoffScope = { kind: 'run' } | { kind: 'hold-point'; stepId: string };

/** Events that are work at the bench; whoever sent one of them "worked the run". */
export const WORK_EVENT_TYPES: ReadonlySet<string> = new Set([
  'step.start', 'fastener.confirm', 'reading.enter', 'measure.submit', 'caution.acknowledge', 'torque.confirm', 'step.complete', 'deviation.request',
]);

type StepLike = { id: string; kind: string; title: string };
type EventLike = { seq: number; type: string; payload: { stepId?: string } & Record<string, unknown>; actorId: string };
/** Extra records kept outside the run log (tags, findings, photos), each tied to a step when known. */
type ExtraLike = { stepId?: string | null } & Record<string, unknown>;

export type SignoffRecordInput = {
  run: { id: string; jobId: string; jobCode: string; procedureName: string; revisionId: string; revisionNumber: number };
  steps: readonly StepLike[];
  events: readonly EventLike[];
  extras?: Record<string, readonly ExtraLike[]>;
};

/** The canonical record of a signature: plain JSON, stable under key order. */
export type SignoffRecord = {
  v: 1;
  scope: SignoffScope;
  run: SignoffRecordInput['run'];
  steps: Array<{ id: string; kind: string; title: string }>;
  events: Array<{ seq: number; type: string; actorId: string; payload: Record<string, unknown> }>;
  extras: Record<string, ExtraLike[]>;
};

/** Step ids a scope covers: every step for a run; the steps before the hold point for a hold point. */
export function coveredStepIds(steps: readonly StepLike[], scope: SignoffScope): string[] {
  if (scope.kind === 'run') return steps.map((s) => s.id);
  const index = steps.findIndex((s) => s.id === scope.stepId);
  if (index < 0) throw new Error(`There is no step "${scope.stepId}" in this procedure`);
  return steps.slice(0, index).map((s) => s.id);
}

/**
 * The record a signature covers. A run signature covers the whole log, so any later event
 * changes it; a hold-point signature covers the steps before the hold point and their events
 * (a send-back to one of them changes it; work after the hold point does not).
 */
export function signoffRecord(input: SignoffRecordInput, scope: SignoffScope): SignoffRecord {
  const ids = new Set(coveredStepIds(input.steps, scope));
  const inScope = (stepId: string | null | undefined) => scope.kind === 'run' || (stepId != null && ids.has(stepId));
  const extras: Record<string, ExtraLike[]> = {};
  for (const [name, rows] of Object.entries(input.extras ?? {})) extras[name] = rows.filter((r) => inScope(r.stepId ?? null));
  return {
    v: 1,
    scope,
    run: { ...input.run },
    steps: input.steps.filter((s) => ids.has(s.id)).map((s) => ({ id: s.id, kind: s.kind, title: s.title })),
    events: input.events.filter((e) => inScope(e.payload.stepId)).map((e) => ({ seq: e.seq, type: e.type, actorId: e.actorId, payload: e.payload })),
    extras,
  };
}

/** Hex digest of the record's canonical JSON, with the hash function the caller supplies (SHA-256 on the server). */
export const recordHash = (record: SignoffRecord, sha256Hex: (text: string) => string): string => sha256Hex(canonicalJson(record));

export type SignerCheck = {
  signer: { userId: string; role: string };
  /** Whether the signer's role holds signoff:sign (the machine's own rule decides hold-point signers). */
  roleMaySign: boolean;
  scope: SignoffScope;
  events: readonly Pick<EventLike, 'type' | 'actorId'>[];
  allowSelfSignoff: boolean;
  runComplete: boolean;
  /** For a hold point: the step the run waits on now. */
  currentStepId: string | null;
  /** Run signatures already stored that still match: a second identical one is refused. */
  alreadySignedByThem?: boolean;
};

export type SignRefusal = { code: 'not-allowed' | 'out-of-order'; message: string };

/** Whoever sent any work event on the run. */
export const workersOf = (events: readonly Pick<EventLike, 'type' | 'actorId'>[]): Set<string> =>
  new Set(events.filter((e) => WORK_EVENT_TYPES.has(e.type)).map((e) => e.actorId));

/** Why this signer may not sign now, or null when they may. Order: role, own work, state of the run. */
export function checkSigner(c: SignerCheck): SignRefusal | null {
  if (c.scope.kind === 'run' && !c.roleMaySign) return { code: 'not-allowed', message: `Your role (${c.signer.role}) may not sign off a run; a reviewer or an owner does.` };
  if (!c.allowSelfSignoff && workersOf(c.events).has(c.signer.userId)) {
    return { code: 'not-allowed', message: 'You worked on this run, so someone else must sign it off (the shop does not allow signing one’s own work).' };
  }
  if (c.scope.kind === 'run') {
    if (!c.runComplete) return { code: 'out-of-order', message: 'This run is not finished yet; a run is signed off once every step is done.' };
    if (c.alreadySignedByThem) return { code: 'out-of-order', message: 'You have already signed this run and nothing has changed since.' };
  } else if (c.currentStepId !== c.scope.stepId) {
    return { code: 'out-of-order', message: 'This hold point is not waiting for a signature now.' };
  }
  return null;
}
