/**
 * The run machine applied to events that are already typed: check one event against the
 * current state, and rebuild the state from a log. No schema parsing here — the server parses
 * every incoming body with `runEvent` first (run-replay.ts), and the runner in the browser only
 * ever handles events it built itself or read back from the server's log, so it loads this
 * module without the schema library.
 */
import { initialTransition, transition, type SnapshotFrom, type StateValue } from 'xstate';
import type { Step } from '../procedure/schema';
import { DomainError, isDomainError } from '../errors';
import type { RunEvent } from './run-events';
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
export function machineFor(steps: Step[]): RunMachine {
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

/** Apply one typed event to a snapshot; never throws for a refused event. */
export function applyRunEvent(steps: Step[], before: RunSnapshot, event: RunEvent): ApplyResult {
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

/**
 * Rebuild the run from typed log entries; throws a DomainError naming the entry if one is
 * refused (a corrupt log). `check` may vet each raw entry first (the server's schema parse).
 */
export function replayEvents<T>(steps: Step[], entries: readonly T[], check: (entry: T, index: number) => RunEvent = (e) => e as unknown as RunEvent): RunSnapshot {
  const machine = machineFor(steps);
  let snapshot = initialTransition(machine)[0];
  entries.forEach((raw, i) => {
    const event = check(raw, i);
    const refusal = refusalFor(snapshot, event);
    if (refusal) throw new DomainError(refusal.code, `Log entry ${i + 1} (${event.type}) was refused: ${refusal.message}`, { index: i });
    snapshot = transition(machine, snapshot, event)[0];
  });
  return snapshot;
}
