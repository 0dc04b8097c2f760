import { describe, expect, it } from 'vitest';
import { runEvent, type RunEvent, type RunEventInput } from './run-events';
import { applyEvent, replay, storeRun } from './run-replay';
import { FULL_LOG, HEAD_ORDER, PROCEDURE, confirmAll, ev, lead, logUntil, owner, reviewer, tech } from './run.fixtures';

const start = (stepId: string, extra: Partial<RunEventInput> = {}) => ev({ type: 'step.start', stepId, actor: tech, ...extra } as RunEventInput);
const confirm = (pass: number, fastenerId: string, actor = tech) => ev({ type: 'fastener.confirm', stepId: 'f-head', actor, pass, fastenerId });
const skipA = ev({ type: 'deviation.request', stepId: 'a-cover', actor: lead, kind: 'skip', reason: 'Already off' });
const headStarted = [...logUntil('f-head'), start('f-head')];
const measureStarted = [...logUntil('m-main'), start('m-main')];
const read = (key: string, value: number) => ev({ type: 'reading.enter', stepId: 'm-main', actor: tech, key, value });
const submitted = [...measureStarted, read('Main 1', 60), read('Main 2', 59.95), ev({ type: 'measure.submit', stepId: 'm-main', actor: tech })];
const outOfSpecRequested = [...submitted, ev({ type: 'deviation.request', stepId: 'm-main', actor: tech, kind: 'out-of-spec', reason: 'Regrind' })];

type Case = [name: string, log: RunEvent[], event: unknown, code: 'out-of-order' | 'not-allowed' | 'invalid-input', message: string | RegExp];

const cases: Case[] = [
  ['wrong fastener in pass 1', headStarted, confirm(1, 'h2'), 'out-of-order', 'Next: pass 1, fastener 7'],
  ['fastener before the step is started', logUntil('f-head'), confirm(1, 'h7'), 'out-of-order', 'Next: start the step'],
  ['pass 1 again after pass 1 is done', [...headStarted, ...confirmAll('f-head', HEAD_ORDER, 1)], confirm(1, 'h7'), 'out-of-order', 'Next: pass 2, fastener 7'],
  ['pass 2 out of order', [...headStarted, ...confirmAll('f-head', HEAD_ORDER, 1)], confirm(2, 'h2'), 'out-of-order', 'Next: pass 2, fastener 7'],
  ['jumping to pass 2 early', headStarted, confirm(2, 'h7'), 'out-of-order', 'Next: pass 1, fastener 7'],
  ['a fastener not on the map', headStarted, confirm(1, 'h99'), 'invalid-input', 'no fastener "h99"'],
  ['skipping ahead to a later step', [], start('a-cover'), 'out-of-order', 'Next: acknowledge the caution'],
  ['finishing a later step', logUntil('a-cover'), ev({ type: 'step.complete', stepId: 'i-deck', actor: tech }), 'out-of-order', 'Next: start the step'],
  ['a step id that does not exist', [], start('nope'), 'invalid-input', 'no step "nope"'],
  ['a reviewer working a step', logUntil('a-cover'), start('a-cover', { actor: reviewer }), 'not-allowed', 'reviewer does not work steps'],
  ['hazards not acknowledged', logUntil('a-lift'), start('a-lift'), 'out-of-order', 'acknowledge the hazards (lifting)'],
  ['a technician approving a deviation', [...logUntil('a-cover'), skipA], ev({ type: 'deviation.approve', stepId: 'a-cover', actor: tech }), 'not-allowed', 'Only a lead or owner'],
  ['a technician rejecting a deviation', [...logUntil('a-cover'), skipA], ev({ type: 'deviation.reject', stepId: 'a-cover', actor: tech, reason: 'no' }), 'not-allowed', 'Only a lead or owner'],
  ['approving your own deviation', [...logUntil('a-cover'), skipA], ev({ type: 'deviation.approve', stepId: 'a-cover', actor: lead }), 'not-allowed', 'someone other than'],
  ['working while a deviation waits', [...logUntil('a-cover'), skipA], start('a-cover'), 'out-of-order', 'Waiting for a lead to approve the deviation'],
  ['approving when nothing waits', logUntil('a-cover'), ev({ type: 'deviation.approve', stepId: 'a-cover', actor: owner }), 'out-of-order', 'Next: start the step'],
  ['a technician signing the hold point', logUntil('h-review'), ev({ type: 'hold.sign', stepId: 'h-review', actor: tech, meaning: 'ok' }), 'not-allowed', 'Only a reviewer may sign'],
  ['a lead signing a reviewer-only hold point', logUntil('h-review'), ev({ type: 'hold.sign', stepId: 'h-review', actor: lead, meaning: 'ok' }), 'not-allowed', 'Only a reviewer may sign'],
  ['starting past a hold point', logUntil('h-review'), start('h-review'), 'out-of-order', 'Waiting for a reviewer to sign the hold point'],
  ['skipping a hold point', logUntil('h-review'), ev({ type: 'deviation.request', stepId: 'h-review', actor: tech, kind: 'skip', reason: 'x' }), 'out-of-order', 'cannot be skipped'],
  ['submitting before every reading', [...measureStarted, read('Main 1', 60)], ev({ type: 'measure.submit', stepId: 'm-main', actor: tech }), 'out-of-order', 'Next: enter the reading for Main 2'],
  ['completing a measure without submitting', [...measureStarted, read('Main 1', 60), read('Main 2', 60)], ev({ type: 'step.complete', stepId: 'm-main', actor: tech }), 'out-of-order', 'Next: submit the readings'],
  ['completing an out-of-spec measure without a deviation', submitted, ev({ type: 'step.complete', stepId: 'm-main', actor: tech }), 'out-of-order', 'Next: request a deviation'],
  ['moving on from an out-of-spec measure', submitted, start('i-deck'), 'out-of-order', 'Next: request a deviation'],
  ['re-reading after an out-of-spec submit', submitted, read('Main 2', 60), 'out-of-order', 'Next: request a deviation'],
  ['asking to skip instead of an out-of-spec deviation', submitted, ev({ type: 'deviation.request', stepId: 'm-main', actor: tech, kind: 'skip', reason: 'x' }), 'out-of-order', 'Next: request a deviation'],
  ['an out-of-spec deviation before any readings', measureStarted, ev({ type: 'deviation.request', stepId: 'm-main', actor: tech, kind: 'out-of-spec', reason: 'x' }), 'out-of-order', 'after out-of-spec readings'],
  ['the requester approving an out-of-spec deviation', outOfSpecRequested, ev({ type: 'deviation.approve', stepId: 'm-main', actor: tech }), 'not-allowed', 'Only a lead or owner'],
  ['a reading slot that does not exist', measureStarted, read('Main 9', 60), 'invalid-input', 'no reading "Main 9"'],
  ['a reading that cannot be real', measureStarted, read('Main 1', -3), 'invalid-input', 'cannot be negative'],
  ['a tag-part completion missing a position', [...logUntil('t-caps'), start('t-caps')], ev({ type: 'step.complete', stepId: 't-caps', actor: tech, tags: [{ position: 'Main 1', disposition: 'reuse' }] }), 'invalid-input', 'tag Main 2'],
  ['a tag-part completion tagging a position twice', [...logUntil('t-caps'), start('t-caps')], ev({ type: 'step.complete', stepId: 't-caps', actor: tech, tags: ['Main 1', 'Main 2', 'Main 2'].map((position) => ({ position, disposition: 'reuse' as const })) }), 'invalid-input', 'Main 2 is not a position to tag once'],
  ['a torque step completed with no torque', [...logUntil('q-pump'), start('q-pump')], ev({ type: 'step.complete', stepId: 'q-pump', actor: tech }), 'out-of-order', 'Next: confirm the applied torque'],
  ['torque.confirm on a step that is not a torque step', [...logUntil('i-deck'), start('i-deck')], ev({ type: 'torque.confirm', stepId: 'i-deck', actor: tech, applied: { value: 1, unit: 'N·m' } }), 'out-of-order', 'Next: complete the step'],
  ['any work after the run is complete', FULL_LOG, start('r-bolts'), 'out-of-order', 'The run is complete'],
  ['signing after the run is complete', FULL_LOG, ev({ type: 'hold.sign', stepId: 'h-review', actor: reviewer, meaning: 'again' }), 'out-of-order', 'The run is complete'],
  ['a technician sending work back', FULL_LOG, ev({ type: 'run.reopen', stepId: 'a-lift', actor: tech, reason: 'x' }), 'not-allowed', 'may send work back'],
  ['sending back a step not finished yet', logUntil('a-lift'), ev({ type: 'run.reopen', stepId: 'a-lift', actor: reviewer, reason: 'x' }), 'out-of-order', 'Only finished steps'],
  ['a body without an actor', [], { type: 'caution.acknowledge', stepId: 'c-cool' }, 'invalid-input', /^actor/],
  ['an unknown event type', [], { type: 'step.teleport', stepId: 'c-cool', actor: tech }, 'invalid-input', /type/],
  ['an empty deviation reason', logUntil('a-cover'), { type: 'deviation.request', stepId: 'a-cover', actor: tech, kind: 'skip', reason: '  ' }, 'invalid-input', 'reason: Give a reason'],
];

describe.each(cases)('refused: %s', (_name, log, event, code, message) => {
  const before = replay(PROCEDURE, log);

  it(`answers ${code} with what is expected`, () => {
    const result = applyEvent(PROCEDURE, storeRun(before), event);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.code).toBe(code);
    expect(result.message).toMatch(typeof message === 'string' ? new RegExp(message.replace(/[()]/g, '\\$&')) : message);
  });

  it('is refused by snapshot.can and by replay, and the log answers the same as the snapshot', () => {
    // Malformed bodies never reach the machine; everything that parses must be refused by its guards.
    const parsed = runEvent.safeParse(event);
    if (parsed.success) expect(before.can(parsed.data)).toBe(false);
    expect(() => replay(PROCEDURE, [...log, event])).toThrowError(/refused|not a run event/);
    expect(applyEvent(PROCEDURE, log, event)).toEqual(applyEvent(PROCEDURE, storeRun(before), event));
  });
});

describe('accepted events for contrast', () => {
  it.each([
    ['the expected fastener', headStarted, confirm(1, 'h7')],
    ['an owner approving a lead’s deviation', [...logUntil('a-cover'), skipA], ev({ type: 'deviation.approve', stepId: 'a-cover', actor: owner })],
    ['a reviewer signing', logUntil('h-review'), ev({ type: 'hold.sign', stepId: 'h-review', actor: reviewer, meaning: 'ok' })],
    ['a reviewer sending work back after completion', FULL_LOG, ev({ type: 'run.reopen', stepId: 'a-lift', actor: reviewer, reason: 'x' })],
  ])('%s', (_name, log, event) => {
    const result = applyEvent(PROCEDURE, log, event);
    expect(result.ok).toBe(true);
    expect(replay(PROCEDURE, log).can(event)).toBe(true);
  });
});
