/**
 * Bridges a measure step of the procedure schema to the maths: which readings to collect
 * (`readingSlots`) and what they mean (`evaluateMeasure`).
 *
 * Slot keys per method:
 * - direct: one per position, key = position;
 * - clearance: `${position}/bore` and `${position}/journal`; clearance = bore − journal;
 * - journal: `${position}/A0`, `/A90`, `/B0`, `/B90` (planes A and B along the journal, 0° and
 *   90° around it); each diameter against the spec, taper and out-of-round against the
 *   method's maxima;
 * - valve-shim: `${position}/clearance` and `${position}/shim` (the installed shim); the spec is
 *   the clearance, and a stocked shim is chosen for each valve.
 *
 * Every reading is rounded to the instrument's resolution before anything is computed from it.
 * A reading that cannot be real — NaN, infinite, negative where a size or a gap cannot be
 * negative, or absurdly large for its unit — throws DomainError 'invalid-input'; a real but
 * bad reading is simply out of spec.
 */
import { DomainError } from './errors';
import type { Spec, StepOf } from './procedure/schema';
import { checkReading, clearance, taperAndOutOfRound, toleranceUsage, withinMax, type Side } from './readings';
import { chooseShim, type ShimChoice } from './shims';
import { convert, dimensionOf, formatQuantity, formatQuantityExact, roundTo, type AnyUnit } from './units';

export type MeasureStep = StepOf<'measure'>;

export type SlotPart = 'value' | 'bore' | 'journal' | 'A0' | 'A90' | 'B0' | 'B90' | 'clearance' | 'shim';

export type ReadingSlot = { key: string; position: string; label: string; part: SlotPart };

export type PositionResult = {
  position: string;
  /** The position's headline value: the reading (direct), the clearance, the worst diameter (journal) or the measured valve clearance. */
  value: number | null;
  inSpec: boolean | null;
  detail: string;
  side?: Side;
  taper?: number;
  outOfRound?: number;
  shim?: ShimChoice;
  /** Readings for this position as rounded to the instrument's resolution, by slot part. */
  readings?: Partial<Record<SlotPart, number>>;
};

export type MeasureResult = {
  complete: boolean;
  /** True only when every slot is read and every position is in spec. */
  inSpec: boolean;
  positions: PositionResult[];
  /** The position nearest to (or furthest past) its limits; null until something is read. */
  worst: { position: string; value: number } | null;
  summary: string;
};

const PARTS: Record<MeasureStep['method']['kind'], Array<{ part: SlotPart; suffix: string; label: string }>> = {
  direct: [{ part: 'value', suffix: '', label: '' }],
  clearance: [
    { part: 'bore', suffix: '/bore', label: 'bore' },
    { part: 'journal', suffix: '/journal', label: 'journal' },
  ],
  journal: [
    { part: 'A0', suffix: '/A0', label: 'A 0°' },
    { part: 'A90', suffix: '/A90', label: 'A 90°' },
    { part: 'B0', suffix: '/B0', label: 'B 0°' },
    { part: 'B90', suffix: '/B90', label: 'B 90°' },
  ],
  'valve-shim': [
    { part: 'clearance', suffix: '/clearance', label: 'clearance' },
    { part: 'shim', suffix: '/shim', label: 'installed shim' },
  ],
};

function checkStep(step: MeasureStep): void {
  if (!step || typeof step !== 'object' || step.kind !== 'measure') throw new DomainError('invalid-input', 'A measure step is required');
  dimensionOf(step.unit);
  if (!step.method || !(step.method.kind in PARTS))
    throw new DomainError('invalid-input', `Unknown measure method "${String((step.method as { kind?: unknown } | undefined)?.kind)}"`);
  const r = step.instrument?.resolution;
  if (typeof r !== 'number' || !Number.isFinite(r) || r <= 0)
    throw new DomainError('invalid-input', 'The instrument needs a resolution greater than zero');
  if (!Array.isArray(step.positions) || step.positions.length === 0) throw new DomainError('invalid-input', 'The step has no positions');
  const seen = new Set<string>();
  for (const p of step.positions) {
    if (typeof p !== 'string' || p.trim() === '') throw new DomainError('invalid-input', 'Every position needs a name');
    if (seen.has(p)) throw new DomainError('invalid-input', `Position "${p}" is listed twice`, { position: p });
    seen.add(p);
  }
}

/** The readings a measure step asks for, in the order to take them. */
export function readingSlots(step: MeasureStep): ReadingSlot[] {
  checkStep(step);
  const parts = PARTS[step.method.kind];
  return step.positions.flatMap((position) =>
    parts.map(({ part, suffix, label }) => ({ key: `${position}${suffix}`, position, label: label ? `${position} ${label}` : position, part })),
  );
}

/** Parts that are physical sizes: never zero or negative. */
const SIZE_PARTS = new Set<SlotPart>(['bore', 'journal', 'A0', 'A90', 'B0', 'B90', 'shim']);

/** Largest believable magnitude per dimension, in the dimension's base unit. */
const PLAUSIBLE_MAX: Record<'torque' | 'length' | 'angle', number> = { length: 10_000, torque: 100_000, angle: 36_000 };

function plausible(value: unknown, slot: ReadingSlot, step: MeasureStep): number {
  if (typeof value !== 'number' || !Number.isFinite(value))
    throw new DomainError('invalid-input', `Reading for ${slot.label} is not a number`, { key: slot.key, value: String(value) });
  const dim = dimensionOf(step.unit);
  if (Math.abs(convert({ value, unit: step.unit }, baseUnit(dim)).value) > PLAUSIBLE_MAX[dim])
    throw new DomainError('invalid-input', `Reading for ${slot.label} (${value} ${step.unit}) is not plausible`, { key: slot.key, value });
  const mustBePositive = SIZE_PARTS.has(slot.part);
  if (mustBePositive && value <= 0)
    throw new DomainError('invalid-input', `Reading for ${slot.label} must be greater than zero (got ${value})`, { key: slot.key, value });
  const negativeOk = slot.part === 'value' && step.spec.min < 0;
  if (!negativeOk && value < 0)
    throw new DomainError('invalid-input', `Reading for ${slot.label} cannot be negative (got ${value})`, { key: slot.key, value });
  return value;
}

const baseUnit = (dim: 'torque' | 'length' | 'angle'): AnyUnit => (dim === 'torque' ? 'N·m' : dim === 'length' ? 'mm' : 'deg');

export function evaluateMeasure(step: MeasureStep, readings: Record<string, number>): MeasureResult {
  checkStep(step);
  if (!readings || typeof readings !== 'object') throw new DomainError('invalid-input', 'Readings must be a record of slot key to value');
  const res = step.instrument.resolution;
  const spec = step.spec;
  const fmt = (v: number) => formatQuantity({ value: v, unit: step.unit }, { resolution: res });
  const slots = readingSlots(step);
  const got = new Map<string, number>();
  for (const slot of slots) {
    if (!Object.prototype.hasOwnProperty.call(readings, slot.key)) continue;
    const raw = readings[slot.key];
    if (raw === undefined || raw === null) continue;
    got.set(slot.key, roundTo(plausible(raw, slot, step), res));
  }
  const complete = got.size === slots.length;

  const scores = new Map<string, number>();
  const positions: PositionResult[] = step.positions.map((position) => {
    const mine = slots.filter((s) => s.position === position);
    const values: Partial<Record<SlotPart, number>> = {};
    const missing: string[] = [];
    for (const s of mine) {
      const v = got.get(s.key);
      if (v === undefined) missing.push(s.part === 'value' ? 'reading' : PARTS[step.method.kind].find((p) => p.part === s.part)!.label);
      else values[s.part] = v;
    }
    if (missing.length > 0) {
      const detail = missing.length === mine.length ? 'not read yet' : `waiting for ${missing.join(', ')}`;
      return { position, value: null, inSpec: null, detail, readings: values };
    }
    const r = evaluatePosition(step, values, fmt);
    scores.set(position, r.score);
    return { position, ...r.result, readings: values };
  });

  let worst: MeasureResult['worst'] = null;
  let worstScore = -Infinity;
  for (const p of positions) {
    const s = scores.get(p.position);
    if (s === undefined || p.value === null) continue;
    if (s > worstScore) {
      worstScore = s;
      worst = { position: p.position, value: p.value };
    }
  }

  const read = positions.filter((p) => p.inSpec !== null);
  const out = read.filter((p) => p.inSpec === false);
  const inSpec = complete && out.length === 0;
  const outList = out.map((p) => `${p.position}${p.side && p.side !== 'ok' ? ` (${p.side})` : ''}`).join(', ');
  let summary: string;
  if (!complete) {
    summary = `${read.length} of ${positions.length} positions read`;
    if (out.length) summary += `; out of spec so far: ${outList}`;
  } else if (out.length === 0) {
    summary = positions.length === 1 ? `In spec: ${fmt(positions[0]!.value!)}` : `All ${positions.length} in spec; worst ${worst!.position} at ${fmt(worst!.value)}`;
  } else {
    summary = `${out.length} of ${positions.length} out of spec: ${outList}`;
  }
  if (complete && step.method.kind === 'valve-shim') {
    const noFit = positions.filter((p) => p.shim && !p.shim.fits).map((p) => p.position);
    if (noFit.length) summary += `; no stocked shim fits ${noFit.join(', ')}`;
  }
  return { complete, inSpec, positions, worst, summary };
}

type Evaluated = { result: Omit<PositionResult, 'position' | 'readings'>; score: number };

const limit = (v: number, unit: AnyUnit) => formatQuantityExact({ value: v, unit });
const verdict = (side: Side, spec: Spec) =>
  side === 'ok' ? 'in spec' : side === 'low' ? `low (min ${limit(spec.min, spec.unit)})` : `high (max ${limit(spec.max, spec.unit)})`;

function evaluatePosition(step: MeasureStep, v: Partial<Record<SlotPart, number>>, fmt: (n: number) => string): Evaluated {
  const res = step.instrument.resolution;
  const spec = step.spec;
  const method = step.method;
  switch (method.kind) {
    case 'direct': {
      const c = checkReading(v.value!, spec, res);
      return { result: { value: c.value, inSpec: c.inSpec, side: c.side, detail: `${fmt(c.value)} — ${verdict(c.side, spec)}` }, score: toleranceUsage(c.value, spec) };
    }
    case 'clearance': {
      const c = checkReading(clearance(v.bore!, v.journal!), spec, res);
      return {
        result: {
          value: c.value,
          inSpec: c.inSpec,
          side: c.side,
          detail: `clearance ${fmt(c.value)} (bore ${fmt(v.bore!)} − journal ${fmt(v.journal!)}) — ${verdict(c.side, spec)}`,
        },
        score: toleranceUsage(c.value, spec),
      };
    }
    case 'journal': {
      const d = { a0: v.A0!, a90: v.A90!, b0: v.B0!, b90: v.B90! };
      const checks = [d.a0, d.a90, d.b0, d.b90].map((x) => checkReading(x, spec, res));
      const worst = checks.reduce((w, c) => (toleranceUsage(c.value, spec) > toleranceUsage(w.value, spec) ? c : w));
      const t = taperAndOutOfRound(d);
      const taper = roundTo(t.taper, res);
      const outOfRound = roundTo(t.outOfRound, res);
      const taperOk = withinMax(taper, method.maxTaper, res);
      const roundOk = withinMax(outOfRound, method.maxOutOfRound, res);
      const diametersOk = checks.every((c) => c.inSpec);
      const problems: string[] = [];
      const low = checks.filter((c) => c.side === 'low');
      const high = checks.filter((c) => c.side === 'high');
      if (low.length) problems.push(`diameter low (min ${limit(spec.min, spec.unit)})`);
      if (high.length) problems.push(`diameter high (max ${limit(spec.max, spec.unit)})`);
      if (!taperOk) problems.push(`taper over ${limit(method.maxTaper, step.unit)}`);
      if (!roundOk) problems.push(`out-of-round over ${limit(method.maxOutOfRound, step.unit)}`);
      const ratio = (x: number, max: number) => (max > 0 ? x / max : x > 0 ? Infinity : 0);
      const score = Math.max(toleranceUsage(worst.value, spec), ratio(taper, method.maxTaper), ratio(outOfRound, method.maxOutOfRound));
      const side: Side = high.length && !low.length ? 'high' : low.length && !high.length ? 'low' : 'ok';
      return {
        result: {
          value: worst.value,
          inSpec: diametersOk && taperOk && roundOk,
          side: diametersOk ? 'ok' : side,
          taper,
          outOfRound,
          detail: `${fmt(worst.value)} worst diameter; taper ${fmt(taper)}, out-of-round ${fmt(outOfRound)} — ${problems.length ? problems.join('; ') : 'in spec'}`,
        },
        score,
      };
    }
    case 'valve-shim': {
      const c = checkReading(v.clearance!, spec, res);
      const shim = chooseShim({ measured: c.value, installed: v.shim!, spec, stock: method.stock, resolution: res });
      let advice: string;
      if (!shim.fits) advice = `no stocked shim fits (needs ${limit(shim.required, step.unit)})`;
      else if (Math.abs(shim.chosen! - v.shim!) < res / 2) advice = `keep ${fmt(v.shim!)} shim`;
      else advice = `fit ${fmt(shim.chosen!)} shim (installed ${fmt(v.shim!)}) → ${fmt(shim.resultingClearance!)}`;
      return {
        result: { value: c.value, inSpec: c.inSpec, side: c.side, shim, detail: `${fmt(c.value)} — ${verdict(c.side, spec)}; ${advice}` },
        score: toleranceUsage(c.value, spec),
      };
    }
  }
}
