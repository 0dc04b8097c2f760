/**
 * Units of the shop floor: torque, length and angle, a quantity that carries its unit,
 * conversion, shop-notation parsing and display rounding.
 *
 * Conversion factors are exact where the definitions are exact (NIST SP 811 (2008), Appendix B):
 *   1 in = 25.4 mm (exact); 1 ft = 0.3048 m (exact); 1 lbf = 4.4482216152605 N (exact, from
 *   1 lb = 0.45359237 kg and standard gravity 9.80665 m/s²); 1 kgf = 9.80665 N (exact).
 * So 1 ft·lbf = 1.3558179483314004 N·m and 1 in·lbf = 0.1129848290276167 N·m, which NIST
 * rounds to 1.355818 and 1.129848 E−01.
 */
import { DomainError } from './errors';
import type { AngleUnit, AnyUnit, LengthUnit, TorqueUnit, TorqueQuantity } from './procedure/schema';
import { ANGLE_UNITS, LENGTH_UNITS, TORQUE_UNITS } from './procedure/vocabulary';

export type { AngleUnit, AnyUnit, LengthUnit, TorqueUnit, TorqueQuantity };
export { ANGLE_UNITS, LENGTH_UNITS, TORQUE_UNITS };

export type Dimension = 'torque' | 'length' | 'angle';
export type Quantity<U extends AnyUnit = AnyUnit> = { value: number; unit: U };

/** Exact definitions (see file comment). */
const LBF_IN_N = 4.4482216152605;
const KGF_IN_N = 9.80665;

type UnitDef = { dimension: Dimension; /** size of one unit in the dimension's base unit (N·m, mm, deg) */ factor: number };

const UNITS: Record<AnyUnit, UnitDef> = {
  'N·m': { dimension: 'torque', factor: 1 },
  'ft·lbf': { dimension: 'torque', factor: 0.3048 * LBF_IN_N },
  'in·lbf': { dimension: 'torque', factor: 0.0254 * LBF_IN_N },
  'kgf·m': { dimension: 'torque', factor: KGF_IN_N },
  'kgf·cm': { dimension: 'torque', factor: KGF_IN_N / 100 },
  mm: { dimension: 'length', factor: 1 },
  µm: { dimension: 'length', factor: 0.001 },
  in: { dimension: 'length', factor: 25.4 },
  thou: { dimension: 'length', factor: 0.0254 },
  deg: { dimension: 'angle', factor: 1 },
  turn: { dimension: 'angle', factor: 360 },
};

export const ALL_UNITS = [...TORQUE_UNITS, ...LENGTH_UNITS, ...ANGLE_UNITS] as const satisfies readonly AnyUnit[];

/** Names for pickers and help text, e.g. `<option value="ft·lbf">foot pound-force (ft·lbf)</option>`. */
export const UNIT_LABELS: Record<AnyUnit, string> = {
  'N·m': 'newton metre (N·m)',
  'ft·lbf': 'foot pound-force (ft·lbf)',
  'in·lbf': 'inch pound-force (in·lbf)',
  'kgf·m': 'kilogram-force metre (kgf·m)',
  'kgf·cm': 'kilogram-force centimetre (kgf·cm)',
  mm: 'millimetre (mm)',
  µm: 'micrometre (µm)',
  in: 'inch (in)',
  thou: 'thousandth of an inch (thou)',
  deg: 'degree (°)',
  turn: 'turn (360°)',
};

/** Symbols written after a number. Degrees are written "90°" with no space. */
export const UNIT_SYMBOLS: Record<AnyUnit, string> = {
  'N·m': 'N·m',
  'ft·lbf': 'ft·lbf',
  'in·lbf': 'in·lbf',
  'kgf·m': 'kgf·m',
  'kgf·cm': 'kgf·cm',
  mm: 'mm',
  µm: 'µm',
  in: 'in',
  thou: 'thou',
  deg: '°',
  turn: 'turn',
};

/**
 * Display steps used when `formatQuantity` is given no resolution: the value is rounded to
 * this step and trailing zeros dropped. With a resolution, decimals are fixed instead.
 */
export const DEFAULT_RESOLUTION: Record<AnyUnit, number> = {
  'N·m': 0.1,
  'ft·lbf': 0.1,
  'in·lbf': 1,
  'kgf·m': 0.01,
  'kgf·cm': 0.1,
  mm: 0.001,
  µm: 0.1,
  in: 0.0001,
  thou: 0.01,
  deg: 0.1,
  turn: 0.001,
};

/**
 * Shop spellings, normalised by `normaliseUnitText` (lower case, "µ"/"μ" → "u", separators
 * ·⋅•-*. space × _ / removed, "°" kept). Note "nm" is newton metre: nanometres are not a shop
 * unit here, and a torque spec written "Nm" is common.
 */
const ALIASES: Record<string, AnyUnit> = {};
const alias = (unit: AnyUnit, ...names: string[]) => names.forEach((n) => (ALIASES[n] = unit));
alias('N·m', 'nm', 'newtonmeter', 'newtonmeters', 'newtonmetre', 'newtonmetres');
alias('ft·lbf', 'ftlb', 'ftlbs', 'ftlbf', 'lbft', 'lbsft', 'lbfft', 'footpound', 'footpounds', 'footpoundforce', 'poundfoot', 'poundfeet', 'poundforcefoot');
alias('in·lbf', 'inlb', 'inlbs', 'inlbf', 'lbin', 'lbsin', 'lbfin', 'inchpound', 'inchpounds', 'inchpoundforce', 'poundinch', 'poundinches', 'poundforceinch');
alias('kgf·m', 'kgfm', 'kgm', 'mkg', 'mkgf', 'kpm', 'kilogramforcemetre', 'kilogramforcemeter');
alias('kgf·cm', 'kgfcm', 'kgcm', 'cmkg', 'cmkgf', 'kpcm', 'kilogramforcecentimetre', 'kilogramforcecentimeter');
alias('mm', 'mm', 'millimeter', 'millimeters', 'millimetre', 'millimetres');
alias('µm', 'um', 'micron', 'microns', 'micrometer', 'micrometers', 'micrometre', 'micrometres');
alias('in', 'in', 'inch', 'inches', '"', '′′', "''");
alias('thou', 'thou', 'thous', 'mil', 'mils', 'thousandth', 'thousandths', 'thousandthsofaninch', 'thousandthofaninch');
alias('deg', 'deg', 'degs', 'degree', 'degrees', '°');
alias('turn', 'turn', 'turns', 'rev', 'revs', 'revolution', 'revolutions');

const normaliseUnitText = (text: string): string =>
  text
    .normalize('NFKC')
    .trim()
    .toLowerCase()
    .replace(/[µμ]/g, 'u')
    .replace(/[\s·⋅•\-‐‑–—*.×_/]+/g, '');

export function isUnit(value: unknown): value is AnyUnit {
  return typeof value === 'string' && Object.prototype.hasOwnProperty.call(UNITS, value);
}

/** Parse a unit written the way shops write it ("ft-lb", "lb-ft", "Nm", "thou", "in"). */
export function parseUnit(text: string): AnyUnit {
  if (typeof text !== 'string') throw new DomainError('unknown-unit', 'A unit is required');
  if (isUnit(text)) return text;
  const key = normaliseUnitText(text);
  if (key === '') throw new DomainError('unknown-unit', 'No unit given', { text });
  const unit = ALIASES[key];
  if (!unit)
    throw new DomainError('unknown-unit', `Unknown unit "${text.trim()}". Use one of: ${ALL_UNITS.join(', ')}`, { text });
  return unit;
}

export function dimensionOf(unit: AnyUnit): Dimension {
  const def = isUnit(unit) ? UNITS[unit] : undefined;
  if (!def) throw new DomainError('unknown-unit', `Unknown unit "${String(unit)}"`, { unit });
  return def.dimension;
}

export function unitsOf(dimension: Dimension): readonly AnyUnit[] {
  return dimension === 'torque' ? TORQUE_UNITS : dimension === 'length' ? LENGTH_UNITS : ANGLE_UNITS;
}

export const isTorqueUnit = (u: unknown): u is TorqueUnit => isUnit(u) && UNITS[u].dimension === 'torque';
export const isLengthUnit = (u: unknown): u is LengthUnit => isUnit(u) && UNITS[u].dimension === 'length';
export const isAngleUnit = (u: unknown): u is AngleUnit => isUnit(u) && UNITS[u].dimension === 'angle';

/** The unit's size in its dimension's base unit (N·m, mm or degrees). */
export function unitFactor(unit: AnyUnit): number {
  dimensionOf(unit);
  return UNITS[unit].factor;
}

export function assertFinite(value: unknown, what = 'Value'): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value))
    throw new DomainError('invalid-input', `${what} must be a finite number (got ${String(value)})`, { value });
}

/** Rounds away float noise (e.g. 0.1 + 0.2) without changing any meaningful digit. */
export const clean = (n: number): number => (n === 0 ? 0 : Number(n.toPrecision(12)));

export function convert<U extends AnyUnit>(q: Quantity, to: U): Quantity<U> {
  if (!q || typeof q !== 'object') throw new DomainError('invalid-input', 'A quantity is required');
  assertFinite(q.value, 'Quantity value');
  const from = dimensionOf(q.unit);
  const target = dimensionOf(to);
  if (from !== target)
    throw new DomainError('unit-mismatch', `Cannot convert ${from} (${q.unit}) to ${target} (${to})`, { from: q.unit, to });
  if (q.unit === to) return { value: q.value, unit: to };
  return { value: (q.value * UNITS[q.unit].factor) / UNITS[to].factor, unit: to };
}

/** Decimal places a resolution implies: 0.001 → 3, 0.0005 → 4, 5 → 0, 2.5e-5 → 6. */
export function decimalsOf(resolution: number): number {
  assertResolution(resolution);
  for (let d = 0; d <= 12; d++) {
    const scaled = resolution * 10 ** d;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-9 * Math.max(1, scaled)) return d;
  }
  return 12;
}

function assertResolution(resolution: number): void {
  if (typeof resolution !== 'number' || !Number.isFinite(resolution) || resolution <= 0)
    throw new DomainError('invalid-input', `Resolution must be a number greater than zero (got ${String(resolution)})`, { resolution });
}

/**
 * Round to the nearest multiple of `resolution`, halves away from zero (so 0.0245 at 0.001
 * reads 0.025, as an instrument's display would). Float noise in the quotient is removed
 * first, so 1.005 at 0.01 gives 1.01, not 1.00.
 */
export function roundTo(value: number, resolution: number): number {
  assertFinite(value);
  assertResolution(resolution);
  const q = Number((Math.abs(value) / resolution).toPrecision(12));
  const n = Math.round(q);
  const out = Number((n * resolution).toFixed(decimalsOf(resolution)));
  return value < 0 && out !== 0 ? -out : out;
}

/** The number as text at a resolution: fixed decimals ("0.050", "2.0", "412"). */
export function formatNumber(value: number, resolution: number): string {
  const r = roundTo(value, resolution);
  return r.toFixed(decimalsOf(resolution));
}

/**
 * "412 N·m", "0.05 mm", "2.0 thou", "90°". With `resolution` the value is rounded to it and
 * shown with the decimals it implies (a reading as the instrument shows it). Without, it is
 * rounded to `DEFAULT_RESOLUTION` for the unit and trailing zeros are dropped.
 */
export function formatQuantity(q: Quantity, opts: { resolution?: number } = {}): string {
  if (!q || typeof q !== 'object') throw new DomainError('invalid-input', 'A quantity is required');
  dimensionOf(q.unit);
  assertFinite(q.value, 'Quantity value');
  let text: string;
  if (opts.resolution !== undefined) text = formatNumber(q.value, opts.resolution);
  else text = String(roundTo(q.value, DEFAULT_RESOLUTION[q.unit]));
  const symbol = UNIT_SYMBOLS[q.unit];
  return q.unit === 'deg' ? `${text}${symbol}` : `${text} ${symbol}`;
}

/** The value as given (float noise removed, no rounding to a step): for limits and specs, "0.025 mm". */
export function formatQuantityExact(q: Quantity): string {
  if (!q || typeof q !== 'object') throw new DomainError('invalid-input', 'A quantity is required');
  dimensionOf(q.unit);
  assertFinite(q.value, 'Quantity value');
  const text = String(Number(q.value.toPrecision(10)) + 0);
  return q.unit === 'deg' ? `${text}°` : `${text} ${UNIT_SYMBOLS[q.unit]}`;
}

const FRACTIONS: Record<string, number> = { '¼': 0.25, '½': 0.5, '¾': 0.75, '⅛': 0.125, '⅜': 0.375, '⅝': 0.625, '⅞': 0.875 };
const NUMBER_RE = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:e([+-]?\d+))?(?:\s*\/\s*(\d+(?:\.\d*)?))?/i;

/**
 * Parse "0.002 in", "304 ft-lb", "0.05mm", "90°", "¼ turn", "1/4 turn", "1½ turns". A number
 * with no unit, or an unknown unit, throws 'unknown-unit'; text with no number throws
 * 'invalid-input'. Decimal commas are refused rather than guessed ("0,05" could be a decimal,
 * "1,000" a thousands separator).
 */
export function parseQuantity(text: string): Quantity {
  if (typeof text !== 'string') throw new DomainError('invalid-input', 'Enter a value with its unit, e.g. "0.05 mm"');
  const shown = text.trim();
  // Vulgar fractions first: NFKC would turn "1½" into "11⁄2".
  const t = text
    .replace(/(\d*)\s*([¼½¾⅛⅜⅝⅞])/g, (_all, d: string, f: string) => String((d ? Number(d) : 0) + (FRACTIONS[f] ?? 0)))
    .normalize('NFKC')
    .replace(/[−–]/g, '-')
    .replace(/⁄/g, '/')
    .trim();
  if (/^[+-]?\d*,\d/.test(t))
    throw new DomainError('invalid-input', `Write decimals with a point, e.g. "0.05", not "${shown}"`, { text });
  const m = NUMBER_RE.exec(t);
  if (!m || m[2] === undefined) throw new DomainError('invalid-input', `No number found in "${shown}"`, { text });
  let value = Number(m[2]) * 10 ** Number(m[3] ?? 0);
  if (m[4] !== undefined) {
    const den = Number(m[4]);
    if (den === 0) throw new DomainError('invalid-input', `Division by zero in "${shown}"`, { text });
    value /= den;
  }
  if (m[1] === '-') value = -value;
  if (!Number.isFinite(value)) throw new DomainError('invalid-input', `"${shown}" is not a usable number`, { text });
  const rest = t.slice(m[0].length).trim();
  if (rest === '') throw new DomainError('unknown-unit', `No unit given in "${shown}"`, { text });
  return { value, unit: parseUnit(rest) };
}

/** Parse and require a dimension: `parseQuantityOf('304 ft-lb', 'torque')`. */
export function parseQuantityOf<D extends Dimension>(
  text: string,
  dimension: D,
): Quantity<D extends 'torque' ? TorqueUnit : D extends 'length' ? LengthUnit : AngleUnit> {
  const q = parseQuantity(text);
  const d = dimensionOf(q.unit);
  if (d !== dimension)
    throw new DomainError('unit-mismatch', `Expected a ${dimension} but "${text.trim()}" is a ${d}`, { text, expected: dimension });
  return q as Quantity<D extends 'torque' ? TorqueUnit : D extends 'length' ? LengthUnit : AngleUnit>;
}

/** Torque must be finite and greater than zero, in a torque unit. */
export function assertTorque(q: unknown, what = 'Torque'): asserts q is TorqueQuantity {
  const t = q as Partial<Quantity> | null;
  if (!t || typeof t !== 'object') throw new DomainError('invalid-input', `${what} is required`);
  if (!isTorqueUnit(t.unit)) {
    if (isUnit(t.unit)) throw new DomainError('unit-mismatch', `${what} needs a torque unit, not ${t.unit}`, { unit: t.unit });
    throw new DomainError('unknown-unit', `${what} has an unknown unit "${String(t.unit)}"`, { unit: t.unit });
  }
  assertFinite(t.value, what);
  if (t.value <= 0) throw new DomainError('invalid-input', `${what} must be greater than zero (got ${t.value} ${t.unit})`, { value: t.value });
}

/** Compare two quantities of one dimension: negative, zero or positive. */
export function compareQuantities(a: Quantity, b: Quantity): number {
  return convert(a, b.unit).value - b.value;
}
