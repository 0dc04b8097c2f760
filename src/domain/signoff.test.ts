import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { checkSigner, coveredStepIds, recordHash, signoffRecord, workersOf, type SignerCheck, type SignoffRecordInput } from './signoff';

const sha = (t: string) => createHash('sha256').update(t).digest('hex');
const steps = [
  { id: 'a', kind: 'action', title: 'Clean' },
  { id: 'm', kind: 'measure', title: 'Measure bores' },
  { id: 'h', kind: 'hold-point', title: 'Review' },
  { id: 'z', kind: 'action', title: 'After' },
];
const ev = (seq: number, type: string, stepId: string, actorId = 'tech') => ({ seq, type, actorId, payload: { type, stepId, actor: { userId: actorId, role: 'technician' } } });
const input = (events: SignoffRecordInput['events'] = [ev(1, 'step.start', 'a'), ev(2, 'step.complete', 'a'), ev(3, 'reading.enter', 'm')]): SignoffRecordInput => ({
  run: { id: 'r1', jobId: 'j1', jobCode: 'J-0001', procedureName: 'P', revisionId: 'rev', revisionNumber: 1 },
  steps,
  events,
  extras: { tags: [{ stepId: 'a', position: '1', disposition: 'reuse' }, { stepId: 'z', position: '9', disposition: 'scrap' }] },
});

describe('signoffRecord', () => {
  it('covers the steps before a hold point, or every step for a run', () => {
    expect(coveredStepIds(steps, { kind: 'hold-point', stepId: 'h' })).toEqual(['a', 'm']);
    expect(coveredStepIds(steps, { kind: 'run' })).toEqual(['a', 'm', 'h', 'z']);
    expect(() => coveredStepIds(steps, { kind: 'hold-point', stepId: 'nope' })).toThrow(/no step/);
  });

  it('gives the same hash whatever the key order, and another hash for any change', () => {
    const scope = { kind: 'run' } as const;
    const h1 = recordHash(signoffRecord(input(), scope), sha);
    const reordered = input().events.map((e) => ({ payload: e.payload, actorId: e.actorId, type: e.type, seq: e.seq }));
    expect(recordHash(signoffRecord(input(reordered), scope), sha)).toBe(h1);
    expect(recordHash(signoffRecord(input([...input().events, ev(4, 'measure.submit', 'm')]), scope), sha)).not.toBe(h1);
    const changedTag = { ...input(), extras: { tags: [{ stepId: 'a', position: '1', disposition: 'replace' }] } };
    expect(recordHash(signoffRecord(changedTag, scope), sha)).not.toBe(h1);
  });

  it('a hold-point record ignores work after the hold point but not a send-back before it', () => {
    const scope = { kind: 'hold-point', stepId: 'h' } as const;
    const base = recordHash(signoffRecord(input(), scope), sha);
    const later = input([...input().events, ev(4, 'step.start', 'z')]);
    expect(recordHash(signoffRecord(later, scope), sha)).toBe(base);
    const sentBack = input([...input().events, ev(4, 'run.reopen', 'a', 'rev')]);
    expect(recordHash(signoffRecord(sentBack, scope), sha)).not.toBe(base);
    expect(signoffRecord(input(), scope).extras.tags).toEqual([{ stepId: 'a', position: '1', disposition: 'reuse' }]);
  });
});

describe('checkSigner', () => {
  const events = [ev(1, 'step.start', 'a', 'tech'), ev(2, 'hold.sign', 'h', 'rev'), ev(3, 'run.reopen', 'a', 'lead')];
  const base: SignerCheck = { signer: { userId: 'rev', role: 'reviewer' }, roleMaySign: true, scope: { kind: 'run' }, events, allowSelfSignoff: false, runComplete: true, currentStepId: null };
  const table: Array<[string, Partial<SignerCheck>, string | null]> = [
    ['a reviewer who did no work signs a finished run', {}, null],
    ['a role without signoff:sign is refused', { roleMaySign: false, signer: { userId: 'lead', role: 'lead' } }, 'not-allowed'],
    ['the technician who worked it is refused', { signer: { userId: 'tech', role: 'owner' } }, 'not-allowed'],
    ['... unless the shop allows self sign-off', { signer: { userId: 'tech', role: 'owner' }, allowSelfSignoff: true }, null],
    ['an unfinished run is refused', { runComplete: false }, 'out-of-order'],
    ['a second matching signature by the same person is refused', { alreadySignedByThem: true }, 'out-of-order'],
    ['a hold point waiting now may be signed', { scope: { kind: 'hold-point', stepId: 'h' }, runComplete: false, currentStepId: 'h' }, null],
    ['a hold point not waiting is refused', { scope: { kind: 'hold-point', stepId: 'h' }, currentStepId: 'a' }, 'out-of-order'],
  ];
  it.each(table)('%s', (_name, patch, code) => {
    const r = checkSigner({ ...base, ...patch });
    expect(r?.code ?? null).toBe(code);
    if (r?.code === 'not-allowed' && patch.signer?.userId === 'tech') expect(r.message).toMatch(/You worked on this run/);
  });
  it('only work events count as working the run (signing or sending back do not)', () => {
    expect([...workersOf(events)]).toEqual(['tech']);
  });
});
