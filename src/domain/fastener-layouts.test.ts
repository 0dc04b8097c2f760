import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { circleLayout, gridLayout, perimeterLayout, rowsLayout } from './fastener-layouts';
import { fastener, type Fastener } from './procedure/schema';
import { expectDomainError } from '../../tests/support/domain-error';


const wellFormed = (fs: Fastener[]) => {
  fs.forEach((f, i) => {
    expect(f.id).toBe(`f${i + 1}`);
    expect(f.label).toBe(String(i + 1));
    expect(fastener.safeParse(f).success).toBe(true); // 0–1000, finite
  });
};

describe('layouts', () => {
  describe.each<[string, () => Fastener[], number]>([
    ['rowsLayout(5)', () => rowsLayout(5), 10],
    ['rowsLayout(7, 2)', () => rowsLayout(7, 2), 14],
    ['rowsLayout(9, 2)', () => rowsLayout(9, 2), 18],
    ['rowsLayout(6, 1)', () => rowsLayout(6, 1), 6],
    ['rowsLayout(1, 1)', () => rowsLayout(1, 1), 1],
    ['rowsLayout(10, 4)', () => rowsLayout(10, 4), 40],
    ['circleLayout(8)', () => circleLayout(8), 8],
    ['circleLayout(16)', () => circleLayout(16), 16],
    ['gridLayout(4, 3)', () => gridLayout(4, 3), 12],
    ['perimeterLayout(6, 2)', () => perimeterLayout(6, 2), 16],
  ])('%s', (_n, make, count) => {
    it(`has ${count} well-formed fasteners`, () => {
      const fs = make();
      expect(fs).toHaveLength(count);
      wellFormed(fs);
    });
    it('is the same every time', () => expect(make()).toEqual(make()));
  });

  it('rows are numbered left to right, top row first, centred on the layout', () => {
    const fs = rowsLayout(5, 2);
    expect(fs.slice(0, 5).map((f) => f.y)).toEqual([350, 350, 350, 350, 350]);
    expect(fs.slice(5).map((f) => f.y)).toEqual([650, 650, 650, 650, 650]);
    expect(fs.slice(0, 5).map((f) => f.x)).toEqual([100, 300, 500, 700, 900]);
  });
  it('a single row sits on the middle line', () => expect(rowsLayout(3, 1).map((f) => f.y)).toEqual([500, 500, 500]));
  it('circle: fastener 1 at 12 o\'clock, then clockwise', () => {
    const fs = circleLayout(4);
    expect(fs.map((f) => [f.x, f.y])).toEqual([
      [500, 100],
      [900, 500],
      [500, 900],
      [100, 500],
    ]);
  });
  it.each<[string, () => unknown]>([
    ['zero per row', () => rowsLayout(0)],
    ['fractional', () => rowsLayout(2.5)],
    ['NaN', () => circleLayout(NaN)],
    ['too many', () => gridLayout(20, 20)],
    ['perimeter with one on the long side', () => perimeterLayout(1, 0)],
  ])('%s throws invalid-input', (_n, fn) => expectDomainError(fn, 'invalid-input'));

  fcTest.prop([fc.integer({ min: 1, max: 50 }), fc.integer({ min: 1, max: 4 })])('rows: unique ids and labels, inside the layout', (per, rows) => {
    const fs = rowsLayout(per, rows);
    expect(new Set(fs.map((f) => f.id)).size).toBe(fs.length);
    expect(new Set(fs.map((f) => f.label)).size).toBe(fs.length);
    wellFormed(fs);
  });
});
