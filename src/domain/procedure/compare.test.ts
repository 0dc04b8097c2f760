import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { compareRevisions, diffFields, longestIncreasingSubsequence } from './compare';
import type { StepChange } from './compare';
import { blankStep } from './new-step';
import { moveStep } from './reorder';
import { step } from './schema';
import type { Step } from './schema';

const actions = (spec: string): Step[] => [...spec].map((id) => ({ ...blankStep('action', id), title: `Step ${id}` }));
const summary = (changes: StepChange[]) => changes.map((c) => `${c.kind[0]}:${c.stepId}`).join(' ');

const headBolts = step.parse({
  id: 'hb',
  kind: 'fastener-sequence',
  title: 'Tighten head bolts',
  direction: 'tighten',
  map: {
    fasteners: [0, 1, 2, 3].map((i) => ({ id: `f${i}`, label: `${i + 1}`, x: 100 + i * 200, y: 300 })),
  },
  passes: [{ kind: 'snug' }, { kind: 'percent', percent: 50 }, { kind: 'percent', percent: 100 }],
  finalTorque: { value: 100, unit: 'N·m' },
});

describe('longestIncreasingSubsequence', () => {
  it.each([
    [[], []],
    [[0, 1, 2, 3], [0, 1, 2, 3]],
    [[3, 2, 1, 0], [3]],
    [[1, 2, 3, 0], [0, 1, 2]],
    [[3, 0, 1, 2], [1, 2, 3]],
    [[0, 3, 1, 2, 4], [0, 2, 3, 4]],
  ])('%j → indices %j', (seq, expected) => {
    expect(longestIncreasingSubsequence(seq)).toEqual(expected);
  });
  test.prop([fc.uniqueArray(fc.integer({ min: 0, max: 50 }), { maxLength: 20 })])('is increasing and no shorter than any greedy run', (seq) => {
    const idx = longestIncreasingSubsequence(seq);
    const values = idx.map((i) => seq[i] ?? 0);
    for (let k = 1; k < idx.length; k++) {
      expect((idx[k] ?? 0) > (idx[k - 1] ?? 0)).toBe(true);
      expect((values[k] ?? 0) > (values[k - 1] ?? 0)).toBe(true);
    }
    // A quadratic dynamic programme gives the true length to compare against.
    const best = seq.map(() => 1);
    seq.forEach((v, i) => {
      for (let j = 0; j < i; j++) if ((seq[j] ?? 0) < v) best[i] = Math.max(best[i] ?? 1, (best[j] ?? 1) + 1);
    });
    expect(idx.length).toBe(seq.length === 0 ? 0 : Math.max(...best));
  });
});

describe('diffFields', () => {
  it.each([
    [{ a: 1 }, { a: 1 }, []],
    [{ a: 1 }, { a: 2 }, [{ path: 'a', before: 1, after: 2 }]],
    [{ a: [1, 2] }, { a: [1, 3, 4] }, [{ path: 'a[1]', before: 2, after: 3 }, { path: 'a[2]', before: undefined, after: 4 }]],
    [{ a: { b: 'x' } }, { a: null }, [{ path: 'a', before: { b: 'x' }, after: null }]],
    [{}, { c: true }, [{ path: 'c', before: undefined, after: true }]],
  ])('%j → %j', (before, after, expected) => {
    expect(diffFields(before, after)).toEqual(expected);
  });
});

describe('compareRevisions', () => {
  it.each([
    ['abcde', 'abcde', 's:a s:b s:c s:d s:e'],
    ['abcde', 'bcdea', 's:b s:c s:d s:e m:a'],
    ['abcde', 'eabcd', 'm:e s:a s:b s:c s:d'],
    ['abcde', 'acdbe', 's:a s:c s:d m:b s:e'],
    ['abcde', 'abde', 's:a s:b r:c s:d s:e'],
    ['abcde', 'bcde', 'r:a s:b s:c s:d s:e'],
    ['abc', 'abxc', 's:a s:b a:x s:c'],
    ['abc', 'xyz', 'r:a r:b r:c a:x a:y a:z'],
    ['', 'ab', 'a:a a:b'],
  ])('%s → %s: %s', (a, b, expected) => {
    expect(summary(compareRevisions(actions(a), actions(b)))).toBe(expected);
  });

  it('gives indices for each kind and puts a removed step after its old neighbour', () => {
    expect(compareRevisions(actions('abc'), actions('cax'))).toEqual([
      { kind: 'moved', stepId: 'c', title: 'Step c', fromIndex: 2, toIndex: 0 },
      { kind: 'same', stepId: 'a', title: 'Step a', fromIndex: 0, toIndex: 1 },
      { kind: 'removed', stepId: 'b', title: 'Step b', fromIndex: 1 },
      { kind: 'added', stepId: 'x', title: 'Step x', toIndex: 2 },
    ]);
  });

  it('reports field paths inside passes and the fastener map', () => {
    if (headBolts.kind !== 'fastener-sequence') throw new Error('kind');
    const edited = structuredClone(headBolts);
    edited.passes[1] = { kind: 'percent', percent: 40 };
    const f3 = edited.map.fasteners[3];
    if (f3) f3.x = 720;
    edited.title = 'Tighten head bolts in three passes';
    const [change] = compareRevisions([headBolts], [edited]);
    expect(change?.kind).toBe('changed');
    expect(change?.title).toBe('Tighten head bolts in three passes');
    expect(change?.fields).toEqual([
      { path: 'title', before: 'Tighten head bolts', after: 'Tighten head bolts in three passes' },
      { path: 'map.fasteners[3].x', before: 700, after: 720 },
      { path: 'passes[1].percent', before: 50, after: 40 },
    ]);
  });

  it('keeps field changes on a step that also moved', () => {
    const a = actions('abc');
    const b = moveStep(a, 0, 2).map((s) => (s.id === 'a' ? { ...s, body: 'new text' } : s));
    const moved = compareRevisions(a, b).find((c) => c.stepId === 'a');
    expect(moved).toMatchObject({ kind: 'moved', fromIndex: 0, toIndex: 2, fields: [{ path: 'body', before: '', after: 'new text' }] });
  });

  it('reports a changed kind as a change of kind and of the kind-specific fields', () => {
    const change = compareRevisions([blankStep('action', 'x')], [blankStep('inspect', 'x')])[0];
    expect(change?.kind).toBe('changed');
    expect(change?.fields?.map((f) => f.path)).toEqual(expect.arrayContaining(['kind', 'tools', 'photoRequired', 'lookFor']));
  });

  const idLists = fc.uniqueArray(fc.constantFrom(...'abcdefghij'), { maxLength: 10 }).map((l) => l.join(''));

  test.prop([idLists, idLists])('names every step of either revision exactly once, with the right kind of presence', (a, b) => {
    const changes = compareRevisions(actions(a), actions(b));
    expect(changes.map((c) => c.stepId).sort()).toEqual([...new Set([...a, ...b])].sort());
    for (const c of changes) {
      if (c.kind === 'added') expect(a.includes(c.stepId) || !b.includes(c.stepId)).toBe(false);
      else if (c.kind === 'removed') expect(!a.includes(c.stepId) || b.includes(c.stepId)).toBe(false);
      else expect([a.indexOf(c.stepId), b.indexOf(c.stepId)]).toEqual([c.fromIndex, c.toIndex]);
    }
    // Present steps come out in b's order.
    expect(changes.filter((c) => c.kind !== 'removed').map((c) => c.stepId).join('')).toBe(b);
  });

  test.prop([idLists.filter((s) => s.length > 0), fc.nat(), fc.nat()])('a single drag marks at most one step as moved', (spec, f, t) => {
    const a = actions(spec);
    const from = f % a.length;
    const to = t % a.length;
    const moved = compareRevisions(a, moveStep(a, from, to)).filter((c) => c.kind === 'moved');
    expect(moved.length).toBe(from === to ? 0 : 1);
  });
});
