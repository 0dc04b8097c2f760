import { fc, test as fcTest } from '@fast-check/vitest';
import { unit as mathUnit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  ALL_UNITS,
  UNIT_LABELS,
  compareQuantities,
  convert,
  decimalsOf,
  dimensionOf,
  formatQuantity,
  formatQuantityExact,
  isAngleUnit,
  isLengthUnit,
  isTorqueUnit,
  parseQuantity,
  parseQuantityOf,
  parseUnit,
  roundTo,
  unitsOf,
  type AnyUnit,
} from './units';
import { expectDomainError } from '../../tests/support/domain-error';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), 1e-300);


describe('parseUnit: shop notation', () => {
  describe.each<[string, AnyUnit]>([
    ['ft-lb', 'ft·lbf'],
    ['lb-ft', 'ft·lbf'],
    ['ft·lbf', 'ft·lbf'],
    ['ft.lbs', 'ft·lbf'],
    ['lbf·ft', 'ft·lbf'],
    ['foot-pounds', 'ft·lbf'],
    ['FT LB', 'ft·lbf'],
    ['Nm', 'N·m'],
    ['N·m', 'N·m'],
    ['N-m', 'N·m'],
    ['N.m', 'N·m'],
    ['N m', 'N·m'],
    ['newton metres', 'N·m'],
    ['in-lb', 'in·lbf'],
    ['lb-in', 'in·lbf'],
    ['in·lbf', 'in·lbf'],
    ['inch-pounds', 'in·lbf'],
    ['kgf·m', 'kgf·m'],
    ['kg-m', 'kgf·m'],
    ['m-kg', 'kgf·m'],
    ['kgf·cm', 'kgf·cm'],
    ['kg-cm', 'kgf·cm'],
    ['mm', 'mm'],
    ['millimetres', 'mm'],
    ['µm', 'µm'],
    ['μm', 'µm'], // Greek mu, not the micro sign
    ['um', 'µm'],
    ['microns', 'µm'],
    ['in', 'in'],
    ['in.', 'in'],
    ['inch', 'in'],
    ['"', 'in'],
    ['thou', 'thou'],
    ['mil', 'thou'],
    ['thousandths', 'thou'],
    ['deg', 'deg'],
    ['°', 'deg'],
    ['degrees', 'deg'],
    ['turn', 'turn'],
    ['turns', 'turn'],
    ['rev', 'turn'],
  ])('%s', (text, expected) => {
    it(`→ ${expected}`, () => expect(parseUnit(text)).toBe(expected));
  });

  describe.each(['furlongs', 'lb', 'kg', 'N', 'ft', 'psi', 'nm²', 'xyz'])('unknown "%s"', (text) => {
    it('throws unknown-unit naming the text', () => expectDomainError(() => parseUnit(text), 'unknown-unit', new RegExp(`Unknown unit "${text}"`)));
  });

  it('empty text is a clear error', () => expectDomainError(() => parseUnit('  '), 'unknown-unit', /No unit/));
});

describe('parseQuantity', () => {
  describe.each<[string, number, AnyUnit]>([
    ['0.002 in', 0.002, 'in'],
    ['304 ft-lb', 304, 'ft·lbf'],
    ['304ft-lb', 304, 'ft·lbf'],
    ['0.05 mm', 0.05, 'mm'],
    ['.05mm', 0.05, 'mm'],
    ['2 thou', 2, 'thou'],
    ['45 N·m', 45, 'N·m'],
    ['35 Nm', 35, 'N·m'],
    ['120 in-lb', 120, 'in·lbf'],
    ['7.5 kgf·m', 7.5, 'kgf·m'],
    ['90°', 90, 'deg'],
    ['90 deg', 90, 'deg'],
    ['¼ turn', 0.25, 'turn'],
    ['1/4 turn', 0.25, 'turn'],
    ['1½ turns', 1.5, 'turn'],
    ['-0.1 mm', -0.1, 'mm'],
    ['−0.1 mm', -0.1, 'mm'], // Unicode minus
    ['2.5e-2 mm', 0.025, 'mm'],
    ['  12 µm  ', 12, 'µm'],
    ['0.002"', 0.002, 'in'],
  ])('"%s"', (text, value, u) => {
    it(`→ ${value} ${u}`, () => {
      const q = parseQuantity(text);
      expect(q.unit).toBe(u);
      expect(q.value).toBeCloseTo(value, 12);
    });
  });

  describe.each<[string, string, RegExp]>([
    ['304 furlongs', 'unknown-unit', /Unknown unit "furlongs"/],
    ['304', 'unknown-unit', /No unit/],
    ['ft-lb', 'invalid-input', /No number/],
    ['', 'invalid-input', /No number/],
    ['0,05 mm', 'invalid-input', /point/],
    ['1/0 mm', 'invalid-input', /zero/],
  ])('bad "%s"', (text, code, message) => {
    it(`throws ${code}`, () => expectDomainError(() => parseQuantity(text), code, message));
  });

  it('parseQuantityOf checks the dimension', () => {
    expect(parseQuantityOf('304 ft-lb', 'torque')).toEqual({ value: 304, unit: 'ft·lbf' });
    expectDomainError(() => parseQuantityOf('0.05 mm', 'torque'), 'unit-mismatch', /Expected a torque/);
  });
});

describe('dimensionOf / unitsOf', () => {
  describe.each<[AnyUnit, string]>([
    ['N·m', 'torque'],
    ['ft·lbf', 'torque'],
    ['in·lbf', 'torque'],
    ['kgf·m', 'torque'],
    ['kgf·cm', 'torque'],
    ['mm', 'length'],
    ['µm', 'length'],
    ['in', 'length'],
    ['thou', 'length'],
    ['deg', 'angle'],
    ['turn', 'angle'],
  ])('%s', (u, d) => {
    it(`is ${d}`, () => {
      expect(dimensionOf(u)).toBe(d);
      expect(unitsOf(dimensionOf(u))).toContain(u);
    });
  });
  it('unknown unit throws', () => expectDomainError(() => dimensionOf('lb' as AnyUnit), 'unknown-unit'));
  it('every unit has a label', () => ALL_UNITS.forEach((u) => expect(UNIT_LABELS[u]).toContain(u === 'deg' ? '°' : u === 'turn' ? 'turn' : u)));
});

// NIST SP 811 (2008 edition), Appendix B.8/B.9 factors, as printed (7 significant digits):
// foot pound-force → N·m 1.355818; inch pound-force → N·m 1.129848 E−01;
// kilogram-force metre → N·m 9.80665 (exact); inch → m 2.54 E−02 (exact); mil → m 2.54 E−05 (exact).
describe('convert: NIST SP 811 (2008) Appendix B factors', () => {
  describe.each<[AnyUnit, AnyUnit, number, number]>([
    ['ft·lbf', 'N·m', 1.355818, 1e-6],
    ['in·lbf', 'N·m', 0.1129848, 1e-6],
    ['kgf·m', 'N·m', 9.80665, 1e-12],
    ['kgf·cm', 'N·m', 0.0980665, 1e-12],
    ['in', 'mm', 25.4, 1e-12],
    ['thou', 'mm', 0.0254, 1e-12],
    ['µm', 'mm', 0.001, 1e-12],
    ['turn', 'deg', 360, 1e-12],
    ['ft·lbf', 'in·lbf', 12, 1e-12],
  ])('1 %s in %s', (from, to, factor, tol) => {
    it(`≈ ${factor}`, () => expect(rel(convert({ value: 1, unit: from }, to).value, factor)).toBeLessThan(tol));
  });

  it('common practice: a crankshaft pulley bolt at 304 ft·lbf is about 412 N·m', () => {
    const nm = convert({ value: 304, unit: 'ft·lbf' }, 'N·m');
    expect(nm.value).toBeCloseTo(412.17, 2);
    expect(formatQuantity(nm, { resolution: 1 })).toBe('412 N·m');
  });

  it('across dimensions throws unit-mismatch', () => {
    expectDomainError(() => convert({ value: 1, unit: 'mm' }, 'N·m'), 'unit-mismatch', /length \(mm\) to torque \(N·m\)/);
  });
  it('NaN throws invalid-input', () => expectDomainError(() => convert({ value: NaN, unit: 'mm' }, 'in'), 'invalid-input'));
  it('unknown source unit throws unknown-unit', () =>
    expectDomainError(() => convert({ value: 1, unit: 'lb' as AnyUnit }, 'N·m'), 'unknown-unit'));
});

// mathjs as an independent reference library. Its `lb` is mass (pound-mass): use `lbf`.
const MATHJS: Record<AnyUnit, string> = {
  'N·m': 'N m',
  'ft·lbf': 'ft lbf',
  'in·lbf': 'in lbf',
  'kgf·m': 'kgf m',
  'kgf·cm': 'kgf cm',
  mm: 'mm',
  µm: 'um',
  in: 'in',
  thou: 'mil',
  deg: 'deg',
  turn: 'cycle',
};

describe('convert agrees with mathjs', () => {
  const pairs = ALL_UNITS.flatMap((a) => ALL_UNITS.filter((b) => dimensionOf(a) === dimensionOf(b)).map((b) => [a, b] as [AnyUnit, AnyUnit]));
  describe.each(pairs)('%s → %s', (from, to) => {
    it.each([1, 0.05, 304, 1234.5678])('%d', (v) => {
      const ours = convert({ value: v, unit: from }, to).value;
      const theirs = mathUnit(v, MATHJS[from]).toNumber(MATHJS[to]);
      expect(rel(ours, theirs)).toBeLessThan(1e-12);
    });
  });
});

describe('convert: properties', () => {
  const sameDim = fc
    .constantFrom(...ALL_UNITS)
    .chain((a) => fc.tuple(fc.constant(a), fc.constantFrom(...ALL_UNITS.filter((b) => dimensionOf(b) === dimensionOf(a)))));
  fcTest.prop([sameDim, fc.double({ min: -1e6, max: 1e6, noNaN: true })])('round-trips', ([a, b], v) => {
    const back = convert(convert({ value: v, unit: a }, b), a).value;
    expect(Math.abs(back - v)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(v)));
  });
  fcTest.prop([sameDim, fc.double({ min: 1e-6, max: 1e6, noNaN: true })])('matches mathjs', ([a, b], v) => {
    expect(rel(convert({ value: v, unit: a }, b).value, mathUnit(v, MATHJS[a]).toNumber(MATHJS[b]))).toBeLessThan(1e-12);
  });
  fcTest.prop([sameDim, fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: -1e3, max: 1e3, noNaN: true })])(
    'is linear',
    ([a, b], x, y) => {
      const sum = convert({ value: x + y, unit: a }, b).value;
      const parts = convert({ value: x, unit: a }, b).value + convert({ value: y, unit: a }, b).value;
      expect(Math.abs(sum - parts)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(x) + Math.abs(y)) * 400);
    },
  );
});

describe('roundTo', () => {
  describe.each<[number, number, number]>([
    [412.17, 1, 412],
    [0.04999, 0.001, 0.05],
    [0.0245, 0.001, 0.025], // halves away from zero
    [-0.0245, 0.001, -0.025],
    [1.005, 0.01, 1.01], // float noise (1.005/0.01 = 100.49999…) does not round the wrong way
    [0.3, 0.1, 0.3],
    [0.1 + 0.2, 0.1, 0.3],
    [2.04, 0.1, 2],
    [0.00123, 0.0005, 0.001],
    [0.00126, 0.0005, 0.0015],
    [47, 5, 45],
    [48, 5, 50],
    [-0.0001, 0.001, 0], // never "-0"
  ])('roundTo(%d, %d)', (v, r, expected) => {
    it(`= ${expected}`, () => {
      expect(roundTo(v, r)).toBe(expected);
      expect(Object.is(roundTo(v, r), -0)).toBe(false);
    });
  });
  describe.each([0, -1, NaN, Infinity])('bad resolution %d', (r) => {
    it('throws invalid-input', () => expectDomainError(() => roundTo(1, r), 'invalid-input', /Resolution/));
  });
  it('NaN value throws', () => expectDomainError(() => roundTo(NaN, 1), 'invalid-input'));

  fcTest.prop([fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.constantFrom(1, 0.5, 0.1, 0.01, 0.001, 0.0005, 0.0001)])(
    'lands on a multiple within half a step',
    (v, r) => {
      const out = roundTo(v, r);
      expect(Math.abs(out - v)).toBeLessThanOrEqual(r / 2 + 1e-9);
      const steps = out / r;
      expect(Math.abs(steps - Math.round(steps))).toBeLessThan(1e-6);
      expect(roundTo(out, r)).toBe(out); // idempotent
    },
  );

  it.each([
    [1, 0],
    [0.1, 1],
    [0.001, 3],
    [0.0005, 4],
    [2.5e-5, 6],
    [5, 0],
  ])('decimalsOf(%d) = %d', (r, d) => expect(decimalsOf(r)).toBe(d));
});

describe('formatQuantity', () => {
  describe.each<[number, AnyUnit, number | undefined, string]>([
    [412.17, 'N·m', 1, '412 N·m'],
    [0.05, 'mm', 0.01, '0.05 mm'],
    [0.05, 'mm', 0.001, '0.050 mm'],
    [2, 'thou', 0.1, '2.0 thou'],
    [0.0020004, 'in', 0.0001, '0.0020 in'],
    [90, 'deg', 1, '90°'],
    [45, 'N·m', undefined, '45 N·m'],
    [91.2, 'ft·lbf', undefined, '91.2 ft·lbf'],
    [0.05, 'mm', undefined, '0.05 mm'],
    [0.25, 'turn', undefined, '0.25 turn'],
    [-0.0001, 'mm', 0.001, '0.000 mm'],
  ])('%d %s at %s', (value, u, resolution, text) => {
    it(`→ "${text}"`, () => expect(formatQuantity({ value, unit: u }, resolution === undefined ? {} : { resolution })).toBe(text));
  });
  it('formatQuantityExact keeps the digits', () => expect(formatQuantityExact({ value: 0.025, unit: 'mm' })).toBe('0.025 mm'));
  it('NaN throws', () => expectDomainError(() => formatQuantity({ value: NaN, unit: 'mm' }), 'invalid-input'));
  it('unknown unit throws', () => expectDomainError(() => formatQuantity({ value: 1, unit: 'lb' as AnyUnit }), 'unknown-unit'));
  fcTest.prop([fc.constantFrom(...ALL_UNITS), fc.double({ min: -1e5, max: 1e5, noNaN: true })])('formats then parses back (at its resolution)', (u, v) => {
    const text = formatQuantity({ value: v, unit: u }, { resolution: 0.01 });
    const q = parseQuantity(text);
    expect(q.unit).toBe(u);
    expect(q.value).toBeCloseTo(roundTo(v, 0.01), 9);
  });
});

describe('unit guards and comparison', () => {
  it.each<[unknown, boolean, boolean, boolean]>([
    ['N·m', true, false, false],
    ['thou', false, true, false],
    ['turn', false, false, true],
    ['lb', false, false, false],
    [undefined, false, false, false],
  ])('%s', (u, t, l, a) => {
    expect(isTorqueUnit(u)).toBe(t);
    expect(isLengthUnit(u)).toBe(l);
    expect(isAngleUnit(u)).toBe(a);
  });
  it('compareQuantities across units', () => {
    expect(compareQuantities({ value: 1, unit: 'in' }, { value: 25, unit: 'mm' })).toBeGreaterThan(0);
    expect(compareQuantities({ value: 100, unit: 'ft·lbf' }, { value: 136, unit: 'N·m' })).toBeLessThan(0);
    expectDomainError(() => compareQuantities({ value: 1, unit: 'in' }, { value: 1, unit: 'deg' }), 'unit-mismatch');
  });
});
