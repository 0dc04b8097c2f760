/**
 * Tightening and loosening orders for a fastener map.
 *
 * Centre-out (elongated joints: cylinder heads, manifolds, covers, oil pans, girdles). The
 * long axis of the joint is found from the points themselves (principal axis of their
 * spread), with u along it and v across it, both measured from the centroid:
 *  1. the first fastener is the one nearest the centroid;
 *  2. the rest are taken in "rings" of equal distance |u| from the centre line across the
 *     joint, innermost first, so the work moves outward;
 *  3. within a ring, those nearest the long centre line (smallest |v|) first, so a middle row
 *     goes before the outer rows; among those, each next fastener is the one most opposite the last: on the other side
 *     of the centre line (sign of u) first, then in the other row (sign of v); remaining ties
 *     go to the nearest to the centroid, then top-most, left-most, smallest id.
 * For two rows that gives the familiar spiral: centre pair, then each ring corner to the
 * diagonally opposite corner and round. Loosening is the exact reverse: the outside
 * fasteners come loose first and the clamp load is relieved evenly towards the centre.
 *
 * Cross (circular flanges): ASME PCC-1 "legacy" cross pattern. Bolts are numbered clockwise
 * from 12 o'clock; for a multiple of 4 bolts the order runs in groups of four 90° apart
 * (k, k + n/2, k + n/4, k + 3n/4) with the group starts spread over the first quarter, which
 * reproduces PCC-1's tables (8: 1-5-3-7-2-6-4-8; 12: 1-7-4-10-2-8-5-11-3-9-6-12;
 * 16: 1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16; 24: 1-13-7-19-4-16-10-22-…). Other counts use
 * a star: the bolt opposite the last one, else the bolt farthest from every bolt done so far.
 *
 * Every function here is deterministic and independent of the order fasteners are listed in.
 */
import { DomainError } from './errors';
import type { Fastener, OrderMethod } from './procedure/schema';

export type { Fastener, OrderMethod };

/** Checks a fastener map: not empty, ids and labels unique, coordinates finite. */
export function validateFasteners(fasteners: readonly Fastener[]): void {
  if (!Array.isArray(fasteners) || fasteners.length === 0)
    throw new DomainError('invalid-input', 'The fastener map is empty: place at least one fastener');
  const ids = new Set<string>();
  const labels = new Map<string, string>();
  for (const f of fasteners) {
    if (!f || typeof f.id !== 'string' || f.id === '') throw new DomainError('invalid-input', 'Every fastener needs an id');
    if (ids.has(f.id)) throw new DomainError('invalid-input', `Fastener id "${f.id}" is used twice`, { id: f.id });
    ids.add(f.id);
    const label = typeof f.label === 'string' ? f.label.trim() : '';
    if (label === '') throw new DomainError('invalid-input', `Fastener "${f.id}" needs a label`, { id: f.id });
    const key = label.toLowerCase();
    if (labels.has(key))
      throw new DomainError('invalid-input', `Label "${label}" is used by two fasteners (${labels.get(key)} and ${f.id})`, { label });
    labels.set(key, f.id);
    if (!Number.isFinite(f.x) || !Number.isFinite(f.y))
      throw new DomainError('invalid-input', `Fastener "${label}" has no usable position`, { id: f.id });
  }
}

type Pt = { f: Fastener; u: number; v: number; d: number };

const byId = (a: Fastener, b: Fastener) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

function centroid(fs: readonly Fastener[]): { x: number; y: number } {
  let x = 0;
  let y = 0;
  for (const f of fs) {
    x += f.x;
    y += f.y;
  }
  return { x: x / fs.length, y: y / fs.length };
}

/** Median distance from each fastener to its nearest neighbour; the scale for "same ring". */
function typicalSpacing(fs: readonly Fastener[]): number {
  if (fs.length < 2) return 1;
  const nn = fs.map((a) => {
    let best = Infinity;
    for (const b of fs) if (a !== b) best = Math.min(best, Math.hypot(a.x - b.x, a.y - b.y));
    return best;
  });
  nn.sort((a, b) => a - b);
  const mid = nn[Math.floor(nn.length / 2)] ?? 1;
  return mid > 0 ? mid : 1;
}

/** Project onto the joint's long axis (u) and across it (v). */
function project(fs: readonly Fastener[]): Pt[] {
  const c = centroid(fs);
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (const f of fs) {
    const dx = f.x - c.x;
    const dy = f.y - c.y;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  const scale = sxx + syy;
  // Nearly round spread (or points on a grid): keep the drawing's own axes.
  let theta = 0;
  if (scale > 0 && Math.hypot(sxx - syy, 2 * sxy) > 1e-6 * scale) theta = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  // Snap to the drawing's axes when within a hair of them, so grids stay grids.
  const quarter = Math.PI / 2;
  const snapped = Math.round(theta / quarter) * quarter;
  if (Math.abs(theta - snapped) < 1e-9) theta = snapped;
  const cos = Math.cos(theta);
  const sin = Math.sin(theta);
  return fs.map((f) => {
    const dx = f.x - c.x;
    const dy = f.y - c.y;
    return { f, u: dx * cos + dy * sin, v: -dx * sin + dy * cos, d: Math.hypot(dx, dy) };
  });
}

const tieBreak = (a: Pt, b: Pt, tol: number): number => {
  if (Math.abs(a.d - b.d) > tol) return a.d - b.d;
  if (Math.abs(a.f.y - b.f.y) > tol) return a.f.y - b.f.y;
  if (Math.abs(a.f.x - b.f.x) > tol) return a.f.x - b.f.x;
  return byId(a.f, b.f);
};

/** Tightening order, centre outward (ids). See the file comment for the rules. */
export function centreOutOrder(fasteners: readonly Fastener[]): string[] {
  validateFasteners(fasteners);
  const fs = [...fasteners].sort(byId);
  const pts = project(fs);
  const tol = 0.2 * typicalSpacing(fs);
  const side = (p: Pt) => (Math.abs(p.u) <= tol ? 0 : Math.sign(p.u));
  const row = (p: Pt) => (Math.abs(p.v) <= tol ? 0 : Math.sign(p.v));

  const first = [...pts].sort((a, b) => tieBreak(a, b, 1e-9))[0]!;
  const order: Pt[] = [first];
  let rest = pts.filter((p) => p !== first);
  while (rest.length > 0) {
    const inner = Math.min(...rest.map((p) => Math.abs(p.u)));
    const band = rest.filter((p) => Math.abs(p.u) <= inner + tol);
    // Within a ring, the ones nearest the long centre line go first (a middle row before
    // the outer rows of a three-row girdle).
    const across = Math.min(...band.map((p) => Math.abs(p.v)));
    const ring = band.filter((p) => Math.abs(p.v) <= across + tol);
    const last = order[order.length - 1]!;
    const score = (p: Pt) => (side(p) * side(last) < 0 ? 2 : 0) + (row(p) * row(last) < 0 ? 1 : 0);
    ring.sort((a, b) => score(b) - score(a) || tieBreak(a, b, 1e-9));
    const next = ring[0]!;
    order.push(next);
    rest = rest.filter((p) => p !== next);
  }
  return order.map((p) => p.f.id);
}

/** Loosening order: the exact reverse of the centre-out tightening order. */
export function looseningOrder(fasteners: readonly Fastener[]): string[] {
  return centreOutOrder(fasteners).reverse();
}

/** Circular distance between positions i and j on a ring of n. */
const ringDistance = (i: number, j: number, n: number) => {
  const d = Math.abs(i - j) % n;
  return Math.min(d, n - d);
};

/**
 * Spread 0..n-1 around a ring: start at 0, then each next is the one whose nearest done
 * position is farthest; ties to the one farthest from the last, then the lowest.
 */
export function spreadOrder(n: number, startOpposite = false): number[] {
  const done: number[] = [0];
  const left = new Set<number>(Array.from({ length: n - 1 }, (_, i) => i + 1));
  while (left.size > 0) {
    const last = done[done.length - 1]!;
    let best = -1;
    let bestKey: [number, number] = [-1, -1];
    const opposite = n % 2 === 0 ? (last + n / 2) % n : -1;
    if (startOpposite && left.has(opposite)) best = opposite;
    else
      for (const c of left) {
        const minDone = Math.min(...done.map((d) => ringDistance(c, d, n)));
        const fromLast = ringDistance(c, last, n);
        if (minDone > bestKey[0] || (minDone === bestKey[0] && fromLast > bestKey[1])) {
          best = c;
          bestKey = [minDone, fromLast];
        }
      }
    done.push(best);
    left.delete(best);
  }
  return done;
}

/** PCC-1-style positions (0-based) of the order for n bolts numbered clockwise from 12 o'clock. */
export function crossSequence(n: number): number[] {
  if (!Number.isInteger(n) || n < 1) throw new DomainError('invalid-input', `A bolt circle needs a whole number of bolts (got ${n})`);
  if (n < 4 || n % 4 !== 0) return spreadOrder(n, true);
  const q = n / 4;
  const out: number[] = [];
  for (const k of spreadOrder(q)) out.push(k, k + 2 * q, k + q, k + 3 * q);
  return out;
}

/**
 * Cross (star) order for a circular flange (ids). Fasteners are placed around their centroid
 * by angle, clockwise from 12 o'clock (y grows downward); bolt 1 is the one nearest 12
 * o'clock.
 */
export function crossOrder(fasteners: readonly Fastener[]): string[] {
  validateFasteners(fasteners);
  const fs = [...fasteners].sort(byId);
  const c = centroid(fs);
  const angle = (f: Fastener) => {
    const dx = f.x - c.x;
    const dy = f.y - c.y;
    if (Math.hypot(dx, dy) < 1e-9) return -1; // at the centre: first
    const a = Math.atan2(dx, -dy); // 0 at 12 o'clock, clockwise on screen
    const deg = ((a * 180) / Math.PI + 360) % 360;
    return deg > 360 - 1e-7 ? 0 : deg;
  };
  const around = fs
    .map((f) => ({ f, a: angle(f) }))
    .sort((p, q) => (Math.abs(p.a - q.a) > 1e-7 ? p.a - q.a : byId(p.f, q.f)));
  return crossSequence(around.length).map((i) => around[i]!.f.id);
}

/**
 * Checks a manual order (fastener ids): every fastener exactly once. Throws 'invalid-order'
 * naming the missing, repeated and unknown entries (by label where known). Returns the order.
 */
export function validateManualOrder(fasteners: readonly Fastener[], order: readonly string[]): string[] {
  validateFasteners(fasteners);
  if (!Array.isArray(order)) throw new DomainError('invalid-order', 'The order must be a list of fasteners');
  const labelOf = new Map(fasteners.map((f) => [f.id, f.label.trim()]));
  const seen = new Set<string>();
  const duplicate: string[] = [];
  const unknown: string[] = [];
  for (const id of order) {
    if (!labelOf.has(id)) unknown.push(String(id));
    else if (seen.has(id)) duplicate.push(id);
    seen.add(id);
  }
  const missing = fasteners.filter((f) => !seen.has(f.id)).map((f) => f.id);
  if (missing.length || duplicate.length || unknown.length) {
    const names = (ids: string[]) => [...new Set(ids)].map((id) => `"${labelOf.get(id) ?? id}"`).join(', ');
    const parts: string[] = [];
    if (missing.length) parts.push(`missing ${names(missing)}`);
    if (duplicate.length) parts.push(`listed more than once ${names(duplicate)}`);
    if (unknown.length) parts.push(`not on the map ${names(unknown)}`);
    throw new DomainError('invalid-order', `Every fastener must be in the order exactly once: ${parts.join('; ')}`, {
      missing: missing.map((id) => labelOf.get(id) ?? id),
      duplicate: [...new Set(duplicate)].map((id) => labelOf.get(id) ?? id),
      unknown,
    });
  }
  return [...order];
}

/** The order for a method: 'manual' validates and returns `manual`. */
export function generateOrder(fasteners: readonly Fastener[], method: OrderMethod, manual?: readonly string[]): string[] {
  switch (method) {
    case 'centre-out':
      return centreOutOrder(fasteners);
    case 'reverse-centre-out':
      return looseningOrder(fasteners);
    case 'cross':
      return crossOrder(fasteners);
    case 'manual':
      return validateManualOrder(fasteners, manual ?? []);
    default:
      throw new DomainError('invalid-input', `Unknown order method "${String(method)}"`);
  }
}
