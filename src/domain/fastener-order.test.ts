import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { circleLayout, gridLayout, perimeterLayout, rowsLayout } from './fastener-layouts';
import {
  centreOutOrder,
  crossOrder,
  crossSequence,
  generateOrder,
  looseningOrder,
  validateFasteners,
  validateManualOrder,
} from './fastener-order';
import type { Fastener, OrderMethod } from './procedure/schema';
import { expectDomainError } from '../../tests/support/domain-error';


/** The order as labels, and the number each fastener gets, laid out row by row. */
const labels = (fs: Fastener[], ids: string[]) => ids.map((id) => fs.find((f) => f.id === id)!.label);
const grid = (fs: Fastener[], ids: string[], perRow: number) => {
  const rank = new Map(ids.map((id, i) => [id, i + 1]));
  const rows: number[][] = [];
  for (let i = 0; i < fs.length; i += perRow) rows.push(fs.slice(i, i + perRow).map((f) => rank.get(f.id)!));
  return rows;
};
const centroid = (fs: Fastener[]) => ({ x: fs.reduce((s, f) => s + f.x, 0) / fs.length, y: fs.reduce((s, f) => s + f.y, 0) / fs.length });
const dist = (f: Fastener, c: { x: number; y: number }) => Math.hypot(f.x - c.x, f.y - c.y);

describe('centreOutOrder: two rows (cylinder heads)', () => {
  // Each cell is the step at which that fastener is tightened; top row first.
  describe.each<[string, number, number[][]]>([
    [
      '2 × 5 (10-bolt head)',
      5,
      [
        [9, 3, 1, 6, 8],
        [7, 5, 2, 4, 10],
      ],
    ],
    [
      '2 × 7 (14-bolt head)',
      7,
      [
        [11, 9, 3, 1, 6, 8, 14],
        [13, 7, 5, 2, 4, 10, 12],
      ],
    ],
    [
      '2 × 9 (18-bolt head)',
      9,
      [
        [17, 11, 9, 3, 1, 6, 8, 14, 16],
        [15, 13, 7, 5, 2, 4, 10, 12, 18],
      ],
    ],
    [
      '2 × 4 (even count: no centre column)',
      4,
      [
        [7, 1, 4, 6],
        [5, 3, 2, 8],
      ],
    ],
  ])('%s', (_name, perRow, expected) => {
    const fs = rowsLayout(perRow, 2);
    const order = centreOutOrder(fs);
    it('numbers the map as expected', () => expect(grid(fs, order, perRow)).toEqual(expected));
    it('starts at the centre and works outward column by column', () => {
      const colDist = order.map((id) => Math.abs(fs.findIndex((f) => f.id === id) % perRow - (perRow - 1) / 2));
      for (let i = 1; i < colDist.length; i++) expect(colDist[i]).toBeGreaterThanOrEqual(colDist[i - 1]!);
    });
    it('never takes two fasteners in a row on the same side and the same row off-centre', () => {
      const c = centroid(fs);
      for (let i = 1; i < order.length; i++) {
        const a = fs.find((f) => f.id === order[i - 1])!;
        const b = fs.find((f) => f.id === order[i])!;
        const sameSide = Math.sign(a.x - c.x) === Math.sign(b.x - c.x) && a.x !== c.x;
        const sameRow = a.y === b.y;
        expect(sameSide && sameRow).toBe(false);
      }
    });
  });

  it('common practice: a 14-bolt head (2 × 7) is loosened in the reverse of centre-out tightening, ends first, centre last', () => {
    const fs = rowsLayout(7, 2);
    const loosen = looseningOrder(fs);
    expect(loosen).toEqual([...centreOutOrder(fs)].reverse());
    const c = centroid(fs);
    // The first four loosened are the four end corners; the last two are the centre pair.
    expect(new Set(labels(fs, loosen.slice(0, 4)))).toEqual(new Set(['1', '7', '8', '14']));
    expect(new Set(labels(fs, loosen.slice(-2)))).toEqual(new Set(['4', '11']));
    // Each corner loosened is followed by one on the other side of the centre line.
    const first = fs.find((f) => f.id === loosen[0])!;
    const second = fs.find((f) => f.id === loosen[1])!;
    expect(Math.sign(first.x - c.x)).toBe(-Math.sign(second.x - c.x));
  });
});

describe('centreOutOrder: other maps', () => {
  describe.each<[string, Fastener[], string[]]>([
    ['single row of 5', rowsLayout(5, 1), ['3', '2', '4', '1', '5']],
    ['single row of 6', rowsLayout(6, 1), ['3', '4', '2', '5', '1', '6']],
    ['single fastener', rowsLayout(1, 1), ['1']],
    // Girdle: middle row before the outer rows in each ring.
    ['three rows of 5 (girdle)', rowsLayout(5, 3), '8,3,13,7,9,2,14,12,4,6,10,1,15,11,5'.split(',')],
    // A 5 × 3 grid spread taller than wide is worked along its long (vertical) axis.
    ['5 × 3 grid, rows far apart', gridLayout(5, 3), '8,7,9,6,10,3,13,2,14,4,12,5,11,1,15'.split(',')],
  ])('%s', (_name, fs, expected) => {
    it('gives the expected order', () => expect(labels(fs, centreOutOrder(fs))).toEqual(expected));
  });

  it('a vertical head (drawn top to bottom) gives the same pattern as the horizontal one', () => {
    const flat = rowsLayout(5, 2);
    const upright = flat.map((f) => ({ ...f, x: f.y, y: f.x }));
    expect(centreOutOrder(upright)).toEqual(centreOutOrder(flat));
  });

  it('a diagonal (rotated) head still works outward from the centre', () => {
    const flat = rowsLayout(7, 2);
    const a = Math.PI / 6;
    const turned = flat.map((f) => ({ ...f, x: 500 + (f.x - 500) * Math.cos(a) * 0.8 - (f.y - 500) * Math.sin(a) * 0.8, y: 500 + (f.x - 500) * Math.sin(a) * 0.8 + (f.y - 500) * Math.cos(a) * 0.8 }));
    expect(centreOutOrder(turned)).toEqual(centreOutOrder(flat));
  });

  it('irregular set: fasteners off the rows fit in by distance along the joint', () => {
    // An oil-pan-like set: two rows of 5, plus one on the centre line at each end, plus one
    // pushed out of the top row near the middle.
    const fs: Fastener[] = [
      ...rowsLayout(5, 2),
      { id: 'end-l', label: 'L', x: 30, y: 500 },
      { id: 'end-r', label: 'R', x: 970, y: 500 },
      { id: 'odd', label: 'O', x: 420, y: 280 },
    ];
    const order = centreOutOrder(fs);
    expect(new Set(order)).toEqual(new Set(fs.map((f) => f.id)));
    const c = centroid(fs);
    const nearest = Math.min(...fs.map((f) => dist(f, c)));
    expect(dist(fs.find((f) => f.id === order[0])!, c)).toBeCloseTo(nearest, 9);
    // The two end fasteners, furthest along the joint, come last.
    expect(new Set(order.slice(-2))).toEqual(new Set(['end-l', 'end-r']));
    // The odd one sits between the centre pair and the ring at ±200 (it is 80 from centre).
    expect(order.indexOf('odd')).toBeLessThan(order.indexOf('f2'));
  });

  it('circle: still a permutation, starting at a fastener (all are equally near the centre)', () => {
    const fs = circleLayout(8);
    expect(new Set(centreOutOrder(fs))).toEqual(new Set(fs.map((f) => f.id)));
  });
});

describe('crossOrder: ASME PCC-1 legacy cross pattern (circular flanges)', () => {
  // PCC-1 legacy cross-pattern tables (bolts numbered clockwise from 12 o'clock). 8, 12, 16
  // and 24 are the published sequences; 4 and 20 follow the same construction.
  describe.each<[number, string]>([
    [4, '1-3-2-4'],
    [8, '1-5-3-7-2-6-4-8'],
    [12, '1-7-4-10-2-8-5-11-3-9-6-12'],
    [16, '1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16'],
    [20, '1-11-6-16-3-13-8-18-5-15-10-20-2-12-7-17-4-14-9-19'],
    [24, '1-13-7-19-4-16-10-22-2-14-8-20-5-17-11-23-3-15-9-21-6-18-12-24'],
  ])('%i bolts', (n, expected) => {
    it(`→ ${expected}`, () => {
      const fs = circleLayout(n);
      expect(labels(fs, crossOrder(fs)).join('-')).toBe(expected);
    });
    it('second bolt is opposite the first, third is 90° away', () => {
      const seq = crossSequence(n);
      expect(seq[1]).toBe(n / 2);
      if (n >= 4) expect(seq[2]).toBe(n / 4);
    });
  });

  describe.each<[number, string]>([
    [5, '1-3-5-2-4'], // pentagram star
    [6, '1-4-2-5-3-6'],
    [3, '1-2-3'],
    [1, '1'],
  ])('%i bolts (not a multiple of 4): star', (n, expected) => {
    it(`→ ${expected}`, () => {
      const fs = circleLayout(n);
      expect(labels(fs, crossOrder(fs)).join('-')).toBe(expected);
    });
  });

  it('starts at the bolt nearest 12 o\'clock and goes clockwise, whatever the labels and listing order', () => {
    const fs = circleLayout(8)
      .map((f, i) => ({ ...f, id: `b${(i + 3) % 8}`, label: String.fromCharCode(65 + ((i + 5) % 8)) }))
      .reverse();
    const order = crossOrder(fs);
    const top = fs.reduce((a, b) => (b.y < a.y ? b : a));
    expect(order[0]).toBe(top.id);
    expect(new Set(order).size).toBe(8);
  });
});

describe('validateFasteners / bad maps', () => {
  const ok = rowsLayout(2, 1);
  describe.each<[string, Fastener[], RegExp]>([
    ['empty map', [], /empty/],
    ['duplicate id', [ok[0]!, { ...ok[1]!, id: ok[0]!.id }], /id "f1" is used twice/],
    ['duplicate label', [ok[0]!, { ...ok[1]!, label: '1' }], /Label "1" is used by two fasteners/],
    ['duplicate label (spacing and case)', [{ ...ok[0]!, label: 'A' }, { ...ok[1]!, label: ' a ' }], /Label "a" is used by two/],
    ['blank label', [{ ...ok[0]!, label: '  ' }], /needs a label/],
    ['NaN position', [{ ...ok[0]!, x: NaN }], /no usable position/],
  ])('%s', (_name, fs, message) => {
    it.each<[string, (f: Fastener[]) => unknown]>([
      ['validateFasteners', validateFasteners],
      ['centreOutOrder', centreOutOrder],
      ['looseningOrder', looseningOrder],
      ['crossOrder', crossOrder],
    ])('%s throws invalid-input', (_fn, fn) => expectDomainError(() => fn(fs), 'invalid-input', message));
  });
});

describe('validateManualOrder', () => {
  const fs = rowsLayout(3, 1).map((f) => ({ ...f, label: `B${f.label}` }));
  it('accepts every fastener exactly once and returns a copy', () => {
    const order = ['f3', 'f1', 'f2'];
    const out = validateManualOrder(fs, order);
    expect(out).toEqual(order);
    expect(out).not.toBe(order);
  });
  describe.each<[string, string[], RegExp]>([
    ['missing', ['f1', 'f2'], /missing "B3"/],
    ['duplicate', ['f1', 'f2', 'f2', 'f3'], /more than once "B2"/],
    ['unknown', ['f1', 'f2', 'f3', 'f9'], /not on the map "f9"/],
    ['all three', ['f1', 'f1', 'zz'], /missing "B2", "B3"; listed more than once "B1"; not on the map "zz"/],
    ['empty', [], /missing "B1", "B2", "B3"/],
  ])('%s', (_name, order, message) => {
    it('throws invalid-order naming the labels', () => expectDomainError(() => validateManualOrder(fs, order), 'invalid-order', message));
  });
});

describe('generateOrder', () => {
  const fs = rowsLayout(5, 2);
  describe.each<[OrderMethod, string[] | undefined, string[]]>([
    ['centre-out', undefined, centreOutOrder(fs)],
    ['reverse-centre-out', undefined, looseningOrder(fs)],
    ['cross', undefined, crossOrder(fs)],
    ['manual', fs.map((f) => f.id).reverse(), fs.map((f) => f.id).reverse()],
  ])('%s', (method, manual, expected) => {
    it('gives that method\'s order', () => expect(generateOrder(fs, method, manual)).toEqual(expected));
  });
  it('manual without an order throws invalid-order', () => expectDomainError(() => generateOrder(fs, 'manual'), 'invalid-order'));
  it('unknown method throws', () => expectDomainError(() => generateOrder(fs, 'zigzag' as OrderMethod), 'invalid-input'));
});

// Arbitrary maps: 1..40 fasteners, unique ids and labels, positions on the 0–1000 layout
// (some on a coarse grid so that exact ties happen).
const arbMap = fc
  .array(
    fc.oneof(
      fc.record({ x: fc.double({ min: 0, max: 1000, noNaN: true }), y: fc.double({ min: 0, max: 1000, noNaN: true }) }),
      fc.record({ x: fc.integer({ min: 0, max: 10 }).map((n) => n * 100), y: fc.integer({ min: 0, max: 10 }).map((n) => n * 100) }),
    ),
    { minLength: 1, maxLength: 40 },
  )
  .map((pts) => pts.map((p, i) => ({ id: `id${i}`, label: `L${i}`, x: p.x, y: p.y })));

describe('order properties', () => {
  fcTest.prop([arbMap])('every fastener exactly once (centre-out, loosening, cross)', (fs) => {
    const ids = fs.map((f) => f.id).sort();
    for (const order of [centreOutOrder(fs), looseningOrder(fs), crossOrder(fs)]) expect([...order].sort()).toEqual(ids);
  });
  fcTest.prop([arbMap])('loosening is the exact reverse of tightening', (fs) => {
    expect(looseningOrder(fs)).toEqual([...centreOutOrder(fs)].reverse());
  });
  fcTest.prop([arbMap])('the first fastener tightened is one nearest the centroid', (fs) => {
    const c = centroid(fs);
    const nearest = Math.min(...fs.map((f) => dist(f, c)));
    const first = fs.find((f) => f.id === centreOutOrder(fs)[0])!;
    expect(dist(first, c) - nearest).toBeLessThanOrEqual(1e-9 * Math.max(1, nearest));
  });
  fcTest.prop([arbMap, fc.integer()])('deterministic, and independent of the listing order', (fs, seed) => {
    const shuffled = [...fs].sort((a, b) => ((a.id.length * 31 + seed) % 7) - ((b.id.length * 17 + seed) % 5) || (a.id < b.id ? 1 : -1));
    expect(centreOutOrder(fs)).toEqual(centreOutOrder(fs));
    expect(centreOutOrder(shuffled)).toEqual(centreOutOrder(fs));
    expect(crossOrder(shuffled)).toEqual(crossOrder(fs));
  });
  fcTest.prop([arbMap])('every generated order passes manual validation', (fs) => {
    for (const m of ['centre-out', 'reverse-centre-out', 'cross'] as const) expect(validateManualOrder(fs, generateOrder(fs, m))).toHaveLength(fs.length);
  });
  fcTest.prop([fc.integer({ min: 1, max: 60 })])('cross sequence is a permutation for any bolt count', (n) => {
    expect([...crossSequence(n)].sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, i) => i));
  });
  fcTest.prop([fc.integer({ min: 1, max: 50 }).map((n) => n * 4)])('cross, n a multiple of 4: each group of four is 90° apart', (n) => {
    const seq = crossSequence(n);
    for (let g = 0; g < n; g += 4) {
      const k = seq[g]!;
      expect(seq.slice(g, g + 4)).toEqual([k, k + n / 2, k + n / 4, k + (3 * n) / 4]);
    }
  });
});

describe('layouts feed the orders', () => {
  it.each([
    ['rows 5 × 2', rowsLayout(5, 2)],
    ['rows 7 × 2', rowsLayout(7, 2)],
    ['grid 4 × 3', gridLayout(4, 3)],
    ['circle 12', circleLayout(12)],
    ['perimeter 6 + 2', perimeterLayout(6, 2)],
  ])('%s', (_n, fs) => {
    expect(centreOutOrder(fs)).toHaveLength(fs.length);
    expect(crossOrder(fs)).toHaveLength(fs.length);
  });
});
