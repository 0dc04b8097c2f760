import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import type { Spec } from './procedure/schema';
import {
  checkReading,
  clearance,
  specFromDeviations,
  specFromTolerance,
  specPlusMinus,
  taperAndOutOfRound,
  taperAndOutOfRoundGrid,
  toleranceUsage,
  withinMax,
} from './readings';
import { expectDomainError } from '../../tests/support/domain-error';


describe('specFromTolerance', () => {
  describe.each<[number, number, number, Spec]>([
    [0.05, 0.02, 0.01, { nominal: 0.05, min: 0.04, max: 0.07, unit: 'mm' }],
    [0.05, 0.02, -0.01, { nominal: 0.05, min: 0.04, max: 0.07, unit: 'mm' }], // signed minus means the same
    [0.1, 0.2, 0.1, { nominal: 0.1, min: 0, max: 0.3, unit: 'mm' }], // float noise cleaned (0.1 + 0.2)
    [2, 0, 0, { nominal: 2, min: 2, max: 2, unit: 'mm' }],
  ])('%d +%d / −%d', (n, p, m, expected) => {
    it('→ limits', () => expect(specFromTolerance(n, p, m, 'mm')).toEqual(expected));
  });
  it('specPlusMinus', () => expect(specPlusMinus(45, 5, 'N·m')).toEqual({ nominal: 45, min: 40, max: 50, unit: 'N·m' }));
  describe.each<[string, () => unknown, string]>([
    ['negative plus', () => specFromTolerance(1, -0.1, 0.1, 'mm'), 'invalid-input'],
    ['NaN nominal', () => specFromTolerance(NaN, 0.1, 0.1, 'mm'), 'invalid-input'],
    ['unknown unit', () => specFromTolerance(1, 0.1, 0.1, 'cubit' as never), 'unknown-unit'],
  ])('%s', (_n, fn, code) => {
    it(`throws ${code}`, () => expectDomainError(fn, code));
  });
});

// ISO 286-2 limits for 50 mm (from memory of the standard's tables, widely reprinted):
// hole H7: ES = +0.025, EI = 0; shaft g6: es = −0.009, ei = −0.025. So the H7/g6 fit's
// clearance runs from 0.009 (smallest hole, largest shaft) to 0.050 (largest hole, smallest shaft).
describe('ISO 286-2: 50 H7/g6', () => {
  const hole = specFromDeviations(50, 0.025, 0, 'mm');
  const shaft = specFromDeviations(50, -0.009, -0.025, 'mm');
  it('limits', () => {
    expect(hole).toEqual({ nominal: 50.0125, min: 50, max: 50.025, unit: 'mm' });
    expect(shaft).toEqual({ nominal: 49.983, min: 49.975, max: 49.991, unit: 'mm' });
  });
  it('clearance range 0.009..0.050', () => {
    expect(clearance(hole.min, shaft.max)).toBe(0.009);
    expect(clearance(hole.max, shaft.min)).toBe(0.05);
  });
  it('upper below lower throws', () => expectDomainError(() => specFromDeviations(50, -0.025, -0.009, 'mm'), 'invalid-input'));
});

describe('checkReading', () => {
  const spec: Spec = { nominal: 0.04, min: 0.02, max: 0.05, unit: 'mm' };
  describe.each<[number, number, { value: number; inSpec: boolean; side: string }]>([
    [0.05, 0.0001, { value: 0.05, inSpec: true, side: 'ok' }], // 0.0500 vs max 0.05 is in
    [0.0500, 0.001, { value: 0.05, inSpec: true, side: 'ok' }],
    [0.03 + 0.02, 0.001, { value: 0.05, inSpec: true, side: 'ok' }], // 0.05000000000000001
    [0.0504, 0.001, { value: 0.05, inSpec: true, side: 'ok' }], // rounds to the instrument first
    [0.0505, 0.001, { value: 0.051, inSpec: false, side: 'high' }],
    [0.0196, 0.001, { value: 0.02, inSpec: true, side: 'ok' }],
    [0.0194, 0.001, { value: 0.019, inSpec: false, side: 'low' }],
    [0.0501, 0.0001, { value: 0.0501, inSpec: false, side: 'high' }], // a finer instrument sees it
    [0.04, 0.01, { value: 0.04, inSpec: true, side: 'ok' }],
  ])('%d at resolution %d', (v, r, expected) => {
    it(`→ ${expected.value} ${expected.side}`, () => {
      const c = checkReading(v, spec, r);
      expect(c).toMatchObject(expected);
      expect(c.deviation).toBeCloseTo(expected.value - 0.04, 12);
    });
  });
  it('thou spec: 2.0 thou reading on a 0.5–2.0 thou spec is in', () => {
    expect(checkReading(2.04, { nominal: 1.5, min: 0.5, max: 2, unit: 'thou' }, 0.1)).toMatchObject({ value: 2, inSpec: true });
  });
  describe.each<[string, () => unknown]>([
    ['NaN reading', () => checkReading(NaN, spec, 0.001)],
    ['zero resolution', () => checkReading(0.04, spec, 0)],
    ['spec with nominal outside limits', () => checkReading(0.04, { ...spec, nominal: 1 }, 0.001)],
    ['spec with NaN max', () => checkReading(0.04, { ...spec, max: NaN }, 0.001)],
  ])('%s', (_n, fn) => {
    it('throws invalid-input', () => expectDomainError(fn, 'invalid-input'));
  });

  fcTest.prop([fc.double({ min: -10, max: 10, noNaN: true }), fc.constantFrom(0.1, 0.01, 0.001, 0.0001)])(
    'inSpec iff the rounded reading is within the limits (to float noise)',
    (v, r) => {
      const c = checkReading(v, spec, r);
      expect(c.inSpec).toBe(c.value >= 0.02 - 1e-9 && c.value <= 0.05 + 1e-9);
      expect(c.side === 'ok').toBe(c.inSpec);
    },
  );
});

describe('withinMax / toleranceUsage', () => {
  it.each<[number, number, boolean]>([
    [0.005, 0.005, true],
    [0.002 + 0.003, 0.005, true],
    [0.006, 0.005, false],
  ])('withinMax(%d, %d) = %s', (v, m, ok) => expect(withinMax(v, m, 0.001)).toBe(ok));
  it.each<[number, number]>([
    [0.04, 0],
    [0.05, 1],
    [0.02, 1],
    [0.03, 0.5],
    [0.06, 2],
  ])('usage of %d = %d', (v, u) => expect(toleranceUsage(v, { nominal: 0.04, min: 0.02, max: 0.05, unit: 'mm' })).toBeCloseTo(u, 9));
});

describe('clearance = bore − journal (diametral)', () => {
  it.each<[number, number, number]>([
    [55.045, 55.0, 0.045],
    [2.2463, 2.2445, 0.0018],
    [50.0, 50.002, -0.002], // interference is reported, not hidden
  ])('%d − %d = %d', (b, j, c) => expect(clearance(b, j)).toBe(c));
  it('NaN throws', () => expectDomainError(() => clearance(NaN, 1), 'invalid-input'));
});

// Definition as in engine service manuals generally (common practice, from memory of the
// journal-measurement sections of military engine maintenance manuals): out-of-round = difference between X and Y (90° apart) at A and at B; taper = difference
// between A and B at X and at Y. We report the larger of each pair.
describe('taperAndOutOfRound', () => {
  describe.each<[string, { a0: number; a90: number; b0: number; b90: number }, number, number]>([
    ['perfect', { a0: 50, a90: 50, b0: 50, b90: 50 }, 0, 0],
    ['pure taper', { a0: 50.01, a90: 50.01, b0: 50, b90: 50 }, 0.01, 0],
    ['pure oval', { a0: 50.01, a90: 50, b0: 50.01, b90: 50 }, 0, 0.01],
    ['worse at one end', { a0: 49.998, a90: 49.99, b0: 49.998, b90: 49.996 }, 0.006, 0.008],
  ])('%s', (_n, r, taper, oor) => {
    it(`taper ${taper}, out-of-round ${oor}`, () => {
      const t = taperAndOutOfRound(r);
      expect(t.taper).toBeCloseTo(taper, 12);
      expect(t.outOfRound).toBeCloseTo(oor, 12);
    });
  });
  it('NaN throws', () => expectDomainError(() => taperAndOutOfRound({ a0: NaN, a90: 1, b0: 1, b90: 1 }), 'invalid-input'));
  const dia = fc.double({ min: 40, max: 60, noNaN: true });
  fcTest.prop([fc.tuple(dia, dia, dia, dia)])(
    'grid version with 2 planes × 2 angles agrees; both are non-negative',
    ([a0, a90, b0, b90]) => {
      const t = taperAndOutOfRound({ a0, a90, b0, b90 });
      const g = taperAndOutOfRoundGrid([
        [a0, a90],
        [b0, b90],
      ]);
      expect(t.taper).toBeGreaterThanOrEqual(0);
      expect(t.outOfRound).toBeGreaterThanOrEqual(0);
      expect(g.taper).toBeCloseTo(t.taper, 9);
      expect(g.outOfRound).toBeCloseTo(t.outOfRound, 9);
    },
  );
  it('grid with three planes', () =>
    expect(
      taperAndOutOfRoundGrid([
        [50, 50],
        [49.995, 49.999],
        [50.001, 50],
      ]),
    ).toEqual({ taper: 0.006, outOfRound: 0.004 }));
  it('ragged grid throws', () => expectDomainError(() => taperAndOutOfRoundGrid([[1, 2], [1]]), 'invalid-input'));
});
