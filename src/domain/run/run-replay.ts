/**
 * The server's side of the run: parse an incoming event (any JSON) with the one event schema,
 * check it against the current state, and rebuild the state from the append-only log. Pure:
 * the caller loads and stores.
 */
import type { Step } from '../procedure/schema';
import { DomainError } from '../errors';
import { runEvent, type RunEvent } from './run-events';
import { applyRunEvent, replayEvents, restoreRun, type ApplyResult, type RunSnapshot, type StoredRun } from './run-apply';

export { machineFor, startRun, storeRun, restoreRun, refusalFor, applyRunEvent, replayEvents } from './run-apply';
export type { ApplyResult, RunSnapshot, StoredRun } from './run-apply';

/** Validate and apply one incoming event (any JSON) to a stored state or a valid log; never throws for a refused event. */
export function applyEvent(steps: Step[], snapshotOrLog: StoredRun | readonly RunEvent[], input: unknown): ApplyResult {
  const parsed = runEvent.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue && issue.path.length > 0 ? `${issue.path.join('.')}: ` : '';
    return { ok: false, code: 'invalid-input', message: `${where}${issue?.message ?? 'Not a run event'}` };
  }
  // A corrupt stored log is the server's problem, not this event's: replay throws for it.
  const before: RunSnapshot = isLog(snapshotOrLog) ? replay(steps, snapshotOrLog) : restoreRun(steps, snapshotOrLog);
  return applyRunEvent(steps, before, parsed.data);
}

const isLog = (x: StoredRun | readonly RunEvent[]): x is readonly RunEvent[] => Array.isArray(x);

/** Rebuild the run from its stored log, parsing each entry; throws a DomainError naming the entry if any is refused (a corrupt log). */
export function replay(steps: Step[], events: readonly unknown[]): RunSnapshot {
  return replayEvents(steps, events, (raw, i) => {
    const parsed = runEvent.safeParse(raw);
    if (!parsed.success) throw new DomainError('invalid-input', `Log entry ${i + 1} is not a run event`, { index: i });
    return parsed.data;
  });
}
