/**
 * Specs and readings: in-spec checks at the instrument's resolution and the derived values
 * engine builders read off a bore gauge and a micrometer.
 */
import { DomainError } from './errors';
import type { AnyUnit, Spec } from './procedure/schema';
import { assertFinite, clean, dimensionOf, roundTo } from './units';

export type { Spec };
export type Side = 'low' | 'ok' | 'high';
export type ReadingCheck = {
  /** The reading rounded to the instrument's resolution. */
  value: number;
  inSpec: boolean;
  /** Rounded reading minus nominal. */
  deviation: number;
  side: Side;
};

function checkSpec(spec: Spec): void {
  if (!spec || typeof spec !== 'object') throw new DomainError('invalid-input', 'A spec is required');
  assertFinite(spec.nominal, 'Spec nominal');
  assertFinite(spec.min, 'Spec minimum');
  assertFinite(spec.max, 'Spec maximum');
  dimensionOf(spec.unit);
  if (!(spec.min <= spec.nominal && spec.nominal <= spec.max))
    throw new DomainError('invalid-input', `Spec nominal ${spec.nominal} must lie between min ${spec.min} and max ${spec.max}`, { ...spec });
}

/**
 * Nominal with a tolerance: "0.05 +0.02 / −0.01 mm". `plus` is how far above nominal is
 * allowed (≥ 0); `minus` how far below, given either as a magnitude (0.01) or signed (−0.01):
 * both mean 0.01 below.
 */
export function specFromTolerance(nominal: number, plus: number, minus: number, unit: AnyUnit): Spec {
  assertFinite(nominal, 'Nominal');
  assertFinite(plus, 'Plus tolerance');
  assertFinite(minus, 'Minus tolerance');
  dimensionOf(unit);
  if (plus < 0) throw new DomainError('invalid-input', `The plus tolerance cannot be negative (got ${plus})`);
  const spec = { nominal, min: clean(nominal - Math.abs(minus)), max: clean(nominal + plus), unit };
  checkSpec(spec);
  return spec;
}

/** Symmetric tolerance: nominal ± tol. */
export const specPlusMinus = (nominal: number, tol: number, unit: AnyUnit): Spec => specFromTolerance(nominal, tol, tol, unit);

/**
 * Limits as ISO 286 writes them: a basic size with signed upper and lower deviations
 * (50 g6 = 50 −0.009/−0.025). The nominal of the returned spec is the middle of the limits.
 */
export function specFromDeviations(basic: number, upper: number, lower: number, unit: AnyUnit): Spec {
  assertFinite(basic, 'Basic size');
  assertFinite(upper, 'Upper deviation');
  assertFinite(lower, 'Lower deviation');
  dimensionOf(unit);
  if (upper < lower) throw new DomainError('invalid-input', `Upper deviation ${upper} is below lower deviation ${lower}`);
  const min = clean(basic + lower);
  const max = clean(basic + upper);
  return { nominal: clean((min + max) / 2), min, max, unit };
}

/** Tiny allowance for float noise so a reading exactly on a limit (0.0500 vs 0.05) is in. */
const epsilonFor = (spec: Pick<Spec, 'min' | 'max'>, resolution: number) =>
  1e-9 * Math.max(1, Math.abs(spec.min), Math.abs(spec.max)) + resolution * 1e-6;

/**
 * Round the reading to the instrument's resolution, then compare with the spec's inclusive
 * limits (a tiny epsilon absorbs float noise).
 */
export function checkReading(value: number, spec: Spec, resolution: number): ReadingCheck {
  assertFinite(value, 'Reading');
  checkSpec(spec);
  const rounded = roundTo(value, resolution);
  const eps = epsilonFor(spec, resolution);
  const side: Side = rounded < spec.min - eps ? 'low' : rounded > spec.max + eps ? 'high' : 'ok';
  return { value: rounded, inSpec: side === 'ok', deviation: clean(rounded - spec.nominal), side };
}

/** Is `value` at most `limit` (with the same epsilon)? For taper and out-of-round maxima. */
export function withinMax(value: number, limit: number, resolution: number): boolean {
  assertFinite(value, 'Value');
  assertFinite(limit, 'Limit');
  return value <= limit + epsilonFor({ min: 0, max: limit }, resolution);
}

/**
 * How far along its tolerance band a reading sits: 0 at nominal, 1 at a limit, above 1
 * outside. Used to pick the worst of several readings.
 */
export function toleranceUsage(value: number, spec: Spec): number {
  const dev = value - spec.nominal;
  const half = dev >= 0 ? spec.max - spec.nominal : spec.nominal - spec.min;
  if (half <= 0) return dev === 0 ? 0 : Infinity;
  return Math.abs(dev) / half;
}

/** Diametral oil clearance: bore (bearing inside diameter) minus journal diameter. */
export function clearance(bore: number, journal: number): number {
  assertFinite(bore, 'Bore');
  assertFinite(journal, 'Journal');
  return clean(bore - journal);
}

/**
 * Taper and out-of-round of a journal (or bore) from diameters measured in two planes along
 * it (A near one end, B near the other) and at two angles around it (0° and 90°):
 * - taper = the largest difference along the journal at one angle: max(|A0 − B0|, |A90 − B90|);
 * - out-of-round = the largest difference around it in one plane: max(|A0 − A90|, |B0 − B90|).
 * This is the usual shop definition found in engine service manuals (the military engine
 * maintenance manuals in REFERENCES.md measure journals the same way; common practice):
 * four points per journal; out-of-round is the difference between readings 90° apart in one
 * plane, taper the difference between the two planes at one angle. It is a two-point diameter
 * method, not ISO 1101 roundness, which would need a roundness instrument.
 */
export function taperAndOutOfRound(r: { a0: number; a90: number; b0: number; b90: number }): { taper: number; outOfRound: number } {
  if (!r || typeof r !== 'object') throw new DomainError('invalid-input', 'Four diameters are required');
  assertFinite(r.a0, 'Diameter A 0°');
  assertFinite(r.a90, 'Diameter A 90°');
  assertFinite(r.b0, 'Diameter B 0°');
  assertFinite(r.b90, 'Diameter B 90°');
  return {
    taper: clean(Math.max(Math.abs(r.a0 - r.b0), Math.abs(r.a90 - r.b90))),
    outOfRound: clean(Math.max(Math.abs(r.a0 - r.a90), Math.abs(r.b0 - r.b90))),
  };
}

/**
 * The same from any number of planes (along) × angles (around): `d[plane][angle]`. Taper is
 * the largest spread along the journal at one angle, out-of-round the largest spread around
 * it in one plane.
 */
export function taperAndOutOfRoundGrid(d: number[][]): { taper: number; outOfRound: number } {
  if (!Array.isArray(d) || d.length === 0 || d.some((row) => !Array.isArray(row) || row.length !== d[0]!.length || row.length === 0))
    throw new DomainError('invalid-input', 'Diameters must be a full grid of planes × angles');
  d.flat().forEach((v) => assertFinite(v, 'Diameter'));
  const spread = (xs: number[]) => Math.max(...xs) - Math.min(...xs);
  const angles = d[0]!.length;
  let taper = 0;
  for (let a = 0; a < angles; a++) taper = Math.max(taper, spread(d.map((row) => row[a]!)));
  const outOfRound = Math.max(...d.map(spread));
  return { taper: clean(taper), outOfRound: clean(outOfRound) };
}
