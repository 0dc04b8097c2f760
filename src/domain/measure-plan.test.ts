import { fc, test as fcTest } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { evaluateMeasure, readingSlots, type MeasureStep } from './measure-plan';
import { measureStep, type MeasureMethod } from './procedure/schema';
import { expectDomainError } from '../../tests/support/domain-error';


const step = (method: MeasureMethod, over: Partial<MeasureStep> = {}): MeasureStep =>
  measureStep.parse({
    id: 'm1',
    kind: 'measure',
    title: 'Measure',
    unit: 'mm',
    spec: { nominal: 0.04, min: 0.02, max: 0.06, unit: 'mm' },
    instrument: { name: 'Bore gauge', resolution: 0.001 },
    positions: ['Main 1', 'Main 2'],
    method,
    ...over,
  });

describe('readingSlots', () => {
  describe.each<[string, MeasureMethod, string[]]>([
    ['direct', { kind: 'direct' }, ['Main 1', 'Main 2']],
    ['clearance', { kind: 'clearance' }, ['Main 1/bore', 'Main 1/journal', 'Main 2/bore', 'Main 2/journal']],
    ['journal', { kind: 'journal', maxTaper: 0.005, maxOutOfRound: 0.005 }, ['Main 1/A0', 'Main 1/A90', 'Main 1/B0', 'Main 1/B90', 'Main 2/A0', 'Main 2/A90', 'Main 2/B0', 'Main 2/B90']],
    ['valve-shim', { kind: 'valve-shim', stock: { kind: 'range', from: 2.5, to: 3.3, step: 0.05 } }, ['Main 1/clearance', 'Main 1/shim', 'Main 2/clearance', 'Main 2/shim']],
  ])('%s', (_n, method, keys) => {
    const slots = readingSlots(step(method));
    it('keys', () => expect(slots.map((s) => s.key)).toEqual(keys));
    it('labels name the position', () => slots.forEach((s) => expect(s.label.startsWith(s.position)).toBe(true)));
  });
  it('labels read well', () => {
    expect(readingSlots(step({ kind: 'journal', maxTaper: 0.005, maxOutOfRound: 0.005 }))[1]).toEqual({ key: 'Main 1/A90', position: 'Main 1', label: 'Main 1 A 90°', part: 'A90' });
    expect(readingSlots(step({ kind: 'valve-shim', stock: { kind: 'list', sizes: [2.5] } }))[1]!.label).toBe('Main 1 installed shim');
  });
  it('duplicate positions throw', () =>
    expectDomainError(() => readingSlots({ ...step({ kind: 'direct' }), positions: ['A', 'A'] }), 'invalid-input', /listed twice/));
});

describe('evaluateMeasure: direct', () => {
  const s = step({ kind: 'direct' }, { positions: ['1', '2', '3'], spec: { nominal: 0.3, min: 0.25, max: 0.5, unit: 'mm' }, instrument: { name: 'Feeler', resolution: 0.01 } });
  it('all in spec, worst named', () => {
    const r = evaluateMeasure(s, { '1': 0.3, '2': 0.45, '3': 0.27 });
    expect(r.complete).toBe(true);
    expect(r.inSpec).toBe(true);
    expect(r.worst).toEqual({ position: '2', value: 0.45 }); // 0.15 of 0.2 above vs 0.03 of 0.05 below
    expect(r.summary).toBe('All 3 in spec; worst 2 at 0.45 mm');
  });
  it('out of spec names the positions and side', () => {
    const r = evaluateMeasure(s, { '1': 0.3, '2': 0.52, '3': 0.2 });
    expect(r.inSpec).toBe(false);
    expect(r.positions.map((p) => p.side)).toEqual(['ok', 'high', 'low']);
    expect(r.positions[1]!.detail).toBe('0.52 mm — high (max 0.5 mm)');
    expect(r.summary).toBe('2 of 3 out of spec: 2 (high), 3 (low)');
    expect(r.worst!.position).toBe('3'); // 0.1 below nominal of 0.05 allowed beats 0.22 over 0.2
  });
  it('rounds at the resolution: 0.504 reads 0.50, in spec', () => {
    const r = evaluateMeasure(s, { '1': 0.504, '2': 0.3, '3': 0.3 });
    expect(r.positions[0]).toMatchObject({ value: 0.5, inSpec: true });
  });
  it('incomplete: complete=false, inSpec=false, missing positions null', () => {
    const r = evaluateMeasure(s, { '1': 0.3 });
    expect(r.complete).toBe(false);
    expect(r.inSpec).toBe(false);
    expect(r.positions[1]).toMatchObject({ value: null, inSpec: null, detail: 'not read yet' });
    expect(r.summary).toBe('1 of 3 positions read');
  });
  it('incomplete with a failure so far says so', () => {
    expect(evaluateMeasure(s, { '2': 0.9 }).summary).toBe('1 of 3 positions read; out of spec so far: 2 (high)');
  });
  it('single position summary', () => {
    const one = step({ kind: 'direct' }, { positions: ['Deck'] });
    expect(evaluateMeasure(one, { Deck: 0.041 }).summary).toBe('In spec: 0.041 mm');
  });
  it('negative readings allowed when the spec allows negatives (piston protrusion)', () => {
    const prot = step({ kind: 'direct' }, { positions: ['1'], spec: { nominal: 0, min: -0.1, max: 0.1, unit: 'mm' } });
    expect(evaluateMeasure(prot, { '1': -0.05 }).inSpec).toBe(true);
  });
  it('unknown keys are ignored', () => expect(evaluateMeasure(s, { zz: 1 }).complete).toBe(false));
});

describe('evaluateMeasure: clearance', () => {
  // ISO 286-2 (from memory, standard tables): 50 H7 bore = 50 +0.025/0; 50 g6 shaft = 50 −0.009/−0.025,
  // so the fit's clearance runs 0.009..0.050 mm.
  const s = step({ kind: 'clearance' }, { spec: { nominal: 0.0295, min: 0.009, max: 0.05, unit: 'mm' } });
  describe.each<[string, number, number, number, boolean]>([
    ['largest hole, smallest shaft', 50.025, 49.975, 0.05, true],
    ['smallest hole, largest shaft', 50.0, 49.991, 0.009, true],
    ['mid', 50.012, 49.983, 0.029, true],
    ['too tight', 50.0, 49.995, 0.005, false],
    ['too loose', 50.03, 49.975, 0.055, false],
  ])('%s', (_n, bore, journal, cl, ok) => {
    it(`clearance ${cl}, in spec ${ok}`, () => {
      const r = evaluateMeasure(s, { 'Main 1/bore': bore, 'Main 1/journal': journal, 'Main 2/bore': 50.01, 'Main 2/journal': 49.98 });
      expect(r.positions[0]!.value).toBeCloseTo(cl, 9);
      expect(r.positions[0]!.inSpec).toBe(ok);
      expect(r.positions[0]!.readings).toEqual({ bore, journal });
    });
  });
  it('waits for the other half of a pair', () => {
    const r = evaluateMeasure(s, { 'Main 1/bore': 50.02 });
    expect(r.positions[0]).toMatchObject({ value: null, inSpec: null, detail: 'waiting for journal' });
  });
  it('detail shows bore and journal', () => {
    const r = evaluateMeasure(s, { 'Main 1/bore': 50.02, 'Main 1/journal': 49.99, 'Main 2/bore': 50.01, 'Main 2/journal': 49.98 });
    expect(r.positions[0]!.detail).toBe('clearance 0.030 mm (bore 50.020 mm − journal 49.990 mm) — in spec');
  });
});

describe('evaluateMeasure: journal', () => {
  const s = step(
    { kind: 'journal', maxTaper: 0.005, maxOutOfRound: 0.004 },
    { positions: ['Rod 1'], spec: { nominal: 47.99, min: 47.98, max: 48.0, unit: 'mm' } },
  );
  const read = (a0: number, a90: number, b0: number, b90: number) => evaluateMeasure(s, { 'Rod 1/A0': a0, 'Rod 1/A90': a90, 'Rod 1/B0': b0, 'Rod 1/B90': b90 });
  describe.each<[string, [number, number, number, number], { taper: number; outOfRound: number; inSpec: boolean }]>([
    ['round and straight', [47.99, 47.99, 47.99, 47.99], { taper: 0, outOfRound: 0, inSpec: true }],
    ['taper at the limit', [47.995, 47.995, 47.99, 47.99], { taper: 0.005, outOfRound: 0, inSpec: true }],
    ['taper over', [47.997, 47.997, 47.99, 47.991], { taper: 0.007, outOfRound: 0.001, inSpec: false }],
    ['out-of-round over', [47.995, 47.99, 47.995, 47.991], { taper: 0.001, outOfRound: 0.005, inSpec: false }],
    ['a diameter under size', [47.979, 47.98, 47.98, 47.98], { taper: 0.001, outOfRound: 0.001, inSpec: false }],
  ])('%s', (_n, d, expected) => {
    it('taper, out-of-round, verdict', () => {
      const p = read(...d).positions[0]!;
      expect(p.taper).toBeCloseTo(expected.taper, 9);
      expect(p.outOfRound).toBeCloseTo(expected.outOfRound, 9);
      expect(p.inSpec).toBe(expected.inSpec);
    });
  });
  it('detail names what failed', () => {
    expect(read(47.997, 47.997, 47.99, 47.991).positions[0]!.detail).toMatch(/taper over 0.005 mm/);
    expect(read(47.979, 47.98, 47.98, 47.98).positions[0]!.detail).toMatch(/diameter low \(min 47.98 mm\)/);
  });
  it('zero or negative diameters are not plausible', () => expectDomainError(() => read(0, 47.99, 47.99, 47.99), 'invalid-input', /greater than zero/));
});

describe('evaluateMeasure: valve-shim', () => {
  const s = step(
    { kind: 'valve-shim', stock: { kind: 'range', from: 2.5, to: 3.3, step: 0.05 } },
    { positions: ['1 IN', '1 EX'], spec: { nominal: 0.2, min: 0.15, max: 0.25, unit: 'mm' }, instrument: { name: 'Feeler', resolution: 0.01 } },
  );
  it('in spec: keeps the shim', () => {
    const r = evaluateMeasure(s, { '1 IN/clearance': 0.2, '1 IN/shim': 2.6, '1 EX/clearance': 0.22, '1 EX/shim': 2.6 });
    expect(r.inSpec).toBe(true);
    expect(r.positions[0]!.detail).toBe('0.20 mm — in spec; keep 2.60 mm shim');
  });
  it('too loose: a thicker shim, resulting clearance reported', () => {
    const r = evaluateMeasure(s, { '1 IN/clearance': 0.32, '1 IN/shim': 2.6, '1 EX/clearance': 0.2, '1 EX/shim': 2.6 });
    const p = r.positions[0]!;
    expect(p.inSpec).toBe(false);
    expect(p.shim).toMatchObject({ required: 2.72, chosen: 2.7, fits: true });
    expect(p.shim!.resultingClearance).toBeCloseTo(0.22, 9);
    expect(p.detail).toBe('0.32 mm — high (max 0.25 mm); fit 2.70 mm shim (installed 2.60 mm) → 0.22 mm');
    expect(r.summary).toBe('1 of 2 out of spec: 1 IN (high)');
  });
  it('no stocked size fits: says so', () => {
    const r = evaluateMeasure(s, { '1 IN/clearance': 0.9, '1 IN/shim': 3.2, '1 EX/clearance': 0.2, '1 EX/shim': 2.6 });
    expect(r.positions[0]!.shim).toMatchObject({ fits: false, chosen: null, resultingClearance: null });
    expect(r.summary).toMatch(/no stocked shim fits 1 IN/);
  });
  it('a zero clearance (tight valve) is a real reading; a negative one is not', () => {
    expect(evaluateMeasure(s, { '1 IN/clearance': 0, '1 IN/shim': 2.7 }).positions[0]!.side).toBe('low');
    expectDomainError(() => evaluateMeasure(s, { '1 IN/clearance': -0.1 }), 'invalid-input', /cannot be negative/);
  });
});

describe('evaluateMeasure: bad readings', () => {
  const s = step({ kind: 'direct' });
  describe.each<[string, Record<string, number>, RegExp]>([
    ['NaN', { 'Main 1': NaN }, /not a number/],
    ['Infinity', { 'Main 1': Infinity }, /not a number/],
    ['a string', { 'Main 1': '0.04' as unknown as number }, /not a number/],
    ['absurdly large', { 'Main 1': 1e9 }, /not plausible/],
    ['negative gap', { 'Main 1': -0.01 }, /cannot be negative/],
  ])('%s', (_n, readings, message) => {
    it('throws invalid-input', () => expectDomainError(() => evaluateMeasure(s, readings), 'invalid-input', message));
  });
  it('a step with zero resolution throws', () =>
    expectDomainError(() => evaluateMeasure({ ...s, instrument: { name: 'x', resolution: 0 } }, {}), 'invalid-input', /resolution/));
});

describe('evaluateMeasure: properties', () => {
  const s = step({ kind: 'direct' }, { positions: ['a', 'b', 'c', 'd'] });
  const reading = fc.option(fc.double({ min: 0, max: 0.2, noNaN: true }), { nil: undefined });
  fcTest.prop([fc.tuple(reading, reading, reading, reading)])('complete iff every slot is read; inSpec only when complete and all in', (vals) => {
    const readings: Record<string, number> = {};
    ['a', 'b', 'c', 'd'].forEach((k, i) => {
      if (vals[i] !== undefined) readings[k] = vals[i]!;
    });
    const r = evaluateMeasure(s, readings);
    expect(r.complete).toBe(vals.every((v) => v !== undefined));
    expect(r.inSpec).toBe(r.complete && r.positions.every((p) => p.inSpec === true));
    if (r.worst) expect(r.positions.some((p) => p.position === r.worst!.position && p.value === r.worst!.value)).toBe(true);
    expect(r.worst === null).toBe(vals.every((v) => v === undefined));
  });
});
