import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { circleLayout, rowsLayout } from './fastener-layouts';
import { centreOutOrder, crossOrder, looseningOrder } from './fastener-order';
import { describePass, describePassTarget, expandPasses, passTarget, sequenceOrder, turnWords, type PassTarget, type SequenceInput } from './passes';
import { fastenerSequenceStep, type FastenerMap, type Pass, type TorqueQuantity } from './procedure/schema';
import { expectDomainError } from '../../tests/support/domain-error';


const map = (fasteners = rowsLayout(5, 2), extra: Partial<FastenerMap> = {}): FastenerMap => ({ fasteners, order: [], orderMethod: 'centre-out', ...extra });
const nm = (value: number): TorqueQuantity => ({ value, unit: 'N·m' });

describe('passTarget', () => {
  describe.each<[string, Pass, TorqueQuantity | undefined, PassTarget]>([
    ['snug', { kind: 'snug' }, undefined, { kind: 'snug' }],
    ['30 % of 150 N·m', { kind: 'percent', percent: 30 }, nm(150), { kind: 'torque', torque: nm(45), percent: 30 }],
    ['60 % of 150 N·m', { kind: 'percent', percent: 60 }, nm(150), { kind: 'torque', torque: nm(90), percent: 60 }],
    ['100 % of 304 ft·lbf keeps ft·lbf', { kind: 'percent', percent: 100 }, { value: 304, unit: 'ft·lbf' }, { kind: 'torque', torque: { value: 304, unit: 'ft·lbf' }, percent: 100 }],
    ['30 % of 304 ft·lbf', { kind: 'percent', percent: 30 }, { value: 304, unit: 'ft·lbf' }, { kind: 'torque', torque: { value: 91.2, unit: 'ft·lbf' }, percent: 30 }],
    ['absolute 25 N·m', { kind: 'torque', target: nm(25) }, undefined, { kind: 'torque', torque: nm(25) }],
    ['angle 90°', { kind: 'angle', degrees: 90 }, undefined, { kind: 'angle', degrees: 90 }],
    ['loosen 90°', { kind: 'loosen', degrees: 90 }, undefined, { kind: 'loosen', degrees: 90 }],
    ['remove', { kind: 'remove' }, undefined, { kind: 'remove' }],
  ])('%s', (_n, pass, final, expected) => {
    it('→ target', () => expect(passTarget(pass, final)).toEqual(expected));
  });

  describe.each<[string, Pass, TorqueQuantity | undefined, RegExp]>([
    ['percent without final torque', { kind: 'percent', percent: 30 }, undefined, /need a final torque/],
    ['percent over 100', { kind: 'percent', percent: 120 }, nm(100), /at most 100/],
    ['percent NaN', { kind: 'percent', percent: NaN }, nm(100), /finite/],
    ['negative final torque', { kind: 'percent', percent: 30 }, nm(-5), /greater than zero/],
    ['NaN torque', { kind: 'torque', target: nm(NaN) }, undefined, /finite/],
    ['zero torque', { kind: 'torque', target: nm(0) }, undefined, /greater than zero/],
    ['negative angle', { kind: 'angle', degrees: -90 }, undefined, /greater than zero/],
    ['unknown kind', { kind: 'wiggle' } as unknown as Pass, undefined, /Unknown pass kind/],
  ])('%s', (_n, pass, final, message) => {
    it('throws invalid-input', () => expectDomainError(() => passTarget(pass, final), 'invalid-input', message));
  });
  it('a length unit as torque is a unit mismatch', () =>
    expectDomainError(() => passTarget({ kind: 'torque', target: { value: 5, unit: 'mm' } as unknown as TorqueQuantity }), 'unit-mismatch'));
});

describe('describePassTarget', () => {
  describe.each<[PassTarget, string]>([
    [{ kind: 'snug' }, 'snug'],
    [{ kind: 'torque', torque: nm(45), percent: 30 }, '30 % → 45 N·m'],
    [{ kind: 'torque', torque: { value: 91.2, unit: 'ft·lbf' }, percent: 30 }, '30 % → 91.2 ft·lbf'],
    [{ kind: 'torque', torque: nm(25) }, '25 N·m'],
    [{ kind: 'angle', degrees: 90 }, '+90°'],
    [{ kind: 'loosen', degrees: 90 }, 'loosen 90° (¼ turn)'],
    [{ kind: 'loosen', degrees: 180 }, 'loosen 180° (½ turn)'],
    [{ kind: 'loosen', degrees: 720 }, 'loosen 720° (2 turns)'],
    [{ kind: 'loosen', degrees: 540 }, 'loosen 540° (1½ turns)'],
    [{ kind: 'loosen', degrees: 100 }, 'loosen 100°'],
    [{ kind: 'remove' }, 'remove'],
  ])('%j', (t, text) => {
    it(`→ "${text}"`, () => expect(describePassTarget(t)).toBe(text));
  });
  it('describePass', () => expect(describePass(2, 3, { kind: 'torque', torque: nm(90), percent: 60 })).toBe('Pass 2 of 3: 60 % → 90 N·m'));
  it.each([
    [45, '⅛ turn'],
    [270, '¾ turn'],
    [360, '1 turn'],
    [450, '1¼ turns'],
    [30, ''],
  ])('turnWords(%i) = "%s"', (d, w) => expect(turnWords(d)).toBe(w));
});

describe('sequenceOrder', () => {
  const fs = rowsLayout(7, 2);
  describe.each<[string, SequenceInput['direction'], Partial<FastenerMap>, string[]]>([
    ['tighten, no order: centre-out', 'tighten', {}, centreOutOrder(fs)],
    ['loosen, no order: loosening order', 'loosen', {}, looseningOrder(fs)],
    ['loosen, method reverse-centre-out', 'loosen', { orderMethod: 'reverse-centre-out' }, looseningOrder(fs)],
    ['cross method, no order', 'tighten', { orderMethod: 'cross' }, crossOrder(fs)],
    ['order set: used as is', 'tighten', { order: fs.map((f) => f.id) }, fs.map((f) => f.id)],
    ['order set overrides direction', 'loosen', { order: fs.map((f) => f.id), orderMethod: 'manual' }, fs.map((f) => f.id)],
  ])('%s', (_n, direction, extra, expected) => {
    it('→ order', () => expect(sequenceOrder({ direction, map: map(fs, extra) })).toEqual(expected));
  });
  it('a bad stored order throws invalid-order', () =>
    expectDomainError(() => sequenceOrder({ direction: 'tighten', map: map(fs, { order: ['f1', 'f1'] }) }), 'invalid-order', /missing/));
  it('manual with no order throws invalid-order', () =>
    expectDomainError(() => sequenceOrder({ direction: 'tighten', map: map(fs, { orderMethod: 'manual' }) }), 'invalid-order', /no order/));
  it('empty map throws invalid-input', () => expectDomainError(() => sequenceOrder({ direction: 'tighten', map: map([]) }), 'invalid-input', /empty/));
});

describe('expandPasses', () => {
  it('head bolts: 30/60/100 % then +90° +90°, centre-out each pass', () => {
    const fs = rowsLayout(5, 2);
    const actions = expandPasses({
      direction: 'tighten',
      finalTorque: nm(60),
      passes: [
        { kind: 'percent', percent: 30 },
        { kind: 'percent', percent: 60 },
        { kind: 'percent', percent: 100 },
        { kind: 'angle', degrees: 90 },
        { kind: 'angle', degrees: 90 },
      ],
      map: map(fs),
    });
    expect(actions).toHaveLength(50);
    const order = centreOutOrder(fs);
    expect(actions[0]).toEqual({ pass: 1, passCount: 5, index: 1, fastenerId: order[0], label: '3', target: { kind: 'torque', torque: nm(18), percent: 30 } });
    expect(actions[10]!.target).toEqual({ kind: 'torque', torque: nm(36), percent: 60 });
    expect(actions[29]!.target).toEqual({ kind: 'torque', torque: nm(60), percent: 100 });
    expect(actions[49]).toMatchObject({ pass: 5, index: 10, fastenerId: order[9], target: { kind: 'angle', degrees: 90 } });
    for (let p = 0; p < 5; p++) expect(actions.slice(p * 10, p * 10 + 10).map((a) => a.fastenerId)).toEqual(order);
  });

  it('teardown: quarter turn each in the loosening order, then remove', () => {
    const fs = rowsLayout(7, 2);
    const actions = expandPasses({ direction: 'loosen', passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }], map: map(fs) });
    expect(actions).toHaveLength(28);
    expect(actions.slice(0, 14).map((a) => a.fastenerId)).toEqual(looseningOrder(fs));
    expect(actions.slice(0, 14).every((a) => a.target.kind === 'loosen' && a.target.degrees === 90)).toBe(true);
    expect(actions.slice(14).every((a) => a.target.kind === 'remove' && a.pass === 2)).toBe(true);
  });

  it('a flange: snug, then absolute stages in the cross order', () => {
    const fs = circleLayout(8);
    const actions = expandPasses({
      direction: 'tighten',
      passes: [{ kind: 'snug' }, { kind: 'torque', target: nm(40) }, { kind: 'torque', target: nm(80) }],
      map: map(fs, { orderMethod: 'cross' }),
    });
    expect(actions.slice(0, 8).map((a) => a.label).join('-')).toBe('1-5-3-7-2-6-4-8');
    expect(actions[8]!.target).toEqual({ kind: 'torque', torque: nm(40) });
  });

  it('accepts a step parsed by the schema', () => {
    const step = fastenerSequenceStep.parse({
      id: 's1',
      kind: 'fastener-sequence',
      title: 'Torque head bolts',
      direction: 'tighten',
      map: { fasteners: rowsLayout(5, 2) },
      passes: [{ kind: 'percent', percent: 50 }, { kind: 'percent', percent: 100 }],
      finalTorque: { value: 80, unit: 'ft·lbf' },
    });
    const actions = expandPasses(step);
    expect(actions).toHaveLength(20);
    expect(actions[0]!.target).toEqual({ kind: 'torque', torque: { value: 40, unit: 'ft·lbf' }, percent: 50 });
  });

  describe.each<[string, Partial<SequenceInput>, string, RegExp]>([
    ['no passes', { passes: [] }, 'invalid-input', /at least one pass/],
    ['percent without final torque', { passes: [{ kind: 'percent', percent: 30 }] }, 'invalid-input', /final torque/],
    ['empty map', { map: map([]) }, 'invalid-input', /empty/],
    ['duplicate labels', { map: map([...rowsLayout(2, 1), { id: 'x', label: '1', x: 5, y: 5 }]) }, 'invalid-input', /Label "1"/],
    ['bad order', { map: map(rowsLayout(3, 1), { order: ['f1', 'f2'] }) }, 'invalid-order', /missing "3"/],
  ])('%s', (_n, patch, code, message) => {
    it(`throws ${code}`, () =>
      expectDomainError(() => expandPasses({ direction: 'tighten', passes: [{ kind: 'snug' }], map: map(), ...patch }), code, message));
  });

  const arbPasses = fc.array(
    fc.oneof(
      fc.constant<Pass>({ kind: 'snug' }),
      fc.integer({ min: 1, max: 100 }).map<Pass>((percent) => ({ kind: 'percent', percent })),
      fc.integer({ min: 1, max: 720 }).map<Pass>((degrees) => ({ kind: 'angle', degrees })),
      fc.integer({ min: 1, max: 3600 }).map<Pass>((degrees) => ({ kind: 'loosen', degrees })),
      fc.constant<Pass>({ kind: 'remove' }),
    ),
    { minLength: 1, maxLength: 10 },
  );
  fcTest.prop([fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 3 }), arbPasses, fc.constantFrom<'tighten' | 'loosen'>('tighten', 'loosen')])(
    'every fastener exactly once per pass, passes in order, indices 1..n',
    (perRow, rows, passes, direction) => {
      const fs = rowsLayout(perRow, rows);
      const actions = expandPasses({ direction, passes, finalTorque: nm(100), map: map(fs) });
      expect(actions).toHaveLength(fs.length * passes.length);
      passes.forEach((_p, i) => {
        const mine = actions.filter((a) => a.pass === i + 1);
        expect(mine.map((a) => a.index)).toEqual(fs.map((_f, j) => j + 1));
        expect([...mine.map((a) => a.fastenerId)].sort()).toEqual(fs.map((f) => f.id).sort());
        expect(mine.every((a) => a.passCount === passes.length)).toBe(true);
      });
      const passNumbers = actions.map((a) => a.pass);
      expect(passNumbers).toEqual([...passNumbers].sort((a, b) => a - b));
    },
  );
  fcTest.prop([fc.integer({ min: 1, max: 100 }), fc.double({ min: 0.5, max: 2000, noNaN: true }), fc.constantFrom('N·m', 'ft·lbf', 'in·lbf', 'kgf·m', 'kgf·cm' as const)])(
    'percent stages are finalTorque × percent in finalTorque\'s unit',
    (percent, value, unit) => {
      const t = passTarget({ kind: 'percent', percent }, { value, unit });
      expect(t.kind === 'torque' && t.torque.unit).toBe(unit);
      const expected = (value * percent) / 100;
      expect(t.kind === 'torque' && Math.abs(t.torque.value - expected) / expected).toBeLessThan(1e-11);
    },
  );
});
