/**
 * Immutable edits to a revision's step list, as the editor's drag-and-drop and menus apply them
 * (optimistically in the browser, again on the server). No function mutates its input, and
 * none ever loses or duplicates a step.
 */
import { DomainError } from '../errors';
import type { Step } from './schema';

/** A section heading and the ids of its steps, in list order. */
export interface Section {
  name: string;
  stepIds: string[];
}

function indexOf(steps: readonly Step[], stepId: string): number {
  const i = steps.findIndex((s) => s.id === stepId);
  if (i < 0) throw new DomainError('invalid-input', `No step with id "${stepId}"`, { stepId });
  return i;
}

function checkIndex(i: number, max: number, what: string): void {
  if (!Number.isInteger(i) || i < 0 || i > max)
    throw new DomainError('invalid-input', `${what} ${i} is outside 0–${max}`, { index: i, max });
}

/** Moves the step at `fromIndex` so that it ends up at `toIndex` (dnd-kit's arrayMove semantics). */
export function moveStep(steps: readonly Step[], fromIndex: number, toIndex: number): Step[] {
  checkIndex(fromIndex, steps.length - 1, 'From index');
  checkIndex(toIndex, steps.length - 1, 'To index');
  const next = steps.slice();
  const [moved] = next.splice(fromIndex, 1);
  if (moved) next.splice(toIndex, 0, moved);
  return next;
}

/**
 * Puts a step under another section heading. When that section already has steps, the step
 * goes after its last one so the section stays together; a new section starts where the step is.
 */
export function moveStepToSection(steps: readonly Step[], stepId: string, section: string): Step[] {
  const from = indexOf(steps, stepId);
  const name = section.trim();
  const current = steps[from];
  if (!current) return steps.slice();
  const updated: Step = { ...current, section: name };
  const rest = steps.filter((_, i) => i !== from);
  let lastInSection = -1;
  rest.forEach((s, i) => {
    if (s.section === name) lastInSection = i;
  });
  if (lastInSection < 0) {
    const next = steps.slice();
    next[from] = updated;
    return next;
  }
  rest.splice(lastInSection + 1, 0, updated);
  return rest;
}

/** Inserts a deep copy of a step right after it, under a new id. */
export function duplicateStep(steps: readonly Step[], stepId: string, newId: string): Step[] {
  const i = indexOf(steps, stepId);
  const original = steps[i];
  if (!original) return steps.slice();
  return insertStep(steps, i + 1, { ...structuredClone(original), id: newId });
}

/** Removes the step with the given id. */
export function removeStep(steps: readonly Step[], stepId: string): Step[] {
  const i = indexOf(steps, stepId);
  return steps.filter((_, j) => j !== i);
}

/** Inserts a step at `index` (0 = first, `steps.length` = last); its id must be new. */
export function insertStep(steps: readonly Step[], index: number, step: Step): Step[] {
  checkIndex(index, steps.length, 'Index');
  if (step.id.length === 0) throw new DomainError('invalid-input', 'A step needs an id');
  if (steps.some((s) => s.id === step.id))
    throw new DomainError('invalid-input', `Step id "${step.id}" is already used`, { stepId: step.id });
  const next = steps.slice();
  next.splice(index, 0, step);
  return next;
}

/** Distinct section names in order of first appearance, each with its step ids in list order. */
export function sections(steps: readonly Step[]): Section[] {
  const byName = new Map<string, Section>();
  for (const s of steps) {
    let entry = byName.get(s.section);
    if (!entry) {
      entry = { name: s.section, stepIds: [] };
      byName.set(s.section, entry);
    }
    entry.stepIds.push(s.id);
  }
  return [...byName.values()];
}
