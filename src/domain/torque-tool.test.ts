import { describe, expect, it } from 'vitest';
import { acceptReading, permissibleDeviation, testTorques, type ToolClass, type ToolType } from './torque-tool';
import { expectDomainError } from '../../tests/support/domain-error';


// ISO 6789-1:2017, 5.1.5 maximum permissible deviation, by type, class and the tool's maximum
// torque. Type II class A (±4 % above 10 N·m, ±6 % at or below) is as summarised in a tool
// maker's published review of ISO 6789; the other rows are FROM MEMORY of the
// standard's table and not checked against a copy of it.
describe('permissibleDeviation (ISO 6789-1:2017)', () => {
  describe.each<[ToolType, ToolClass, number, number]>([
    ['I', 'A', 0.04, 0.06],
    ['I', 'B', 0.04, 0.04],
    ['I', 'C', 0.04, 0.04],
    ['I', 'D', 0.04, 0.06],
    ['I', 'E', 0.04, 0.04],
    ['II', 'A', 0.04, 0.06],
    ['II', 'B', 0.06, 0.06],
    ['II', 'C', 0.06, 0.06],
    ['II', 'D', 0.04, 0.06],
    ['II', 'E', 0.06, 0.06],
    ['II', 'F', 0.06, 0.06],
    ['II', 'G', 0.04, 0.06],
  ])('Type %s class %s', (type, cls, big, small) => {
    it(`±${big * 100} % above 10 N·m`, () => {
      expect(permissibleDeviation(type, cls, { value: 200, unit: 'N·m' })).toBe(big);
      expect(permissibleDeviation(type, cls, 10.5)).toBe(big);
    });
    it(`±${small * 100} % at or below 10 N·m`, () => {
      expect(permissibleDeviation(type, cls, 10)).toBe(small);
      expect(permissibleDeviation(type, cls, { value: 5, unit: 'N·m' })).toBe(small);
      // 80 in·lbf = 9.04 N·m: a small tool, whatever unit it is marked in.
      expect(permissibleDeviation(type, cls, { value: 80, unit: 'in·lbf' })).toBe(small);
    });
  });

  describe.each<[string, () => unknown, string, RegExp]>([
    ['Type I has no class F', () => permissibleDeviation('I', 'F', 100), 'invalid-input', /no class "F"/],
    ['unknown type', () => permissibleDeviation('III' as ToolType, 'A', 100), 'invalid-input', /Unknown torque tool type/],
    ['negative max torque', () => permissibleDeviation('II', 'A', -5), 'invalid-input', /greater than zero/],
    ['NaN max torque', () => permissibleDeviation('II', 'A', NaN), 'invalid-input', /greater than zero/],
    ['length as torque', () => permissibleDeviation('II', 'A', { value: 5, unit: 'mm' } as never), 'unit-mismatch', /torque unit/],
  ])('%s', (_n, fn, code, message) => {
    it(`throws ${code}`, () => expectDomainError(fn, code, message));
  });
});

describe('acceptReading', () => {
  const click = { type: 'II' as const, cls: 'A' as const, maxTorque: { value: 200, unit: 'N·m' as const } };
  describe.each<[string, number, number, boolean]>([
    // set value, reference reading, accepted? (deviation = (set − reference) / reference)
    ['exact', 100, 100, true],
    ['+4 % (set 104 against 100): on the limit', 104, 100, true],
    ['−4 % (set 96 against 100): on the limit', 96, 100, true],
    ['+4.1 %', 104.1, 100, false],
    ['reference high by 5 %', 100, 105, false],
  ])('%s', (_n, set, ref, ok) => {
    it(`accepted: ${ok}`, () => {
      const r = acceptReading({ ...click, toolValue: { value: set, unit: 'N·m' }, reference: { value: ref, unit: 'N·m' } });
      expect(r.accepted).toBe(ok);
      expect(r.permissible).toBe(0.04);
      expect(r.deviation).toBeCloseTo((set - ref) / ref, 12);
    });
  });
  it('mixed units: set 100 ft·lbf, reference 135.58 N·m', () => {
    const r = acceptReading({ ...click, toolValue: { value: 100, unit: 'ft·lbf' }, reference: { value: 135.58, unit: 'N·m' } });
    expect(r.accepted).toBe(true);
    expect(Math.abs(r.deviation)).toBeLessThan(0.0001);
  });
  it('a small screwdriver gets ±6 %', () => {
    const r = acceptReading({ type: 'II', cls: 'D', maxTorque: 5, toolValue: { value: 2, unit: 'N·m' }, reference: { value: 1.9, unit: 'N·m' } });
    expect(r).toMatchObject({ permissible: 0.06, accepted: true });
  });
  it('negative reference throws', () =>
    expectDomainError(() => acceptReading({ ...click, toolValue: { value: 100, unit: 'N·m' }, reference: { value: -1, unit: 'N·m' } }), 'invalid-input'));
});

describe('testTorques', () => {
  it.each<[number, number | undefined, number[]]>([
    [200, undefined, [40, 120, 200]],
    [100, 10, [10, 60, 100]], // 2017: start at the lowest marked value
  ])('max %d, lowest %s', (max, low, expected) => {
    expect(testTorques({ value: max, unit: 'N·m' }, low === undefined ? undefined : { value: low, unit: 'N·m' }).map((t) => t.value)).toEqual(expected);
  });
  it('lowest above the max throws', () => expectDomainError(() => testTorques({ value: 10, unit: 'N·m' }, { value: 20, unit: 'N·m' }), 'invalid-input'));
});
