/**
 * The editor's step list with its undo history, as a pure reducer. Every list edit goes
 * through the domain's reorder functions; this file only keeps the history and the selection.
 */
import { duplicateStep, insertStep, moveStep, moveStepToSection, removeStep } from '../../domain/procedure/reorder';
import type { Step } from '../../domain/procedure/schema';

const MAX_HISTORY = 100;

export interface EditorState {
  steps: Step[];
  selectedId: string | null;
  /** Earlier step lists, newest last; `undo` restores the last one. */
  past: Array<{ steps: Step[]; label: string }>;
  /** Consecutive edits of one step's fields share one undo entry. */
  lastKey: string | null;
  /** Bumped whenever the steps change from outside a form (undo, reload), so forms re-read them. */
  epoch: number;
}

export type EditorAction =
  | { type: 'move'; from: number; to: number; section?: string }
  | { type: 'set-section'; id: string; section: string; keepPlace?: boolean }
  | { type: 'insert'; index: number; step: Step }
  | { type: 'duplicate'; id: string; newId: string }
  | { type: 'remove'; id: string }
  | { type: 'update'; step: Step }
  | { type: 'select'; id: string | null }
  | { type: 'undo' }
  | { type: 'replace-all'; steps: Step[] };

export const initialEditorState = (steps: Step[]): EditorState => ({
  steps,
  selectedId: steps[0]?.id ?? null,
  past: [],
  lastKey: null,
  epoch: 0,
});

function commit(state: EditorState, steps: Step[], label: string, key: string | null = null, extra: Partial<EditorState> = {}): EditorState {
  const coalesce = key !== null && key === state.lastKey;
  const past = coalesce ? state.past : [...state.past, { steps: state.steps, label }].slice(-MAX_HISTORY);
  return { ...state, ...extra, steps, past, lastKey: key };
}

const titleOf = (steps: readonly Step[], id: string) => steps.find((s) => s.id === id)?.title ?? 'step';

export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  switch (action.type) {
    case 'move': {
      const moved = state.steps[action.from];
      if (!moved || action.from === action.to) {
        if (moved && action.section !== undefined && action.section !== moved.section)
          return editorReducer(state, { type: 'set-section', id: moved.id, section: action.section, keepPlace: true });
        return state;
      }
      let steps = moveStep(state.steps, action.from, action.to);
      const sectionChanged = action.section !== undefined && action.section !== moved.section;
      if (sectionChanged) steps = steps.map((s) => (s.id === moved.id ? { ...s, section: action.section ?? '' } : s));
      // The open form holds the old section; a new epoch makes it re-read the step.
      return commit(state, steps, `move "${moved.title}"`, null, { selectedId: moved.id, epoch: state.epoch + (sectionChanged ? 1 : 0) });
    }
    case 'set-section': {
      const current = state.steps.find((s) => s.id === action.id);
      if (!current || current.section === action.section.trim()) return state;
      const steps = action.keepPlace
        ? state.steps.map((s) => (s.id === action.id ? { ...s, section: action.section.trim() } : s))
        : moveStepToSection(state.steps, action.id, action.section);
      return commit(state, steps, `move "${current.title}" to a section`, null, { epoch: state.epoch + 1 });
    }
    case 'insert':
      return commit(state, insertStep(state.steps, action.index, action.step), `add "${action.step.title}"`, null, { selectedId: action.step.id });
    case 'duplicate':
      return commit(state, duplicateStep(state.steps, action.id, action.newId), `duplicate "${titleOf(state.steps, action.id)}"`, null, { selectedId: action.newId });
    case 'remove': {
      const i = state.steps.findIndex((s) => s.id === action.id);
      if (i < 0) return state;
      const steps = removeStep(state.steps, action.id);
      const nextSelected = steps[Math.min(i, steps.length - 1)]?.id ?? null;
      return commit(state, steps, `delete "${titleOf(state.steps, action.id)}"`, null, { selectedId: nextSelected });
    }
    case 'update': {
      const i = state.steps.findIndex((s) => s.id === action.step.id);
      const old = state.steps[i];
      if (!old) return state;
      if (JSON.stringify(old) === JSON.stringify(action.step)) return state;
      let steps = state.steps.map((s, j) => (j === i ? action.step : s));
      // A new section name from the form moves the step so its section stays together.
      if (old.section !== action.step.section) steps = moveStepToSection(steps, action.step.id, action.step.section);
      return commit(state, steps, `edit "${action.step.title}"`, `edit:${action.step.id}`);
    }
    case 'select':
      return state.selectedId === action.id ? state : { ...state, selectedId: action.id, lastKey: null };
    case 'undo': {
      const last = state.past[state.past.length - 1];
      if (!last) return state;
      const selectedId = state.selectedId && last.steps.some((s) => s.id === state.selectedId) ? state.selectedId : (last.steps[0]?.id ?? null);
      return { ...state, steps: last.steps, past: state.past.slice(0, -1), lastKey: null, epoch: state.epoch + 1, selectedId };
    }
    case 'replace-all': {
      const selectedId = state.selectedId && action.steps.some((s) => s.id === state.selectedId) ? state.selectedId : (action.steps[0]?.id ?? null);
      return { steps: action.steps, past: [], lastKey: null, epoch: state.epoch + 1, selectedId };
    }
  }
}

/**
 * Alt+↑/↓ on the desk: across a section boundary the step first joins the neighbouring
 * section where it stands; within a section it swaps with its neighbour.
 */
export function nudgeAction(steps: readonly Step[], id: string, dir: -1 | 1): EditorAction | null {
  const i = steps.findIndex((s) => s.id === id);
  const me = steps[i];
  const neighbour = steps[i + dir];
  if (!me || !neighbour) return null;
  if (neighbour.section !== me.section) return { type: 'set-section', id, section: neighbour.section, keepPlace: true };
  return { type: 'move', from: i, to: i + dir };
}

/** A step id not used in the list: "s" + a short random part, checked for collisions. */
export function newStepId(steps: readonly Step[], random: () => number = Math.random): string {
  const used = new Set(steps.map((s) => s.id));
  for (;;) {
    const id = 's-' + Math.floor(random() * 36 ** 6).toString(36).padStart(6, '0');
    if (!used.has(id)) return id;
  }
}
