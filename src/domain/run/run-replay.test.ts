import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createActor } from 'xstate';
import { isDomainError } from '../errors';
import { createRunMachine } from './run.machine';
import type { RunEvent } from './run-events';
import { applyEvent, applyRunEvent, refusalFor, replay, replayEvents, restoreRun, startRun, storeRun, type StoredRun } from './run-replay';
import { explainRefusal } from './run-rules';
import { runPhase, runProgress, stepStates } from './run-view';
import { FULL_LOG, PROCEDURE, ev, lead, lead2, owner, reviewer, tech, tech2 } from './run.fixtures';

const SEED = { seed: 20240611, numRuns: 150 };
const json = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

describe('a full run', () => {
  const final = replay(PROCEDURE, FULL_LOG);

  it('replays from its log to the finished traveler', () => {
    expect(final.value).toBe('complete');
    expect(stepStates(final).map((s) => s.state)).toEqual(['done', 'done', 'done', 'done', 'done', 'deviated', 'done', 'signed', 'done', 'done']);
    expect(runProgress(final)).toEqual({ done: 10, total: 10, complete: true });
  });

  it('reaches the same state through an actor, event by event', () => {
    const actor = createActor(createRunMachine(PROCEDURE)).start();
    FULL_LOG.forEach((e) => actor.send(e));
    expect(actor.getSnapshot().value).toEqual(final.value);
    expect(actor.getSnapshot().context).toEqual(final.context);
  });

  it('reaches the same state through the unparsed core the browser uses (replayEvents, applyRunEvent)', () => {
    expect(json(storeRun(replayEvents(PROCEDURE, FULL_LOG)))).toEqual(json(storeRun(final)));
    let snap = startRun(PROCEDURE);
    for (const e of FULL_LOG) {
      const result = applyRunEvent(PROCEDURE, snap, e);
      if (!result.ok) throw new Error(`${e.type} refused: ${result.message}`);
      snap = result.snapshot;
    }
    expect(json(storeRun(snap))).toEqual(json(storeRun(final)));
  });

  it('refuses an out-of-order event in the unparsed core with the same words as the parsing one', () => {
    const start = startRun(PROCEDURE);
    const late = FULL_LOG[3]!;
    const core = applyRunEvent(PROCEDURE, start, late);
    const parsed = applyEvent(PROCEDURE, storeRun(start), json(late));
    expect(core.ok).toBe(false);
    expect(core).toEqual(parsed);
    expect(() => replayEvents(PROCEDURE, [late])).toThrow(/Log entry 1/);
  });

  it('reaches the same state through applyEvent with JSON storage between events', () => {
    let stored: StoredRun = json(storeRun(startRun(PROCEDURE)));
    for (const e of FULL_LOG) {
      const result = applyEvent(PROCEDURE, stored, json(e));
      if (!result.ok) throw new Error(`${e.type} refused: ${result.message}`);
      stored = json(storeRun(result.snapshot));
    }
    expect(stored).toEqual(json(storeRun(final)));
  });

  it('continues from a persisted snapshot the same as from the log', () => {
    const machine = createRunMachine(PROCEDURE);
    const half = createActor(machine).start();
    FULL_LOG.slice(0, 20).forEach((e) => half.send(e));
    const persisted = json(half.getPersistedSnapshot());
    const resumed = createActor(machine, { snapshot: persisted as typeof persisted & object }).start();
    FULL_LOG.slice(20).forEach((e) => resumed.send(e));
    expect(resumed.getSnapshot().context).toEqual(final.context);
  });

  it('rejects a corrupt log, naming the entry', () => {
    const swapped = [...FULL_LOG];
    [swapped[1], swapped[2]] = [swapped[2] as RunEvent, swapped[1] as RunEvent];
    expect(() => replay(PROCEDURE, swapped)).toThrowError('Log entry 2 (step.complete) was refused: Next: start the step');
    try {
      replay(PROCEDURE, [FULL_LOG[0], { type: 'hold.sign' }]);
      expect.unreachable();
    } catch (e) {
      expect(isDomainError(e) && e.code).toBe('invalid-input');
    }
  });

  it('lets the given steps govern a stored run', () => {
    const stored = json(storeRun(replay(PROCEDURE, FULL_LOG.slice(0, 3))));
    expect(restoreRun(PROCEDURE, stored).context.steps).toBe(PROCEDURE);
  });
});

const ids = [...PROCEDURE.map((s) => s.id), 'nope'];
const actors = [tech, tech2, lead, lead2, owner, reviewer];
const head = { stepId: fc.constantFrom(...ids), actor: fc.constantFrom(...actors) };
const tagsFull = [{ position: 'Main 1', disposition: 'reuse' as const }, { position: 'Main 2', disposition: 'scrap' as const }];

/** Any well-formed event, mostly refused: wrong step, wrong actor, wrong fastener, wrong time. */
const anyEvent: fc.Arbitrary<RunEvent> = fc
  .oneof(
    fc.record({ type: fc.constant('step.start' as const), ...head, hazards: fc.subarray(['lifting', 'hot-fluid'] as const) }),
    fc.record({ type: fc.constant('fastener.confirm' as const), ...head, pass: fc.integer({ min: 1, max: 3 }), fastenerId: fc.constantFrom('h1', 'h2', 'h6', 'h7', 'h10', 'h99') }),
    fc.record({ type: fc.constant('reading.enter' as const), ...head, key: fc.constantFrom('Main 1', 'Main 2', 'Main 9'), value: fc.constantFrom(60, 59.95, 60.01, -1) }),
    fc.record({ type: fc.constantFrom('measure.submit' as const, 'caution.acknowledge' as const), ...head }),
    fc.record({ type: fc.constant('torque.confirm' as const), ...head, applied: fc.constant({ value: 25, unit: 'N·m' as const }) }),
    fc.record({ type: fc.constant('step.complete' as const), ...head, tags: fc.constantFrom(undefined, tagsFull, tagsFull.slice(1)), applied: fc.constantFrom(undefined, { value: 20, unit: 'N·m' as const }) }),
    fc.record({ type: fc.constant('deviation.request' as const), ...head, kind: fc.constantFrom('skip' as const, 'out-of-spec' as const), reason: fc.constant('why') }),
    fc.record({ type: fc.constantFrom('deviation.approve' as const), ...head }),
    fc.record({ type: fc.constantFrom('deviation.reject' as const, 'run.reopen' as const), ...head, reason: fc.constant('again') }),
    fc.record({ type: fc.constant('hold.sign' as const), ...head, meaning: fc.constant('checked') }),
  )
  .map((e) => ev(e));

const prefix = fc.integer({ min: 0, max: FULL_LOG.length }).map((n) => FULL_LOG.slice(0, n));

describe('properties', () => {
  it('every prefix of a valid log replays, and finished work only grows along it', () => {
    fc.assert(
      fc.property(prefix, (log) => {
        const snapshot = replay(PROCEDURE, log);
        const shorter = replay(PROCEDURE, log.slice(0, -1));
        expect(runProgress(snapshot).done).toBeGreaterThanOrEqual(runProgress(shorter).done);
        expect(runProgress(snapshot).complete).toBe(log.length === FULL_LOG.length);
      }),
      SEED,
    );
  });

  it('a refused event never changes the state; can() and the refusal table agree', () => {
    fc.assert(
      fc.property(prefix, anyEvent, (log, event) => {
        const before = replay(PROCEDURE, log);
        const result = applyEvent(PROCEDURE, storeRun(before), event);
        expect(result.ok).toBe(before.can(event));
        expect(explainRefusal(before.context, runPhase(before), event) === null).toBe(before.can(event));
        if (!result.ok) {
          const actor = createActor(createRunMachine(PROCEDURE), { snapshot: before }).start();
          actor.send(event);
          expect(storeRun(actor.getSnapshot())).toEqual(storeRun(before));
          expect(refusalFor(before, event)?.message.length).toBeGreaterThan(0);
        }
      }),
      SEED,
    );
  });

  it('a random walk keeps only accepted events, and its log replays to where the walk ended', () => {
    // 'follow' takes the first event of the known-good log (or a lead's decision on a random
    // deviation) that the walk's state accepts, so the walk gets deep into the run; random events
    // in between push it off the happy path.
    const decisions = PROCEDURE.flatMap((s) => [owner, lead2].map((actor) => ev({ type: 'deviation.approve', stepId: s.id, actor })));
    const GUIDE = [...FULL_LOG, ...decisions];
    const move = fc.oneof({ arbitrary: anyEvent, weight: 1 }, { arbitrary: fc.constant('follow' as const), weight: 4 });
    let longest = 0;
    let deepest = 0;
    fc.assert(
      fc.property(fc.array(move, { minLength: 100, maxLength: 250 }), (moves) => {
        let snapshot = startRun(PROCEDURE);
        const log: RunEvent[] = [];
        for (const m of moves) {
          const e = m === 'follow' ? GUIDE.find((f) => snapshot.can(f)) : m;
          if (!e) continue;
          const result = applyEvent(PROCEDURE, storeRun(snapshot), e);
          if (result.ok) {
            snapshot = result.snapshot;
            log.push(e);
          }
        }
        expect(storeRun(replay(PROCEDURE, log))).toEqual(storeRun(snapshot));
        longest = Math.max(longest, log.length);
        deepest = Math.max(deepest, snapshot.context.cursor);
      }),
      { ...SEED, numRuns: 60 },
    );
    // The walk must actually get somewhere, or the property above says nothing.
    expect(longest).toBeGreaterThan(30);
    expect(deepest).toBeGreaterThan(PROCEDURE.findIndex((s) => s.kind === 'hold-point'));
  });
});

describe('applyEvent on a corrupt log', () => {
  it('throws: the stored log is at fault, not the incoming event', () => {
    const corrupt = [FULL_LOG[1] as RunEvent];
    expect(() => applyEvent(PROCEDURE, corrupt, FULL_LOG[0])).toThrowError(/Log entry 1/);
  });
});
