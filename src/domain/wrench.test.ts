import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import type { LengthUnit, TorqueQuantity } from './procedure/schema';
import type { Quantity } from './units';
import { appliedTorque, wrenchSetting } from './wrench';
import { expectDomainError } from '../../tests/support/domain-error';


const inch = (value: number): Quantity<LengthUnit> => ({ value, unit: 'in' });

describe('wrenchSetting = desired × L / (L + E)', () => {
  describe.each<[string, TorqueQuantity, Quantity<LengthUnit>, Quantity<LengthUnit>, number]>([
    // U.S. Army TM 1-1500-204-23-9, ch. 8 (torque wrench attachments, extending lever length):
    // 10 in wrench, 4 in attachment, 300 in·lb wanted → set 3000 / 14 = 214 in·lb.
    ['TM 1-1500-204-23-9 example', { value: 300, unit: 'in·lbf' }, inch(10), inch(4), 214.2857142857],
    // U.S. Army TM 9-2350-261-20-1 / TM 9-2350-277-40&P (torque wrench adapters): 40 lb-ft,
    // 12 in wrench, 4 in adapter → 480 / 16 = 30 lb-ft.
    ['TM 9-2350 adapter example', { value: 40, unit: 'ft·lbf' }, inch(12), inch(4), 30],
    // Mixed units: a 500 mm wrench with a 100 mm adapter given in inches.
    ['mixed units', { value: 100, unit: 'N·m' }, { value: 500, unit: 'mm' }, inch(100 / 25.4), 100 * 500 / 600],
  ])('%s', (_n, desired, l, e, expected) => {
    it(`→ ${expected.toFixed(4)} ${desired.unit}`, () => {
      const s = wrenchSetting(desired, l, e);
      expect(s.unit).toBe(desired.unit);
      expect(s.value).toBeCloseTo(expected, 8);
    });
  });

  describe.each<[string, TorqueQuantity, Quantity<LengthUnit>, Quantity<LengthUnit>, string, RegExp]>([
    ['zero wrench length', { value: 40, unit: 'ft·lbf' }, inch(0), inch(4), 'invalid-input', /Wrench length must be greater than zero/],
    ['negative wrench length', { value: 40, unit: 'ft·lbf' }, inch(-12), inch(4), 'invalid-input', /Wrench length/],
    ['zero extension', { value: 40, unit: 'ft·lbf' }, inch(12), inch(0), 'invalid-input', /Extension length must be greater than zero/],
    ['negative extension', { value: 40, unit: 'ft·lbf' }, inch(12), inch(-1), 'invalid-input', /Extension length/],
    ['NaN length', { value: 40, unit: 'ft·lbf' }, inch(NaN), inch(4), 'invalid-input', /finite/],
    ['negative torque', { value: -40, unit: 'ft·lbf' }, inch(12), inch(4), 'invalid-input', /greater than zero/],
    ['NaN torque', { value: NaN, unit: 'ft·lbf' }, inch(12), inch(4), 'invalid-input', /finite/],
    ['length in a torque unit', { value: 40, unit: 'ft·lbf' }, { value: 12, unit: 'N·m' } as unknown as Quantity<LengthUnit>, inch(4), 'unit-mismatch', /length unit/],
    ['unknown length unit', { value: 40, unit: 'ft·lbf' }, { value: 12, unit: 'cubit' } as unknown as Quantity<LengthUnit>, inch(4), 'unknown-unit', /cubit/],
  ])('%s', (_n, d, l, e, code, message) => {
    it(`throws ${code}`, () => expectDomainError(() => wrenchSetting(d, l, e), code, message));
  });

  fcTest.prop([
    fc.double({ min: 0.1, max: 5000, noNaN: true }),
    fc.double({ min: 1, max: 2000, noNaN: true }),
    fc.double({ min: 0.1, max: 1000, noNaN: true }),
  ])('setting is below desired, and applied(setting) gives desired back', (t, l, e) => {
    const desired: TorqueQuantity = { value: t, unit: 'N·m' };
    const s = wrenchSetting(desired, { value: l, unit: 'mm' }, { value: e, unit: 'mm' });
    expect(s.value).toBeLessThan(t);
    const back = appliedTorque(s, { value: l, unit: 'mm' }, { value: e, unit: 'mm' });
    expect(Math.abs(back.value - t) / t).toBeLessThan(1e-12);
  });
});
