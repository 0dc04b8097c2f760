/**
 * The server's side of the run: check one event against the current state, and rebuild the
 * state from the append-only log. Pure: the caller loads and stores.
 */
import { initialTransition, transition, type SnapshotFrom, type StateValue } from 'xstate';
import type { Step } from '../procedure/schema';
import { DomainError, isDomainError } from '../errors';
import { runEvent, type RunEvent } from './run-events';
import { explainRefusal, type Refusal } from './run-rules';
import { createRunMachine, type RunMachine } from './run.machine';
import type { RunContext } from './run-types';
import { runPhase } from './run-view';

/** A live snapshot of the run machine. */
export type RunSnapshot = SnapshotFrom<RunMachine>;
/** What the server stores between events: the steps come from the pinned revision instead. */
export type StoredRun = { value: StateValue; context: Omit<RunContext, 'steps'> };

const machines = new WeakMap<Step[], RunMachine>();
/** One machine per steps array: the server applies many events to one revision. */
function machineFor(steps: Step[]): RunMachine {
  let machine = machines.get(steps);
  if (!machine) {
    machine = createRunMachine(steps);
    machines.set(steps, machine);
  }
  return machine;
}

/** The snapshot before any event. */
export const startRun = (steps: Step[]): RunSnapshot => initialTransition(machineFor(steps))[0];

/** The part of a snapshot worth storing (JSON-safe, without the revision's steps). */
export function storeRun(snapshot: RunSnapshot): StoredRun {
  const { steps: _steps, ...context } = snapshot.context;
  return { value: snapshot.value, context };
}

/** A live snapshot from a stored one; the given steps (the pinned revision) govern. */
export function restoreRun(steps: Step[], stored: StoredRun): RunSnapshot {
  return machineFor(steps).resolveState({ value: stored.value, context: { ...stored.context, steps } });
}

/** Why this snapshot refuses this event, or null when it accepts it. */
export function refusalFor(snapshot: RunSnapshot, event: RunEvent): Refusal | null {
  if (snapshot.can(event)) return null;
  // The machine's guards and the rule table are one source; this fallback only covers a gap.
  return explainRefusal(snapshot.context, runPhase(snapshot), event) ?? { code: 'out-of-order', message: 'This is not accepted now' };
}

/** The result of applying one event: the next snapshot, or a refusal that says what is expected. */
export type ApplyResult = { ok: true; snapshot: RunSnapshot; event: RunEvent } | ({ ok: false } & Refusal);

/** Validate and apply one incoming event (any JSON) to a stored state or a valid log; never throws for a refused event. */
export function applyEvent(steps: Step[], snapshotOrLog: StoredRun | readonly RunEvent[], input: unknown): ApplyResult {
  const parsed = runEvent.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue && issue.path.length > 0 ? `${issue.path.join('.')}: ` : '';
    return { ok: false, code: 'invalid-input', message: `${where}${issue?.message ?? 'Not a run event'}` };
  }
  const event = parsed.data;
  // A corrupt stored log is the server's problem, not this event's: replay throws for it.
  const before = isLog(snapshotOrLog) ? replay(steps, snapshotOrLog) : restoreRun(steps, snapshotOrLog);
  try {
    const refusal = refusalFor(before, event);
    if (refusal) return { ok: false, ...refusal };
    return { ok: true, snapshot: transition(machineFor(steps), before, event)[0], event };
  } catch (e) {
    if (isDomainError(e) && (e.code === 'out-of-order' || e.code === 'not-allowed')) return { ok: false, code: e.code, message: e.message };
    if (isDomainError(e)) return { ok: false, code: 'invalid-input', message: e.message };
    throw e;
  }
}

const isLog = (x: StoredRun | readonly RunEvent[]): x is readonly RunEvent[] => Array.isArray(x);

/** Rebuild the run from its log; throws a DomainError naming the entry if any entry is refused (a corrupt log). */
export function replay(steps: Step[], events: readonly unknown[]): RunSnapshot {
  const machine = machineFor(steps);
  let snapshot = initialTransition(machine)[0];
  events.forEach((raw, i) => {
    const parsed = runEvent.safeParse(raw);
    if (!parsed.success) throw new DomainError('invalid-input', `Log entry ${i + 1} is not a run event`, { index: i });
    const refusal = refusalFor(snapshot, parsed.data);
    if (refusal) throw new DomainError(refusal.code, `Log entry ${i + 1} (${parsed.data.type}) was refused: ${refusal.message}`, { index: i });
    snapshot = transition(machine, snapshot, parsed.data)[0];
  });
  return snapshot;
}
