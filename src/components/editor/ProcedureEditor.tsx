/**
 * The lead's procedure editor: the step list (sortable, in sections), the selected step's form,
 * autosave with the revision's version, undo, and the desk's keyboard shortcuts. A released or
 * retired revision opens read-only with "Start a new draft".
 */
import { useCallback, useEffect, useMemo, useReducer, useRef, useState } from 'react';
import { STEP_KINDS, type Step, type StepKind } from '../../domain/procedure/schema';
import { blankStep } from '../../domain/procedure/new-step';
import { sections as sectionsOf } from '../../domain/procedure/reorder';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { ApiError, revisionsApi } from './api';
import { editorReducer, initialEditorState, newStepId, nudgeAction, type EditorAction } from './editor-state';
import { KIND_LABELS, KIND_MARKS } from './labels';
import { SaveIndicator } from './SaveIndicator';
import { ShortcutLegend } from './ShortcutLegend';
import { StepForm } from './StepForm';
import { StepList } from './StepList';
import { useAutosave } from './useAutosave';
import { revisionName, type RevisionDto } from './types';

export interface ProcedureEditorProps {
  revision: RevisionDto;
  canEdit: boolean;
  canRelease: boolean;
}

const STATUS_WORDS = { draft: '✎ Draft', released: '🔒 Released', retired: '⊘ Retired' } as const;

const isTyping = (t: EventTarget | null) =>
  t instanceof HTMLElement && (t.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(t.tagName) || !!t.closest('[data-own-keys]'));

/** `steps.3.passes.0.percent` → step 3's `passes.0.percent`. */
function fieldsByStep(fields: Record<string, string>, steps: readonly Step[]): { byStep: Record<string, Record<string, string>>; other: string[] } {
  const byStep: Record<string, Record<string, string>> = {};
  const other: string[] = [];
  for (const [path, msg] of Object.entries(fields)) {
    const m = /^steps\.(\d+)\.?(.*)$/.exec(path);
    const s = m ? steps[Number(m[1])] : undefined;
    if (m && s) (byStep[s.id] ??= {})[m[2] || 'root'] = msg;
    else other.push(`${path}: ${msg}`);
  }
  return { byStep, other };
}

export default function ProcedureEditor({ revision, canEdit, canRelease }: ProcedureEditorProps) {
  const readOnly = !canEdit || revision.status !== 'draft';
  const [state, rawDispatch] = useReducer(editorReducer, revision.content.steps, initialEditorState);
  const [status, setStatus] = useState<Status>(null);
  const [problems, setProblems] = useState<Record<string, string>>({});
  const pendingValues = useRef<Record<string, unknown>>({});
  const [menuOpen, setMenuOpen] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [confirmRelease, setConfirmRelease] = useState(false);
  const [note, setNote] = useState(revision.note);
  const [busy, setBusy] = useState(false);
  const [hydrated, setHydrated] = useState(false);
  const menuRef = useRef<HTMLDivElement>(null);
  useEffect(() => setHydrated(true), []);

  const dispatch = useCallback((a: EditorAction) => {
    try {
      rawDispatch(a);
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : 'That change could not be made.' });
    }
  }, []);

  const liveProblems = useMemo(() => Object.fromEntries(Object.entries(problems).filter(([id]) => state.steps.some((s) => s.id === id))), [problems, state.steps]);
  const firstProblem = Object.values(liveProblems)[0] ?? null;
  const autosave = useAutosave({ revisionId: revision.id, initialVersion: revision.version, steps: state.steps, enabled: !readOnly, blockedReason: firstProblem });
  const save = autosave.state;

  const selected = state.steps.find((s) => s.id === state.selectedId) ?? null;
  const selectedIndex = selected ? state.steps.indexOf(selected) : -1;
  const sectionNames = useMemo(() => sectionsOf(state.steps).map((s) => s.name), [state.steps]);
  const serverFields = useMemo(() => (save.kind === 'error' ? fieldsByStep(save.fields, state.steps) : { byStep: {}, other: [] }), [save, state.steps]);

  // Undo or a reload replaces steps under the open form: forget what the forms held.
  useEffect(() => {
    pendingValues.current = {};
    setProblems({});
  }, [state.epoch]);

  const onValidity = useCallback((id: string, problem: string | null, values?: unknown) => {
    if (problem) pendingValues.current[id] = values;
    else delete pendingValues.current[id];
    setProblems((p) => {
      if ((p[id] ?? null) === problem) return p;
      const next = { ...p };
      if (problem) next[id] = problem;
      else delete next[id];
      return next;
    });
  }, []);

  const addStep = useCallback(
    (kind: StepKind) => {
      const id = newStepId(state.steps);
      const step = { ...blankStep(kind, id), section: selected?.section ?? '' };
      dispatch({ type: 'insert', index: selectedIndex < 0 ? state.steps.length : selectedIndex + 1, step });
      setMenuOpen(false);
      setStatus({ kind: 'info', message: `Added a ${KIND_LABELS[kind].toLowerCase()} step after ${selected ? `"${selected.title}"` : 'the last step'}.` });
    },
    [state.steps, selected, selectedIndex, dispatch],
  );

  const duplicate = useCallback(() => {
    if (!selected) return;
    dispatch({ type: 'duplicate', id: selected.id, newId: newStepId(state.steps) });
    setStatus({ kind: 'info', message: `Duplicated "${selected.title}".` });
  }, [selected, state.steps, dispatch]);

  const remove = useCallback(() => {
    if (!selected) return;
    dispatch({ type: 'remove', id: selected.id });
    setConfirmDelete(false);
    setStatus({ kind: 'info', message: `Deleted "${selected.title}". Undo (Ctrl+Z) brings it back.` });
  }, [selected, dispatch]);

  const undo = useCallback(() => {
    const last = state.past[state.past.length - 1];
    if (!last) return setStatus({ kind: 'info', message: 'Nothing to undo.' });
    dispatch({ type: 'undo' });
    setStatus({ kind: 'info', message: `Undid: ${last.label}.` });
  }, [state.past, dispatch]);

  const nudge = useCallback(
    (dir: -1 | 1) => {
      if (!selected) return;
      const a = nudgeAction(state.steps, selected.id, dir);
      if (a) dispatch(a);
    },
    [selected, state.steps, dispatch],
  );

  // Desk shortcuts; text fields and the fastener map keep their own keys.
  useEffect(() => {
    if (readOnly) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.defaultPrevented || isTyping(e.target)) return;
      const mod = e.ctrlKey || e.metaKey;
      if (mod && !e.shiftKey && e.key.toLowerCase() === 'z') {
        e.preventDefault();
        undo();
      } else if (mod && e.key.toLowerCase() === 'd') {
        e.preventDefault();
        duplicate();
      } else if (e.altKey && (e.key === 'ArrowUp' || e.key === 'ArrowDown')) {
        e.preventDefault();
        nudge(e.key === 'ArrowUp' ? -1 : 1);
      } else if (e.key === 'Delete' && !mod && selected) {
        e.preventDefault();
        setConfirmDelete(true);
      } else if (!mod && !e.altKey && (e.key === 'n' || e.key === 'N')) {
        e.preventDefault();
        setMenuOpen(true);
      } else if (e.key === 'Escape') {
        setMenuOpen(false);
        setConfirmDelete(false);
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [readOnly, undo, duplicate, nudge, selected]);

  useEffect(() => {
    if (menuOpen) menuRef.current?.querySelector<HTMLButtonElement>('[role="menuitem"]')?.focus();
  }, [menuOpen]);

  const reload = useCallback(async () => {
    try {
      const r = await revisionsApi.get(revision.id);
      if (r.status !== 'draft') {
        window.location.reload();
        return;
      }
      autosave.adopt(r);
      dispatch({ type: 'replace-all', steps: r.content.steps });
      setStatus({ kind: 'info', message: `Reloaded the latest draft (version ${r.version}). Your unsaved changes were not applied.` });
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : 'Could not reload the draft.' });
    }
  }, [revision.id, autosave, dispatch]);

  const saveNote = async () => {
    if (note === revision.note || readOnly) return;
    try {
      await revisionsApi.setNote(revision.id, note);
      setStatus({ kind: 'ok', message: 'Revision note saved.' });
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : 'Could not save the note.' });
    }
  };

  const release = async () => {
    setBusy(true);
    try {
      if (firstProblem) throw new Error(`Fix the marked fields first: ${firstProblem}.`);
      const ok = await autosave.flush();
      if (!ok) throw new Error('The latest changes are not saved yet; save them before releasing.');
      await revisionsApi.release(revision.id, note);
      window.location.assign(`/revisions/${encodeURIComponent(revision.id)}/edit?released=1`);
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : 'Could not release the revision.' });
      setConfirmRelease(false);
    } finally {
      setBusy(false);
    }
  };

  const startDraft = async () => {
    setBusy(true);
    try {
      const draft = await revisionsApi.startDraft(revision.procedureId, revision.id);
      window.location.assign(`/revisions/${encodeURIComponent(draft.id)}/edit`);
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof ApiError || e instanceof Error ? e.message : 'Could not start a draft.' });
      setBusy(false);
    }
  };

  const derive = async () => {
    setBusy(true);
    try {
      const r = await revisionsApi.deriveAssembly(revision.id);
      window.location.assign(`/revisions/${encodeURIComponent(r.draft.id)}/edit?derived=1`);
    } catch (e) {
      setStatus({ kind: 'error', message: e instanceof Error ? e.message : 'Could not derive the assembly.' });
      setBusy(false);
    }
  };

  return (
    <div className="space-y-4" data-hydrated={hydrated ? 'true' : undefined} data-testid="procedure-editor" data-read-only={readOnly ? 'true' : 'false'} data-version={autosave.version}>
      <header className="flex flex-wrap items-center gap-3 justify-between">
        <div>
          <p className="text-sm text-muted"><a href={`/procedures/${encodeURIComponent(revision.procedureId)}`} className="underline">{revision.procedureName}</a> · {revision.procedureKind}</p>
          <h1 className="text-2xl font-bold">
            {revisionName(revision)} <span className="text-base font-semibold text-muted" data-testid="revision-status">{STATUS_WORDS[revision.status]}</span>
          </h1>
        </div>
        {!readOnly && <SaveIndicator state={save} onRetry={() => void autosave.flush()} onReload={() => void reload()} />}
      </header>

      {readOnly && (
        <div className="tt-card p-4 flex flex-wrap items-center gap-3" data-testid="read-only-banner">
          <p className="flex-1">
            <span aria-hidden="true">🔒 </span>
            {revision.status === 'draft' ? 'Your role may read this draft but not change it.' : `${revisionName(revision)} is ${revision.status} and cannot change. Start a new draft from it to make changes.`}
          </p>
          {canEdit && revision.status !== 'draft' && (
            <button type="button" className="tt-btn tt-btn-primary" onClick={() => void startDraft()} disabled={busy}>Start a new draft</button>
          )}
          {canEdit && revision.status === 'released' && revision.procedureKind === 'teardown' && (
            <button type="button" className="tt-btn tt-btn-quiet" onClick={() => void derive()} disabled={busy}>Derive assembly draft</button>
          )}
          {revision.basedOnId && (
            <a className="tt-btn tt-btn-quiet" href={`/revisions/compare?a=${encodeURIComponent(revision.basedOnId)}&b=${encodeURIComponent(revision.id)}`}>Compare with the revision it came from</a>
          )}
        </div>
      )}

      <StatusRegion status={status} />
      {serverFields.other.length > 0 && (
        <ul className="tt-status rounded-md px-4 py-2" data-kind="error">{serverFields.other.map((m) => <li key={m}>{m}</li>)}</ul>
      )}
      {save.kind === 'conflict' && (
        <p className="tt-status rounded-md px-4 py-3" data-kind="error" data-testid="conflict">
          {save.reason} Your edits here are kept on screen but were not saved. Reload the latest draft to continue from what is stored.
        </p>
      )}

      {!readOnly && (
        <div className="flex flex-wrap items-center gap-2 tt-no-print" role="toolbar" aria-label="Step tools">
          <div className="relative" ref={menuRef}>
            <button type="button" className="tt-btn tt-btn-primary" aria-haspopup="menu" aria-expanded={menuOpen} onClick={() => setMenuOpen((o) => !o)}>+ Add step</button>
            {menuOpen && (
              <div role="menu" aria-label="Kind of step" className="absolute z-20 mt-1 tt-card p-1 shadow-lg w-64" onKeyDown={(e) => {
                const items = [...(menuRef.current?.querySelectorAll<HTMLButtonElement>('[role="menuitem"]') ?? [])];
                const i = items.indexOf(document.activeElement as HTMLButtonElement);
                if (e.key === 'ArrowDown') { e.preventDefault(); items[(i + 1) % items.length]?.focus(); }
                if (e.key === 'ArrowUp') { e.preventDefault(); items[(i - 1 + items.length) % items.length]?.focus(); }
                if (e.key === 'Escape') { e.preventDefault(); setMenuOpen(false); }
              }}>
                {STEP_KINDS.map((k) => (
                  <button key={k} type="button" role="menuitem" className="w-full text-left px-3 min-h-12 rounded hover:bg-sunken focus:bg-sunken flex items-center gap-2" onClick={() => addStep(k)}>
                    <span aria-hidden="true" className="w-6 text-center">{KIND_MARKS[k]}</span>
                    {KIND_LABELS[k]}
                  </button>
                ))}
              </div>
            )}
          </div>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={!selected} onClick={duplicate}>⊕ Duplicate</button>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={selectedIndex <= 0 && !(selected && selected.section !== '' && selectedIndex === 0)} onClick={() => nudge(-1)} aria-label="Move selected step up">↑ Up</button>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={selectedIndex < 0 || selectedIndex >= state.steps.length - 1} onClick={() => nudge(1)} aria-label="Move selected step down">↓ Down</button>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={state.past.length === 0} onClick={undo}>↶ Undo</button>
          {confirmDelete && selected ? (
            <span className="flex items-center gap-2 tt-card px-2" role="group" aria-label="Confirm delete">
              <span>Delete “{selected.title}”?</span>
              <button type="button" className="tt-btn tt-btn-danger" onClick={remove}>Delete step</button>
              <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setConfirmDelete(false)}>Keep it</button>
            </span>
          ) : (
            <button type="button" className="tt-btn tt-btn-quiet" disabled={!selected} onClick={() => setConfirmDelete(true)}>✕ Delete</button>
          )}
        </div>
      )}

      <div className="grid gap-4 lg:grid-cols-[minmax(16rem,22rem)_1fr] items-start">
        <aside className="space-y-3">
          {state.steps.length === 0 ? (
            <p className="text-muted tt-card p-4">No steps yet. {readOnly ? '' : 'Add the first one with “+ Add step” (or press N).'}</p>
          ) : (
            <StepList
              steps={state.steps}
              selectedId={state.selectedId}
              readOnly={readOnly}
              problems={liveProblems}
              onSelect={(id) => dispatch({ type: 'select', id })}
              onMove={(from, to, section) => dispatch({ type: 'move', from, to, section })}
            />
          )}
          <ShortcutLegend />
        </aside>
        <section className="tt-card p-4" aria-label="Selected step">
          {selected ? (
            <StepForm
              key={`${selected.id}:${state.epoch}`}
              step={selected}
              initialValues={pendingValues.current[selected.id]}
              sections={sectionNames}
              readOnly={readOnly}
              serverErrors={serverFields.byStep[selected.id] ?? {}}
              onValid={(s) => dispatch({ type: 'update', step: s })}
              onValidity={onValidity}
            />
          ) : (
            <p className="text-muted">Select a step to edit it.</p>
          )}
        </section>
      </div>

      {!readOnly && canRelease && (
        <section className="tt-card p-4 space-y-3 tt-no-print" aria-label="Release">
          <h2 className="text-xl font-semibold">Release</h2>
          <div>
            <label className="tt-label" htmlFor="revision-note">Revision note</label>
            <input id="revision-note" className="tt-input" value={note} maxLength={500} onChange={(e) => setNote(e.target.value)} onBlur={() => void saveNote()} />
            <p className="text-sm text-muted">What changed and why; shown with the revision.</p>
          </div>
          {confirmRelease ? (
            <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Confirm release">
              <span>Release this draft as the next revision? It cannot be changed afterwards.</span>
              <button type="button" className="tt-btn tt-btn-primary" disabled={busy} onClick={() => void release()}>Release now</button>
              <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setConfirmRelease(false)}>Not yet</button>
            </div>
          ) : (
            <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setConfirmRelease(true)}>Release this draft…</button>
          )}
        </section>
      )}
    </div>
  );
}
