import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { blankStep } from './new-step';
import { duplicateStep, insertStep, moveStep, moveStepToSection, removeStep, sections } from './reorder';
import { STEP_KINDS } from './schema';
import type { Step } from './schema';

/** One action step per letter of `spec`, under the section letter at the same place (space = none). */
function list(spec: string, sectionsOf = ''): Step[] {
  return [...spec].map((id, i) => ({ ...blankStep('action', id), section: (sectionsOf[i] ?? '').trim() }));
}
const ids = (steps: readonly Step[]) => steps.map((s) => s.id).join('');

const stepsArb = fc
  .uniqueArray(fc.string({ minLength: 1, maxLength: 6 }), { minLength: 1, maxLength: 12 })
  .chain((idList) =>
    fc.tuple(
      fc.constant(idList),
      fc.array(fc.constantFrom(...STEP_KINDS), { minLength: idList.length, maxLength: idList.length }),
      fc.array(fc.constantFrom('', 'Head', 'Block', 'Crank'), { minLength: idList.length, maxLength: idList.length }),
    ),
  )
  .map(([idList, kinds, secs]) => idList.map((id, i) => ({ ...blankStep(kinds[i] ?? 'action', id), section: secs[i] ?? '' })));

const sortedIds = (steps: readonly Step[]) => steps.map((s) => s.id).sort();

describe('moveStep', () => {
  it.each([
    ['abcde', 0, 4, 'bcdea'],
    ['abcde', 4, 0, 'eabcd'],
    ['abcde', 1, 3, 'acdbe'],
    ['abcde', 3, 1, 'adbce'],
    ['abcde', 2, 2, 'abcde'],
  ])('%s: %i → %i gives %s', (spec, from, to, expected) => {
    const steps = list(spec);
    expect(ids(moveStep(steps, from, to))).toBe(expected);
    expect(ids(steps)).toBe(spec);
  });
  it.each([
    [-1, 0],
    [0, 5],
    [1.5, 0],
    [5, 0],
  ])('refuses index %d → %d', (from, to) => {
    expect(() => moveStep(list('abcde'), from, to)).toThrow(/outside/);
  });
  test.prop([stepsArb, fc.nat(), fc.nat()])('keeps every step exactly once, moved one lands at toIndex', (steps, f, t) => {
    const from = f % steps.length;
    const to = t % steps.length;
    const before = structuredClone(steps);
    const next = moveStep(steps, from, to);
    expect(sortedIds(next)).toEqual(sortedIds(steps));
    expect(next[to]).toBe(steps[from]);
    expect(steps).toEqual(before);
    // Moving back restores the original order.
    expect(moveStep(next, to, from)).toEqual(steps);
  });
});

describe('moveStepToSection', () => {
  it.each([
    // spec, sections, step, target, expected order, expected section string
    ['abcd', 'HHBB', 'a', 'B', 'bcda', 'HBBB'],
    ['abcd', 'HHBB', 'd', 'H', 'abdc', 'HHHB'],
    ['abcd', 'HHBB', 'b', 'N', 'abcd', 'HNBB'],
    ['abcd', 'HHBB', 'c', ' H ', 'abcd', 'HHHB'],
  ])('%s (%s): %s → %j', (spec, secs, id, target, order, expectedSecs) => {
    const next = moveStepToSection(list(spec, secs), id, target);
    expect(ids(next)).toBe(order);
    expect(next.map((s) => s.section).join('')).toBe(expectedSecs);
  });
  it('refuses an unknown step', () => {
    expect(() => moveStepToSection(list('ab'), 'z', 'H')).toThrow(/No step/);
  });
  test.prop([stepsArb, fc.nat(), fc.constantFrom('', 'Head', 'Block', 'New')])('keeps every step once and keeps the target section together at its end', (steps, n, target) => {
    const step = steps[n % steps.length];
    if (!step) return;
    const next = moveStepToSection(steps, step.id, target);
    expect(sortedIds(next)).toEqual(sortedIds(steps));
    expect(next.find((s) => s.id === step.id)?.section).toBe(target);
    const others = next.filter((s) => s.id !== step.id);
    const at = next.findIndex((s) => s.id === step.id);
    const lastOther = others.map((s) => s.section).lastIndexOf(target);
    if (lastOther >= 0) expect(next[at - 1]?.section).toBe(target);
  });
});

describe('duplicateStep', () => {
  it('inserts a deep copy right after the original under the new id', () => {
    const steps = [blankStep('fastener-sequence', 'a'), blankStep('action', 'b')];
    const next = duplicateStep(steps, 'a', 'a2');
    expect(ids(next)).toBe('aa2b');
    const [orig, copy] = next;
    expect(copy).toEqual({ ...orig, id: 'a2' });
    if (copy?.kind !== 'fastener-sequence' || orig?.kind !== 'fastener-sequence') throw new Error('kind');
    expect(copy.map).not.toBe(orig.map);
  });
  it.each([
    ['b', 'x', /No step/],
    ['a', 'a', /already used/],
  ])('duplicate %s as %s is refused', (id, newId, message) => {
    expect(() => duplicateStep(list('a'), id, newId)).toThrow(message);
  });
  test.prop([stepsArb, fc.nat()])('adds exactly one step', (steps, n) => {
    const step = steps[n % steps.length];
    if (!step) return;
    const newId = 'fresh-id'; // longer than any generated id, so never taken
    const next = duplicateStep(steps, step.id, newId);
    expect(sortedIds(next)).toEqual([...steps.map((s) => s.id), newId].sort());
  });
});

describe('removeStep and insertStep', () => {
  it.each([
    ['abc', 'a', 'bc'],
    ['abc', 'b', 'ac'],
    ['abc', 'c', 'ab'],
  ])('remove from %s: %s gives %s', (spec, id, expected) => {
    expect(ids(removeStep(list(spec), id))).toBe(expected);
  });
  it.each([
    [0, 'xab'],
    [1, 'axb'],
    [2, 'abx'],
  ])('insert at %i gives %s', (index, expected) => {
    expect(ids(insertStep(list('ab'), index, blankStep('caution', 'x')))).toBe(expected);
  });
  it('refuses an out-of-range index and a used id', () => {
    expect(() => insertStep(list('ab'), 3, blankStep('action', 'x'))).toThrow(/outside/);
    expect(() => insertStep(list('ab'), 0, blankStep('action', 'b'))).toThrow(/already used/);
    expect(() => removeStep(list('ab'), 'x')).toThrow(/No step/);
  });
  test.prop([stepsArb, fc.nat()])('insert then remove is the identity', (steps, n) => {
    const at = n % (steps.length + 1);
    const extra = blankStep('inspect', 'fresh-id');
    const next = insertStep(steps, at, extra);
    expect(next[at]).toBe(extra);
    expect(removeStep(next, extra.id)).toEqual(steps);
  });
});

describe('sections', () => {
  it.each([
    ['abcd', 'HHBB', [['H', 'ab'], ['B', 'cd']]],
    ['abcd', ' HBH', [['', 'a'], ['H', 'bd'], ['B', 'c']]],
    ['', '', []],
  ])('%s under %j', (spec, secs, expected) => {
    const got = sections(list(spec, secs)).map((s) => [s.name, s.stepIds.join('')]);
    expect(got).toEqual(expected);
  });
  test.prop([stepsArb])('lists every step id once, in list order within each section', (steps) => {
    const got = sections(steps);
    expect(got.flatMap((s) => s.stepIds).sort()).toEqual(sortedIds(steps));
    expect(new Set(got.map((s) => s.name)).size).toBe(got.length);
    for (const s of got) expect(s.stepIds).toEqual(steps.filter((x) => x.section === s.name).map((x) => x.id));
  });
});
