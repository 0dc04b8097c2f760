import { describe, expect, it } from 'vitest';
import { blankStep } from '../../domain/procedure/new-step';
import type { Step } from '../../domain/procedure/schema';
import { editorReducer, initialEditorState, newStepId, nudgeAction } from './editor-state';

const steps = (): Step[] => [
  { ...blankStep('action', 'a'), title: 'A', section: 'Head' },
  { ...blankStep('inspect', 'b'), title: 'B', section: 'Head' },
  { ...blankStep('torque', 'c'), title: 'C', section: 'Block' },
];
const ids = (s: { steps: Step[] }) => s.steps.map((x) => x.id);

describe('editor state', () => {
  it('moves a step and undoes the move', () => {
    const s0 = initialEditorState(steps());
    const s1 = editorReducer(s0, { type: 'move', from: 0, to: 2 });
    expect(ids(s1)).toEqual(['b', 'c', 'a']);
    expect(s1.selectedId).toBe('a');
    const s2 = editorReducer(s1, { type: 'undo' });
    expect(ids(s2)).toEqual(['a', 'b', 'c']);
    expect(s2.past).toHaveLength(0);
    expect(s2.epoch).toBe(s1.epoch + 1);
  });

  it('a drop onto a step of another section takes that section and tells the form', () => {
    const s1 = editorReducer(initialEditorState(steps()), { type: 'move', from: 0, to: 2, section: 'Block' });
    expect(s1.steps[2]).toMatchObject({ id: 'a', section: 'Block' });
    expect(s1.epoch).toBe(1);
  });

  it('coalesces consecutive edits of one step into one undo entry', () => {
    let s = initialEditorState(steps());
    s = editorReducer(s, { type: 'update', step: { ...s.steps[0]!, title: 'A1' } });
    s = editorReducer(s, { type: 'update', step: { ...s.steps[0]!, title: 'A12' } });
    expect(s.past).toHaveLength(1);
    s = editorReducer(s, { type: 'undo' });
    expect(s.steps[0]!.title).toBe('A');
  });

  it('a new section typed in the form keeps sections together', () => {
    let s = initialEditorState(steps());
    s = editorReducer(s, { type: 'update', step: { ...s.steps[0]!, section: 'Block' } });
    expect(ids(s)).toEqual(['b', 'c', 'a']);
  });

  it('duplicates, removes and inserts through the domain functions', () => {
    let s = initialEditorState(steps());
    s = editorReducer(s, { type: 'duplicate', id: 'b', newId: 'b2' });
    expect(ids(s)).toEqual(['a', 'b', 'b2', 'c']);
    expect(s.selectedId).toBe('b2');
    s = editorReducer(s, { type: 'remove', id: 'b2' });
    expect(ids(s)).toEqual(['a', 'b', 'c']);
    expect(s.selectedId).toBe('c');
    s = editorReducer(s, { type: 'insert', index: 0, step: blankStep('caution', 'z') });
    expect(ids(s)).toEqual(['z', 'a', 'b', 'c']);
    expect(() => editorReducer(s, { type: 'insert', index: 0, step: blankStep('caution', 'z') })).toThrow(/already used/);
  });

  it('Alt+arrow crosses a section boundary by changing section first, then swaps', () => {
    const list = steps();
    expect(nudgeAction(list, 'b', 1)).toEqual({ type: 'set-section', id: 'b', section: 'Block', keepPlace: true });
    expect(nudgeAction(list, 'a', 1)).toEqual({ type: 'move', from: 0, to: 1 });
    expect(nudgeAction(list, 'a', -1)).toBeNull();
    const s = editorReducer(initialEditorState(list), nudgeAction(list, 'b', 1)!);
    expect(ids(s)).toEqual(['a', 'b', 'c']);
    expect(s.steps[1]!.section).toBe('Block');
  });

  it('new step ids never collide', () => {
    const seq = [0, 0, 0.5];
    let i = 0;
    const first = newStepId([], () => seq[i++] ?? 0.9);
    const taken = [{ ...blankStep('action', first) }];
    i = 0;
    expect(newStepId(taken, () => seq[i++] ?? 0.9)).not.toBe(first);
  });
});
