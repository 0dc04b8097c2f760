/**
 * The step list: one sortable list (mouse, touch and keyboard), drawn under its section
 * headings. Dropping a step onto another puts it in that step's place and section.
 */
import {
  DndContext, KeyboardSensor, PointerSensor, TouchSensor, closestCenter, useSensor, useSensors,
  type Announcements, type DragEndEvent, type ScreenReaderInstructions, type UniqueIdentifier,
} from '@dnd-kit/core';
import { SortableContext, sortableKeyboardCoordinates, useSortable, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { useRef } from 'react';
import type { Step } from '../../domain/procedure/schema';
import { KIND_LABELS, KIND_MARKS } from './labels';

export interface StepListProps {
  steps: Step[];
  selectedId: string | null;
  readOnly: boolean;
  problems: Record<string, string>;
  onSelect: (id: string) => void;
  onMove: (from: number, to: number, section: string) => void;
}

const instructions: ScreenReaderInstructions = {
  draggable:
    'To move a step, press Space or Enter on its handle, use the up and down arrow keys to choose its new place, then press Space or Enter to drop it. Press Escape to cancel.',
};

const sectionWord = (s: string) => (s === '' ? 'no section' : `section "${s}"`);

export function StepList({ steps, selectedId, readOnly, problems, onSelect, onMove }: StepListProps) {
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 6 } }),
    useSensor(TouchSensor, { activationConstraint: { delay: 200, tolerance: 8 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );
  const n = steps.length;
  const movedAway = useRef(false);
  const find = (id: UniqueIdentifier) => {
    const i = steps.findIndex((s) => s.id === id);
    return { i, step: steps[i] };
  };
  const describe = (id: UniqueIdentifier) => `step "${find(id).step?.title ?? id}"`;

  const announcements: Announcements = {
    onDragStart: ({ active }) => {
      movedAway.current = false;
      return `Picked up ${describe(active.id)}, position ${find(active.id).i + 1} of ${n}.`;
    },
    onDragOver: ({ active, over }) => {
      // Right after pick-up the step is over itself: keep the pick-up message instead.
      if (over?.id === active.id && !movedAway.current) return undefined;
      movedAway.current = true;
      if (!over) return `${describe(active.id)} is not over a place in the list.`;
      const target = find(over.id);
      return `${describe(active.id)} is over position ${target.i + 1} of ${n}, ${sectionWord(target.step?.section ?? '')}.`;
    },
    onDragEnd: ({ active, over }) => {
      if (!over) return `${describe(active.id)} was dropped outside the list and stays where it was.`;
      const target = find(over.id);
      return `${describe(active.id)} was dropped at position ${target.i + 1} of ${n}, ${sectionWord(target.step?.section ?? '')}.`;
    },
    onDragCancel: ({ active }) => `Moving ${describe(active.id)} was cancelled. It stays at position ${find(active.id).i + 1} of ${n}.`,
  };

  const onDragEnd = ({ active, over }: DragEndEvent) => {
    if (!over) return;
    const from = find(active.id).i;
    const target = find(over.id);
    if (from < 0 || target.i < 0 || !target.step) return;
    onMove(from, target.i, target.step.section);
  };

  return (
    <DndContext sensors={sensors} collisionDetection={closestCenter} onDragEnd={onDragEnd} accessibility={{ announcements, screenReaderInstructions: instructions }}>
      <SortableContext items={steps.map((s) => s.id)} strategy={verticalListSortingStrategy}>
        <ol className="space-y-1" aria-label="Steps" data-testid="step-list">
          {steps.map((s, i) => {
            const heading = i === 0 || steps[i - 1]?.section !== s.section;
            return (
              <SortableStep
                key={s.id}
                step={s}
                index={i}
                heading={heading ? s.section || 'No section' : null}
                selected={s.id === selectedId}
                readOnly={readOnly}
                problem={problems[s.id] ?? null}
                onSelect={onSelect}
              />
            );
          })}
        </ol>
      </SortableContext>
    </DndContext>
  );
}

function SortableStep(props: { step: Step; index: number; heading: string | null; selected: boolean; readOnly: boolean; problem: string | null; onSelect: (id: string) => void }) {
  const { step, index, heading, selected, readOnly, problem, onSelect } = props;
  const { attributes, listeners, setNodeRef, setActivatorNodeRef, transform, transition, isDragging } = useSortable({ id: step.id, disabled: readOnly });
  return (
    <li
      ref={setNodeRef}
      style={{ transform: transform ? `translate3d(${Math.round(transform.x)}px, ${Math.round(transform.y)}px, 0)` : undefined, transition }}
      className={isDragging ? 'relative z-10 opacity-80' : ''}
      data-testid="step-item"
      data-step-id={step.id}
      data-section={step.section}
    >
      {heading !== null && (
        <h3 className="mt-3 mb-1 text-sm font-bold uppercase tracking-wide text-muted" data-testid="section-heading">
          <span aria-hidden="true">§ </span>
          {heading}
        </h3>
      )}
      <div className={`flex items-stretch rounded-md border ${selected ? 'border-accent bg-accent-soft' : 'border-line bg-surface'}`}>
        {!readOnly && (
          <button
            type="button"
            ref={setActivatorNodeRef}
            className="min-w-12 min-h-12 px-2 text-muted cursor-grab touch-none"
            aria-label={`Move step ${index + 1}: ${step.title}`}
            data-testid="drag-handle"
            {...attributes}
            {...listeners}
          >
            <span aria-hidden="true">⠿</span>
          </button>
        )}
        <button
          type="button"
          className="flex-1 text-left px-2 py-1 min-h-12 flex items-center gap-2"
          aria-current={selected ? 'true' : undefined}
          onClick={() => onSelect(step.id)}
          data-testid="step-select"
        >
          <span className="tabular-nums text-muted w-7 text-right">{index + 1}.</span>
          <span aria-hidden="true" className="w-6 text-center">{KIND_MARKS[step.kind]}</span>
          <span className="flex-1">
            <span className="block font-semibold leading-tight" data-testid="step-title">{step.title}</span>
            <span className="block text-sm text-muted">
              {KIND_LABELS[step.kind]}
              {selected && <span className="sr-only"> (selected)</span>}
            </span>
          </span>
          {problem && (
            <span className="text-sm text-danger font-semibold" title={problem}>
              <span aria-hidden="true">⚠ </span>Needs fixing
            </span>
          )}
        </button>
      </div>
    </li>
  );
}
