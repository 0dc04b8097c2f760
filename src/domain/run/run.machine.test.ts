import { describe, expect, it } from 'vitest';
import { createActor } from 'xstate';
import { step, type Step } from '../procedure/schema';
import { createRunMachine } from './run.machine';
import type { RunEvent } from './run-events';
import { fastenerProgress, measureDetail, nextExpected, pendingDeviation, runProgress, stepRecord, stepStates } from './run-view';
import { HEAD_ORDER, PROCEDURE, confirmAll, ev, lead, lead2, logUntil, owner, reviewer, tech, FULL_LOG } from './run.fixtures';

/** An actor over these steps with the given events already sent. */
function actorAfter(events: RunEvent[], steps: Step[] = PROCEDURE) {
  const actor = createActor(createRunMachine(steps)).start();
  for (const e of events) actor.send(e);
  return actor;
}
const stateOf = (actor: ReturnType<typeof actorAfter>, stepId: string) => stepStates(actor.getSnapshot()).find((s) => s.stepId === stepId)?.state;

describe('the run machine, step kind by step kind', () => {
  it('opens the first step and locks the rest', () => {
    const states = stepStates(actorAfter([]).getSnapshot()).map((s) => s.state);
    expect(states).toEqual(['ready', ...Array(PROCEDURE.length - 1).fill('locked')]);
  });

  it('caution: acknowledged once, then done, and the next step opens', () => {
    const actor = actorAfter([ev({ type: 'caution.acknowledge', stepId: 'c-cool', actor: tech })]);
    expect(stateOf(actor, 'c-cool')).toBe('done');
    expect(stateOf(actor, 'a-cover')).toBe('ready');
    expect(stepRecord(actor.getSnapshot(), 'c-cool')?.outcome).toEqual({ state: 'done', by: 'u-tech' });
  });

  it('caution without mustAcknowledge: a plain step.complete moves on, acknowledgement still allowed', () => {
    const soft = step.parse({ id: 'c-soft', kind: 'caution', title: 'Wear gloves', severity: 'notice', mustAcknowledge: false });
    const complete = ev({ type: 'step.complete', stepId: 'c-soft', actor: tech });
    const snapshot = actorAfter([], [soft]).getSnapshot();
    expect(snapshot.can(complete)).toBe(true);
    expect(actorAfter([complete], [soft]).getSnapshot().value).toBe('complete');
    // A caution that must be acknowledged does not accept a plain completion.
    expect(actorAfter([]).getSnapshot().can(ev({ type: 'step.complete', stepId: 'c-cool', actor: tech }))).toBe(false);
  });

  it('action: start makes it in progress, complete keeps the note', () => {
    const actor = actorAfter([...logUntil('a-cover'), ev({ type: 'step.start', stepId: 'a-cover', actor: tech })]);
    expect(stateOf(actor, 'a-cover')).toBe('in-progress');
    actor.send(ev({ type: 'step.complete', stepId: 'a-cover', actor: tech, note: 'Gasket torn' }));
    expect(stateOf(actor, 'a-cover')).toBe('done');
    expect(stepRecord(actor.getSnapshot(), 'a-cover')?.outcome).toMatchObject({ state: 'done', note: 'Gasket torn' });
  });

  it('fastener sequence: pass by pass in the given order, done after the last action', () => {
    const actor = actorAfter([...logUntil('f-head'), ev({ type: 'step.start', stepId: 'f-head', actor: tech })]);
    const confirms = confirmAll('f-head', HEAD_ORDER, 2);
    confirms.slice(0, 10).forEach((e) => actor.send(e));
    expect(nextExpected(actor.getSnapshot())?.description).toBe('Next: pass 2, fastener 7');
    const detail = fastenerProgress(actor.getSnapshot(), 'f-head');
    expect(detail?.passes.map((p) => p.confirmedIds)).toEqual([HEAD_ORDER, []]);
    expect(detail?.passes.map((p) => p.target.kind)).toEqual(['loosen', 'remove']);
    expect(stepStates(actor.getSnapshot()).find((s) => s.stepId === 'f-head')?.progress).toEqual({ done: 10, total: 20 });
    confirms.slice(10, 19).forEach((e) => actor.send(e));
    expect(stateOf(actor, 'f-head')).toBe('in-progress');
    expect(nextExpected(actor.getSnapshot())?.description).toBe('Next: pass 2, fastener 6');
    actor.send(confirms[19] as RunEvent);
    expect(stateOf(actor, 'f-head')).toBe('done');
    expect(stateOf(actor, 'a-lift')).toBe('ready');
  });

  it('hazards: the step starts only once every hazard is acknowledged on step.start', () => {
    const actor = actorAfter(logUntil('a-lift'));
    expect(nextExpected(actor.getSnapshot())?.description).toBe('Next: acknowledge the hazards (lifting) and start the step');
    expect(actor.getSnapshot().can(ev({ type: 'step.start', stepId: 'a-lift', actor: tech }))).toBe(false);
    actor.send(ev({ type: 'step.start', stepId: 'a-lift', actor: tech, hazards: ['lifting'] }));
    expect(stateOf(actor, 'a-lift')).toBe('in-progress');
    expect(stepRecord(actor.getSnapshot(), 'a-lift')?.hazardsAcknowledged).toEqual(['lifting']);
  });

  it('tag-part: completion carries a tag for each position', () => {
    const actor = actorAfter([...logUntil('t-caps'), ev({ type: 'step.start', stepId: 't-caps', actor: tech })]);
    const partial = ev({ type: 'step.complete', stepId: 't-caps', actor: tech, tags: [{ position: 'Main 1', disposition: 'reuse' }] });
    expect(actor.getSnapshot().can(partial)).toBe(false);
    const tags = [
      { position: 'Main 1', disposition: 'reuse' as const },
      { position: 'Main 2', disposition: 'scrap' as const, bin: 'B-5' },
    ];
    actor.send(ev({ type: 'step.complete', stepId: 't-caps', actor: tech, tags }));
    expect(stepRecord(actor.getSnapshot(), 't-caps')?.outcome).toMatchObject({ state: 'done', tags });
  });

  describe('measure', () => {
    const started = () => actorAfter([...logUntil('m-main'), ev({ type: 'step.start', stepId: 'm-main', actor: tech })]);
    const read = (key: string, value: number) => ev({ type: 'reading.enter', stepId: 'm-main', actor: tech, key, value });
    const submit = ev({ type: 'measure.submit', stepId: 'm-main', actor: tech });

    it('in spec: readings in any order, re-enterable, then submit finishes the step', () => {
      const actor = started();
      actor.send(read('Main 2', 59.9));
      actor.send(read('Main 1', 60.0));
      actor.send(read('Main 2', 60.01));
      expect(measureDetail(actor.getSnapshot(), 'm-main')?.readings).toEqual({ 'Main 1': 60.0, 'Main 2': 60.01 });
      expect(measureDetail(actor.getSnapshot(), 'm-main')?.result?.inSpec).toBe(true);
      actor.send(submit);
      expect(stateOf(actor, 'm-main')).toBe('done');
      expect(stepRecord(actor.getSnapshot(), 'm-main')?.outcome).toMatchObject({ state: 'done', inSpec: true });
    });

    it('out of spec: waits for a deviation; a rejection sends it back for new readings', () => {
      const actor = started();
      actor.send(read('Main 1', 60.0));
      actor.send(read('Main 2', 59.95));
      actor.send(submit);
      expect(actor.getSnapshot().value).toEqual({ running: 'outOfSpec' });
      expect(stateOf(actor, 'm-main')).toBe('in-progress');
      expect(nextExpected(actor.getSnapshot())?.description).toBe('Next: request a deviation for the out-of-spec readings');
      expect(actor.getSnapshot().can(read('Main 2', 60.0))).toBe(false);
      actor.send(ev({ type: 'deviation.request', stepId: 'm-main', actor: tech, kind: 'out-of-spec', reason: 'Regrind planned' }));
      expect(pendingDeviation(actor.getSnapshot())).toMatchObject({ stepId: 'm-main', kind: 'out-of-spec', requestedBy: 'u-tech' });
      expect(nextExpected(actor.getSnapshot())?.description).toBe('Waiting for a lead to approve the deviation');
      actor.send(ev({ type: 'deviation.reject', stepId: 'm-main', actor: lead, reason: 'Measure again with the checked micrometer' }));
      expect(actor.getSnapshot().value).toEqual({ running: 'working' });
      expect(stepRecord(actor.getSnapshot(), 'm-main')?.lastRejection?.reason).toBe('Measure again with the checked micrometer');
      actor.send(read('Main 2', 59.99));
      actor.send(submit);
      expect(stateOf(actor, 'm-main')).toBe('done');
    });

    it('out of spec with an approved deviation: deviated, and the run goes on', () => {
      const actor = actorAfter(logUntil('i-deck'));
      expect(stateOf(actor, 'm-main')).toBe('deviated');
      expect(stepRecord(actor.getSnapshot(), 'm-main')?.outcome).toMatchObject({
        state: 'deviated',
        by: 'u-lead',
        deviation: { kind: 'out-of-spec', requestedBy: 'u-tech' },
      });
      expect(stateOf(actor, 'i-deck')).toBe('ready');
    });
  });

  it('hold point: waits for a signer, then signed with the meaning', () => {
    const actor = actorAfter(logUntil('h-review'));
    expect(nextExpected(actor.getSnapshot())?.description).toBe('Waiting for a reviewer to sign the hold point');
    actor.send(ev({ type: 'hold.sign', stepId: 'h-review', actor: reviewer, meaning: 'Checked' }));
    expect(stateOf(actor, 'h-review')).toBe('signed');
    expect(stepRecord(actor.getSnapshot(), 'h-review')?.outcome).toEqual({ state: 'signed', by: 'u-rev', role: 'reviewer', meaning: 'Checked' });
  });

  it('hold point with several signer roles: any of them may sign', () => {
    const hold = step.parse({ id: 'h2', kind: 'hold-point', title: 'Lead or reviewer check', signers: ['reviewer', 'lead'] });
    expect(nextExpected(actorAfter([], [hold]).getSnapshot())?.description).toBe('Waiting for a reviewer or lead to sign the hold point');
    expect(actorAfter([ev({ type: 'hold.sign', stepId: 'h2', actor: lead, meaning: 'OK' })], [hold]).getSnapshot().value).toBe('complete');
  });

  it('torque: needs the applied torque, by torque.confirm or on completion', () => {
    const base = [...logUntil('q-pump'), ev({ type: 'step.start', stepId: 'q-pump', actor: tech })];
    const bare = ev({ type: 'step.complete', stepId: 'q-pump', actor: tech });
    expect(actorAfter(base).getSnapshot().can(bare)).toBe(false);
    const withValue = ev({ type: 'step.complete', stepId: 'q-pump', actor: tech, applied: { value: 18.5, unit: 'ft·lbf' } });
    const actor = actorAfter([...base, withValue]);
    expect(stepRecord(actor.getSnapshot(), 'q-pump')?.outcome).toMatchObject({ state: 'done', applied: { value: 18.5, unit: 'ft·lbf' } });
    const confirmed = actorAfter([...base, ev({ type: 'torque.confirm', stepId: 'q-pump', actor: tech, applied: { value: 25, unit: 'N·m' } })]);
    expect(confirmed.getSnapshot().can(bare)).toBe(true);
    confirmed.send(bare);
    expect(stepRecord(confirmed.getSnapshot(), 'q-pump')?.outcome).toMatchObject({ applied: { value: 25, unit: 'N·m' } });
  });

  it('inspect and replace: start, then complete', () => {
    const actor = actorAfter(FULL_LOG.slice(0, -1));
    expect(stateOf(actor, 'i-deck')).toBe('done');
    expect(stateOf(actor, 'r-bolts')).toBe('in-progress');
    actor.send(FULL_LOG[FULL_LOG.length - 1] as RunEvent);
    expect(stateOf(actor, 'r-bolts')).toBe('done');
    expect(runProgress(actor.getSnapshot())).toEqual({ done: PROCEDURE.length, total: PROCEDURE.length, complete: true });
  });

  describe('skipping a step by deviation', () => {
    const request = ev({ type: 'deviation.request', stepId: 'a-cover', actor: lead, kind: 'skip', reason: 'Cover already off on arrival' });

    it('a lead other than the requester approves: deviated, next step ready', () => {
      const actor = actorAfter([...logUntil('a-cover'), request]);
      expect(stateOf(actor, 'a-cover')).toBe('ready');
      expect(nextExpected(actor.getSnapshot())?.description).toBe('Waiting for a lead to approve the deviation');
      actor.send(ev({ type: 'deviation.approve', stepId: 'a-cover', actor: lead2 }));
      expect(stateOf(actor, 'a-cover')).toBe('deviated');
      expect(stateOf(actor, 'f-head')).toBe('ready');
    });

    it('an owner may approve too; a rejected skip leaves the step as it was', () => {
      expect(actorAfter([...logUntil('a-cover'), request]).getSnapshot().can(ev({ type: 'deviation.approve', stepId: 'a-cover', actor: owner }))).toBe(true);
      const rejected = actorAfter([...logUntil('a-cover'), request, ev({ type: 'deviation.reject', stepId: 'a-cover', actor: owner, reason: 'Do it' })]);
      expect(rejected.getSnapshot().value).toEqual({ running: 'ready' });
      const started = [...logUntil('a-cover'), ev({ type: 'step.start', stepId: 'a-cover', actor: tech })];
      const back = actorAfter([...started, { ...request, actor: tech }, ev({ type: 'deviation.reject', stepId: 'a-cover', actor: owner, reason: 'Do it' })]);
      expect(back.getSnapshot().value).toEqual({ running: 'working' });
    });
  });

  describe('run.reopen', () => {
    const reopen = ev({ type: 'run.reopen', stepId: 'a-lift', actor: reviewer, reason: 'Photo of the lift point missing' });

    it('sends work back: that step ready, later ones locked, earlier ones kept, the reason recorded', () => {
      const actor = actorAfter([...FULL_LOG, reopen]);
      const states = stepStates(actor.getSnapshot()).map((s) => s.state);
      expect(states).toEqual(['done', 'done', 'done', 'ready', 'locked', 'locked', 'locked', 'locked', 'locked', 'locked']);
      const [entry] = actor.getSnapshot().context.reopens;
      expect(entry).toMatchObject({ stepId: 'a-lift', reason: 'Photo of the lift point missing', by: 'u-rev' });
      expect(entry?.archived.map((a) => a.stepId)).toEqual(['a-lift', 't-caps', 'm-main', 'i-deck', 'h-review', 'q-pump', 'r-bolts']);
      expect(runProgress(actor.getSnapshot()).complete).toBe(false);
    });

    it('works in the middle of a run too, and the reopened step is worked again', () => {
      const actor = actorAfter([...logUntil('m-main'), reopen]);
      expect(stateOf(actor, 't-caps')).toBe('locked');
      actor.send(ev({ type: 'step.start', stepId: 'a-lift', actor: tech, hazards: ['lifting'] }));
      expect(stateOf(actor, 'a-lift')).toBe('in-progress');
    });
  });
});
