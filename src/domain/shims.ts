/**
 * Valve-clearance shim selection (shim-under-bucket or shim-over-bucket: a thicker shim
 * closes the clearance by the same amount).
 *
 *   required shim = installed shim + measured clearance − specified (nominal) clearance
 *   resulting clearance = measured clearance + installed shim − chosen shim
 *
 * The chosen size is the stocked size whose resulting clearance is inside the spec and
 * nearest the nominal. If two sizes are equally near, the thinner one (looser valve) wins:
 * common practice, since valve clearance closes up as seats wear. When no stocked size fits,
 * `chooseShim` does not throw: it returns `fits: false`, `chosen: null`,
 * `resultingClearance: null`, and `closest` says which size comes nearest and where it lands.
 */
import { DomainError } from './errors';
import type { MeasureMethod, Spec } from './procedure/schema';
import { assertFinite, clean } from './units';
import { checkReading } from './readings';

export type ShimStock = Extract<MeasureMethod, { kind: 'valve-shim' }>['stock'];

export type ShimChoice = {
  required: number;
  chosen: number | null;
  resultingClearance: number | null;
  fits: boolean;
  /** The stocked size nearest `required` and the clearance it would give, fitting or not. */
  closest: { size: number; resultingClearance: number } | null;
};

const MAX_SIZES = 10_000;

/** All stocked sizes, ascending, without repeats. A range includes both ends when on a step. */
export function stockSizes(stock: ShimStock): number[] {
  if (!stock || typeof stock !== 'object') throw new DomainError('invalid-input', 'Shim stock is required');
  let sizes: number[];
  if (stock.kind === 'list') {
    if (!Array.isArray(stock.sizes) || stock.sizes.length === 0) throw new DomainError('invalid-input', 'The shim list is empty');
    stock.sizes.forEach((s) => {
      assertFinite(s, 'Shim size');
      if (s <= 0) throw new DomainError('invalid-input', `Shim sizes must be greater than zero (got ${s})`);
    });
    sizes = [...stock.sizes];
  } else if (stock.kind === 'range') {
    const { from, to, step } = stock;
    assertFinite(from, 'First shim size');
    assertFinite(to, 'Last shim size');
    assertFinite(step, 'Shim step');
    if (from <= 0 || step <= 0) throw new DomainError('invalid-input', 'Shim sizes and the step must be greater than zero');
    if (to < from) throw new DomainError('invalid-input', `The shim range runs backwards (${from} to ${to})`);
    const n = Math.floor((to - from) / step + 1e-9) + 1;
    if (n > MAX_SIZES) throw new DomainError('invalid-input', `The shim range has ${n} sizes; at most ${MAX_SIZES}`);
    sizes = Array.from({ length: n }, (_, i) => clean(from + i * step));
  } else {
    throw new DomainError('invalid-input', `Unknown shim stock kind "${String((stock as { kind?: unknown }).kind)}"`);
  }
  return [...new Set(sizes.map(clean))].sort((a, b) => a - b);
}

export function chooseShim(input: { measured: number; installed: number; spec: Spec; stock: ShimStock; resolution?: number }): ShimChoice {
  const { measured, installed, spec, stock } = input;
  assertFinite(measured, 'Measured clearance');
  assertFinite(installed, 'Installed shim');
  if (measured < 0) throw new DomainError('invalid-input', `A measured clearance cannot be negative (got ${measured})`);
  if (installed <= 0) throw new DomainError('invalid-input', `The installed shim must be thicker than zero (got ${installed})`);
  const resolution = input.resolution ?? 1e-6;
  const sizes = stockSizes(stock);
  const required = clean(installed + measured - spec.nominal);
  const result = (size: number) => clean(measured + installed - size);
  // Nearest to required first; on a tie (within float noise) the thinner shim, i.e. the looser valve.
  const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
  const ranked = [...sizes].sort((a, b) => (near(Math.abs(a - required), Math.abs(b - required)) ? a - b : Math.abs(a - required) - Math.abs(b - required)));
  const closestSize = ranked[0]!;
  const closest = { size: closestSize, resultingClearance: result(closestSize) };
  const fitting = ranked.find((s) => checkReading(result(s), spec, resolution).inSpec);
  if (fitting === undefined) return { required, chosen: null, resultingClearance: null, fits: false, closest };
  return { required, chosen: fitting, resultingClearance: result(fitting), fits: true, closest };
}
