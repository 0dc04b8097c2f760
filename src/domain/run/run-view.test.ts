import { describe, expect, it } from 'vitest';
import { step } from '../procedure/schema';
import { replay, startRun } from './run-replay';
import { fastenerProgress, measureDetail, nextExpected, pendingDeviation, runPhase, runProgress, stepRecord, stepStates } from './run-view';
import { FULL_LOG, HEAD_ORDER, PROCEDURE, confirmAll, ev, logUntil, tech } from './run.fixtures';

const at = (n: number) => replay(PROCEDURE, FULL_LOG.slice(0, n));
const indexOf = (stepId: string) => PROCEDURE.findIndex((s) => s.id === stepId);

describe('nextExpected', () => {
  it.each([
    ['c-cool', 'Next: acknowledge the caution'],
    ['a-cover', 'Next: start the step'],
    ['a-lift', 'Next: acknowledge the hazards (lifting) and start the step'],
    ['h-review', 'Waiting for a reviewer to sign the hold point'],
  ])('at %s, before any work: %s', (stepId, description) => {
    expect(nextExpected(replay(PROCEDURE, logUntil(stepId)))).toEqual({ stepId, stepIndex: indexOf(stepId), description });
  });

  it.each([
    ['f-head', 'Next: pass 1, fastener 7'],
    ['m-main', 'Next: enter the reading for Main 1'],
    ['t-caps', 'Next: tag each part (bin and disposition) and complete the step'],
    ['q-pump', 'Next: confirm the applied torque'],
    ['i-deck', 'Next: complete the step'],
  ])('at %s, once started: %s', (stepId, description) => {
    const snapshot = replay(PROCEDURE, [...logUntil(stepId), ev({ type: 'step.start', stepId, actor: tech })]);
    expect(nextExpected(snapshot)?.description).toBe(description);
  });

  it('names the expected pass and fastener by label through a whole sequence', () => {
    const base = [...logUntil('f-head'), ev({ type: 'step.start', stepId: 'f-head', actor: tech })];
    const confirms = confirmAll('f-head', HEAD_ORDER, 2);
    const seen = confirms.map((_, n) => nextExpected(replay(PROCEDURE, [...base, ...confirms.slice(0, n)]))?.description);
    const labels = HEAD_ORDER.map((id) => id.slice(1));
    expect(seen).toEqual([1, 2].flatMap((pass) => labels.map((label) => `Next: pass ${pass}, fastener ${label}`)));
  });

  it('is null once the run is complete, and for a procedure with no steps', () => {
    expect(nextExpected(replay(PROCEDURE, FULL_LOG))).toBeNull();
    expect(nextExpected(startRun([]))).toBeNull();
    expect(runPhase(startRun([]))).toBe('complete');
  });
});

describe('stepStates and runProgress', () => {
  it('count finished steps as the run goes', () => {
    const mid = replay(PROCEDURE, logUntil('m-main'));
    expect(runProgress(mid)).toEqual({ done: indexOf('m-main'), total: PROCEDURE.length, complete: false });
    expect(stepStates(mid).map((s) => s.state)).toEqual(['done', 'done', 'done', 'done', 'done', 'ready', 'locked', 'locked', 'locked', 'locked']);
  });

  it('show counts for sequences and measurements only', () => {
    const states = stepStates(at(0));
    expect(states.find((s) => s.stepId === 'f-head')?.progress).toEqual({ done: 0, total: 20 });
    expect(states.find((s) => s.stepId === 'm-main')?.progress).toEqual({ done: 0, total: 2 });
    expect(states.find((s) => s.stepId === 'a-cover')).toEqual({ stepId: 'a-cover', state: 'locked' });
  });
});

describe('per-step detail', () => {
  it('fastenerProgress: confirmed ids per pass in work order, and the next action', () => {
    const snapshot = replay(PROCEDURE, [...logUntil('f-head'), ev({ type: 'step.start', stepId: 'f-head', actor: tech }), ...confirmAll('f-head', HEAD_ORDER, 2).slice(0, 13)]);
    const detail = fastenerProgress(snapshot, 'f-head');
    expect(detail?.passes).toEqual([
      { pass: 1, target: { kind: 'loosen', degrees: 90 }, confirmedIds: HEAD_ORDER, total: 10 },
      { pass: 2, target: { kind: 'remove' }, confirmedIds: HEAD_ORDER.slice(0, 3), total: 10 },
    ]);
    expect(detail?.next).toMatchObject({ pass: 2, index: 4, fastenerId: 'h4', label: '4' });
    expect(fastenerProgress(snapshot, 'a-cover')).toBeNull();
  });

  it('measureDetail: readings, the evaluation and whether they were submitted', () => {
    const i = FULL_LOG.findIndex((e) => e.type === 'measure.submit');
    const before = measureDetail(at(i), 'm-main');
    expect(before).toMatchObject({ readings: { 'Main 1': 60.004, 'Main 2': 59.95 }, submitted: false, result: { complete: true, inSpec: false } });
    expect(before?.slots.map((s) => s.key)).toEqual(['Main 1', 'Main 2']);
    expect(measureDetail(at(i + 1), 'm-main')?.submitted).toBe(true);
    expect(measureDetail(at(0), 'm-main')?.result).toBeNull();
  });

  it('pendingDeviation: the request waiting for a lead, gone once decided', () => {
    const i = FULL_LOG.findIndex((e) => e.type === 'deviation.request');
    expect(pendingDeviation(at(i + 1))).toEqual({ stepId: 'm-main', kind: 'out-of-spec', reason: 'Crank goes to the machine shop for regrind', requestedBy: 'u-tech', requestedByRole: 'technician' });
    expect(pendingDeviation(at(i + 2))).toBeNull();
    expect(stepRecord(at(i + 2), 'm-main')?.outcome).toMatchObject({ state: 'deviated', summary: expect.stringContaining('out of spec') });
  });

  it('stepRecord: null for an unknown step', () => {
    expect(stepRecord(at(0), 'nope')).toBeNull();
  });

  it('a caution that needs no acknowledgement says so', () => {
    const soft = step.parse({ id: 'c', kind: 'caution', title: 'Gloves', severity: 'notice', mustAcknowledge: false });
    expect(nextExpected(startRun([soft]))?.description).toBe('Next: read the caution and continue');
  });
});
