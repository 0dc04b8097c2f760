/**
 * Preset fastener maps for the editor, in layout units (0–1000 on both axes, y grows
 * downward). Labels are "1".."N" by position (rows top to bottom, each left to right; circles
 * clockwise from 12 o'clock) and ids "f1".."fN" in the same order.
 */
import { DomainError } from './errors';
import type { Fastener } from './procedure/schema';

const MAX_FASTENERS = 200; // schema: fastenerMap.fasteners max

const round3 = (n: number) => Math.round(n * 1000) / 1000 + 0; // + 0 turns -0 into 0

function count(n: number, what: string, min = 1): number {
  if (!Number.isInteger(n) || n < min) throw new DomainError('invalid-input', `${what} must be a whole number of at least ${min} (got ${String(n)})`);
  return n;
}

function total(n: number): void {
  if (n > MAX_FASTENERS) throw new DomainError('invalid-input', `A map holds at most ${MAX_FASTENERS} fasteners (asked for ${n})`);
}

/** Evenly spaced positions from `from` to `to`; one position sits in the middle. */
const spread = (n: number, from: number, to: number) =>
  n === 1 ? [(from + to) / 2] : Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));

const make = (points: Array<{ x: number; y: number }>): Fastener[] =>
  points.map((p, i) => ({ id: `f${i + 1}`, label: String(i + 1), x: round3(p.x), y: round3(p.y) }));

/** `rows` parallel rows of `perRow` fasteners: a cylinder head (2 × 5), a single row (rows = 1). */
export function rowsLayout(perRow: number, rows = 2): Fastener[] {
  count(perRow, 'Fasteners per row');
  count(rows, 'Rows');
  total(perRow * rows);
  const height = Math.min(800, 300 * (rows - 1));
  const ys = spread(rows, 500 - height / 2, 500 + height / 2);
  const xs = spread(perRow, 100, 900);
  return make(ys.flatMap((y) => xs.map((x) => ({ x, y }))));
}

/** `n` fasteners on a circle (a flange), fastener 1 at 12 o'clock, numbered clockwise. */
export function circleLayout(n: number): Fastener[] {
  count(n, 'Fasteners on the circle');
  total(n);
  const r = 400;
  return make(
    Array.from({ length: n }, (_, i) => {
      const a = (2 * Math.PI * i) / n;
      return { x: 500 + r * Math.sin(a), y: 500 - r * Math.cos(a) };
    }),
  );
}

/** A `cols` × `rows` grid filling the layout (covers, girdles with several rows). */
export function gridLayout(cols: number, rows: number): Fastener[] {
  count(cols, 'Columns');
  count(rows, 'Rows');
  total(cols * rows);
  const ys = spread(rows, 100, 900);
  const xs = spread(cols, 100, 900);
  return make(ys.flatMap((y) => xs.map((x) => ({ x, y }))));
}

/**
 * The perimeter of a rectangle (oil pan, rocker cover): `long` fasteners along each long side
 * and `short` on each short side between the corners, numbered clockwise from the top-left.
 */
export function perimeterLayout(long: number, short: number): Fastener[] {
  count(long, 'Fasteners along the long side', 2);
  count(short, 'Fasteners along the short side', 0);
  total(2 * long + 2 * short);
  const xs = spread(long, 100, 900);
  const inner = spread(short + 2, 250, 750).slice(1, -1);
  const pts = [
    ...xs.map((x) => ({ x, y: 250 })),
    ...inner.map((y) => ({ x: 900, y })),
    ...[...xs].reverse().map((x) => ({ x, y: 750 })),
    ...[...inner].reverse().map((y) => ({ x: 100, y })),
  ];
  return make(pts);
}
