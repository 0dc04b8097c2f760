/**
 * What changed between two revisions of a procedure, step by step, for the lead's diff view
 * and the reviewer's "what changed since the last release". Steps are matched by id.
 */
import type { Step } from './schema';

export interface FieldChange {
  /** e.g. `passes[1].percent`, `map.fasteners[3].x`. */
  path: string;
  before: unknown;
  after: unknown;
}

/**
 * One step's fate. `moved` means its order relative to the other kept steps changed; a moved
 * step that was also edited carries its `fields` too, so the diff view can show both.
 */
export interface StepChange {
  kind: 'added' | 'removed' | 'moved' | 'changed' | 'same';
  stepId: string;
  title: string;
  fromIndex?: number;
  toIndex?: number;
  fields?: FieldChange[];
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

function joinKey(path: string, key: string): string {
  return path === '' ? key : `${path}.${key}`;
}

/** Every leaf that differs between two JSON-like values, with a dotted/bracketed path. */
export function diffFields(before: unknown, after: unknown, path = ''): FieldChange[] {
  if (Object.is(before, after)) return [];
  if (Array.isArray(before) && Array.isArray(after)) {
    const out: FieldChange[] = [];
    const n = Math.max(before.length, after.length);
    for (let i = 0; i < n; i++) out.push(...diffFields(before[i], after[i], `${path}[${i}]`));
    return out;
  }
  if (isRecord(before) && isRecord(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
    return keys.flatMap((k) => diffFields(before[k], after[k], joinKey(path, k)));
  }
  return [{ path, before, after }];
}

/**
 * Indices (into `seq`) of one longest strictly increasing subsequence, by patience sorting.
 * Ties go to the earliest-ending run, so the result is deterministic.
 */
export function longestIncreasingSubsequence(seq: readonly number[]): number[] {
  const tails: number[] = []; // tails[k] = index in seq of the smallest tail of a run of length k+1
  const prev: number[] = new Array<number>(seq.length).fill(-1);
  seq.forEach((value, i) => {
    let lo = 0;
    let hi = tails.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      const t = tails[mid] ?? 0;
      if ((seq[t] ?? 0) < value) lo = mid + 1;
      else hi = mid;
    }
    if (lo > 0) prev[i] = tails[lo - 1] ?? -1;
    tails[lo] = i;
  });
  const out: number[] = [];
  for (let i = tails[tails.length - 1] ?? -1; i >= 0; i = prev[i] ?? -1) out.push(i);
  return out.reverse();
}

function stepFields(a: Step, b: Step): FieldChange[] {
  // The id is what matched them; comparing it would only ever report nothing.
  const { id: _a, ...restA } = a;
  const { id: _b, ...restB } = b;
  return diffFields(restA, restB);
}

/**
 * Step-by-step changes from revision `a` to revision `b`, in `b`'s order with each removed
 * step placed after the step that preceded it in `a`. A single drag marks only that step as
 * moved, because the kept steps' longest common order is taken as unmoved.
 */
export function compareRevisions(a: readonly Step[], b: readonly Step[]): StepChange[] {
  const indexInA = new Map(a.map((s, i) => [s.id, i]));
  const indexInB = new Map(b.map((s, i) => [s.id, i]));
  const kept = b.filter((s) => indexInA.has(s.id));
  const keptOrder = kept.map((s) => indexInA.get(s.id) ?? 0);
  const unmoved = new Set(longestIncreasingSubsequence(keptOrder).map((k) => kept[k]?.id));

  const removedAfter = new Map<string | null, Step[]>(); // key: id of the kept step before it in a
  let lastKept: string | null = null;
  for (const s of a) {
    if (indexInB.has(s.id)) {
      lastKept = s.id;
      continue;
    }
    const bucket = removedAfter.get(lastKept) ?? [];
    bucket.push(s);
    removedAfter.set(lastKept, bucket);
  }
  const removed = (key: string | null): StepChange[] =>
    (removedAfter.get(key) ?? []).map((s) => ({ kind: 'removed', stepId: s.id, title: s.title, fromIndex: indexInA.get(s.id) ?? 0 }));

  const out: StepChange[] = removed(null);
  b.forEach((s, toIndex) => {
    const fromIndex = indexInA.get(s.id);
    const old = fromIndex === undefined ? undefined : a[fromIndex];
    if (fromIndex === undefined || !old) {
      out.push({ kind: 'added', stepId: s.id, title: s.title, toIndex });
      return;
    }
    const fields = stepFields(old, s);
    const moved = !unmoved.has(s.id);
    const kind = moved ? 'moved' : fields.length > 0 ? 'changed' : 'same';
    out.push({ kind, stepId: s.id, title: s.title, fromIndex, toIndex, ...(fields.length > 0 ? { fields } : {}) });
    out.push(...removed(s.id));
  });
  return out;
}
