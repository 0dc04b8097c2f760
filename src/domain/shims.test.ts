import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import type { Spec } from './procedure/schema';
import { chooseShim, stockSizes, type ShimStock } from './shims';
import { expectDomainError } from '../../tests/support/domain-error';


const intake: Spec = { nominal: 0.2, min: 0.15, max: 0.25, unit: 'mm' };
const range: ShimStock = { kind: 'range', from: 2.5, to: 3.3, step: 0.05 };

describe('stockSizes', () => {
  describe.each<[string, ShimStock, number[]]>([
    ['list, sorted and de-duplicated', { kind: 'list', sizes: [2.6, 2.5, 2.6, 2.55] }, [2.5, 2.55, 2.6]],
    ['range includes both ends', { kind: 'range', from: 2.5, to: 2.7, step: 0.05 }, [2.5, 2.55, 2.6, 2.65, 2.7]],
    ['range, end off the step', { kind: 'range', from: 2.5, to: 2.62, step: 0.05 }, [2.5, 2.55, 2.6]],
    ['range in 0.02 steps', { kind: 'range', from: 3.0, to: 3.1, step: 0.02 }, [3, 3.02, 3.04, 3.06, 3.08, 3.1]],
  ])('%s', (_n, stock, expected) => {
    it('→ sizes', () => expect(stockSizes(stock)).toEqual(expected));
  });
  it('full 2.50–3.30 range has 17 sizes', () => expect(stockSizes(range)).toHaveLength(17));
  describe.each<[string, ShimStock]>([
    ['empty list', { kind: 'list', sizes: [] }],
    ['zero size', { kind: 'list', sizes: [0] }],
    ['backwards range', { kind: 'range', from: 3, to: 2, step: 0.05 }],
    ['zero step', { kind: 'range', from: 2, to: 3, step: 0 }],
    ['huge range', { kind: 'range', from: 1, to: 1000, step: 0.0001 }],
  ])('%s', (_n, stock) => {
    it('throws invalid-input', () => expectDomainError(() => stockSizes(stock), 'invalid-input'));
  });
});

describe('chooseShim: required = installed + measured − nominal', () => {
  describe.each<[string, number, number, ShimStock, { required: number; chosen: number | null; resultingClearance: number | null; fits: boolean }]>([
    ['too loose: 0.32 on a 2.60 → 2.70, lands 0.22', 0.32, 2.6, range, { required: 2.72, chosen: 2.7, resultingClearance: 0.22, fits: true }],
    ['too tight: 0.08 on a 2.80 → 2.70, lands 0.18', 0.08, 2.8, range, { required: 2.68, chosen: 2.7, resultingClearance: 0.18, fits: true }],
    ['in spec already: keeps 2.60', 0.2, 2.6, range, { required: 2.6, chosen: 2.6, resultingClearance: 0.2, fits: true }],
    // Required 2.625 sits halfway between 2.60 and 2.65: the thinner (looser valve) wins.
    ['tie goes to the thinner shim', 0.225, 2.6, range, { required: 2.625, chosen: 2.6, resultingClearance: 0.225, fits: true }],
    ['nothing thick enough', 0.9, 3.2, range, { required: 3.9, chosen: null, resultingClearance: null, fits: false }],
    ['coarse list: nearest that fits', 0.3, 2.5, { kind: 'list', sizes: [2.5, 2.58, 2.7] }, { required: 2.6, chosen: 2.58, resultingClearance: 0.22, fits: true }],
    // Nearest (2.66) gives 0.14, below the minimum; 2.50 gives 0.30, above: nothing fits.
    ['nothing in the list fits', 0.3, 2.5, { kind: 'list', sizes: [2.4, 2.66, 2.5] }, { required: 2.6, chosen: null, resultingClearance: null, fits: false }],
  ])('%s', (_n, measured, installed, stock, expected) => {
    it('→ choice', () => {
      const c = chooseShim({ measured, installed, spec: intake, stock });
      expect(c.required).toBeCloseTo(expected.required, 12);
      expect(c.fits).toBe(expected.fits);
      if (expected.fits) {
        expect(c.chosen).toBeCloseTo(expected.chosen!, 12);
        expect(c.resultingClearance).toBeCloseTo(expected.resultingClearance!, 12);
      } else {
        expect(c.chosen).toBeNull();
        expect(c.resultingClearance).toBeNull();
        expect(c.closest).not.toBeNull();
      }
    });
  });

  it('lopsided spec: the nearest size lands outside, the next nearest inside', () => {
    const spec: Spec = { nominal: 0.2, min: 0.19, max: 0.3, unit: 'mm' };
    const c = chooseShim({ measured: 0.3, installed: 2.5, spec, stock: { kind: 'list', sizes: [2.615, 2.58] } });
    expect(c).toMatchObject({ required: 2.6, chosen: 2.58, fits: true, closest: { size: 2.615 } });
    expect(c.resultingClearance).toBeCloseTo(0.22, 12);
    expect(c.closest!.resultingClearance).toBeCloseTo(0.185, 12);
  });

  describe.each<[string, number, number, RegExp]>([
    ['NaN measured', NaN, 2.6, /finite/],
    ['negative clearance', -0.1, 2.6, /cannot be negative/],
    ['zero shim', 0.2, 0, /thicker than zero/],
  ])('%s', (_n, m, i, message) => {
    it('throws invalid-input', () => expectDomainError(() => chooseShim({ measured: m, installed: i, spec: intake, stock: range }), 'invalid-input', message));
  });

  fcTest.prop([fc.double({ min: 0, max: 0.8, noNaN: true }), fc.integer({ min: 0, max: 16 }).map((i) => 2.5 + i * 0.05)])(
    'a fit lands inside the spec, and no other stocked size lands nearer the nominal',
    (measured, installed) => {
      const c = chooseShim({ measured, installed, spec: intake, stock: range });
      const results = stockSizes(range).map((s) => measured + installed - s);
      const anyFits = results.some((r) => r >= intake.min - 1e-9 && r <= intake.max + 1e-9);
      expect(c.fits).toBe(anyFits);
      if (c.fits) {
        expect(c.resultingClearance!).toBeGreaterThanOrEqual(intake.min - 1e-9);
        expect(c.resultingClearance!).toBeLessThanOrEqual(intake.max + 1e-9);
        const best = Math.min(...results.map((r) => Math.abs(r - intake.nominal)));
        expect(Math.abs(c.resultingClearance! - intake.nominal)).toBeLessThanOrEqual(best + 1e-9);
      }
    },
  );
});
