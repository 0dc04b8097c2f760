/**
 * Autosave of a draft: a debounced PUT carrying the version the editor last saw. One request
 * at a time; edits made while one is in flight are saved right after. A stale version (409)
 * stops saving and keeps the local steps, so nothing is ever silently overwritten either way.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { Step } from '../../domain/procedure/schema';
import { ApiError, currentRevisionOf, revisionsApi } from './api';
import type { RevisionDto } from './types';

export type SaveState =
  | { kind: 'saved'; at: string | null }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'error'; reason: string; fields: Record<string, string> }
  | { kind: 'conflict'; reason: string; current: RevisionDto | null }
  | { kind: 'blocked'; reason: string };

const DEBOUNCE_MS = 700;

export function useAutosave(opts: {
  revisionId: string;
  initialVersion: number;
  steps: Step[];
  enabled: boolean;
  /** Set when a form holds values that do not pass the schema yet: saving waits for them. */
  blockedReason: string | null;
  onSaved?: (r: RevisionDto) => void;
}) {
  const { revisionId, steps, enabled, blockedReason } = opts;
  const [state, setState] = useState<SaveState>({ kind: 'saved', at: null });
  const [version, setVersion] = useState(opts.initialVersion);
  const versionRef = useRef(opts.initialVersion);
  const savedJson = useRef(JSON.stringify(steps));
  const latest = useRef(steps);
  latest.current = steps;
  const inFlight = useRef(false);
  const stopped = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const onSaved = useRef(opts.onSaved);
  onSaved.current = opts.onSaved;

  const save = useCallback(async (): Promise<void> => {
    if (inFlight.current || stopped.current) return;
    const toSave = latest.current;
    const json = JSON.stringify(toSave);
    if (json === savedJson.current) {
      setState({ kind: 'saved', at: new Date().toISOString() });
      return;
    }
    inFlight.current = true;
    setState({ kind: 'saving' });
    try {
      const r = await revisionsApi.saveContent(revisionId, toSave, versionRef.current);
      versionRef.current = r.version;
      setVersion(r.version);
      savedJson.current = json;
      onSaved.current?.(r);
      inFlight.current = false;
      if (JSON.stringify(latest.current) !== json) return save();
      setState({ kind: 'saved', at: r.updatedAt ?? new Date().toISOString() });
    } catch (e) {
      inFlight.current = false;
      if (e instanceof ApiError && e.status === 409) {
        stopped.current = true;
        setState({ kind: 'conflict', reason: e.message, current: currentRevisionOf(e.body) });
      } else if (e instanceof ApiError) {
        setState({ kind: 'error', reason: e.message, fields: e.fields });
      } else {
        setState({ kind: 'error', reason: 'Something went wrong while saving. Try again.', fields: {} });
      }
    }
  }, [revisionId]);

  useEffect(() => {
    if (!enabled || stopped.current) return;
    if (blockedReason) {
      setState({ kind: 'blocked', reason: blockedReason });
      return;
    }
    if (JSON.stringify(steps) === savedJson.current) {
      setState((s) => (s.kind === 'pending' || s.kind === 'blocked' ? { kind: 'saved', at: null } : s));
      return;
    }
    setState((s) => (s.kind === 'saving' ? s : { kind: 'pending' }));
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void save(), DEBOUNCE_MS);
    return () => {
      if (timer.current) clearTimeout(timer.current);
    };
  }, [steps, enabled, blockedReason, save]);

  // Leaving with unsaved edits asks first (the browser shows its own wording).
  useEffect(() => {
    const warn = (ev: BeforeUnloadEvent) => {
      if (enabled && JSON.stringify(latest.current) !== savedJson.current) ev.preventDefault();
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [enabled]);

  /** Saves now (retry, or before release); resolves once nothing unsaved remains or it failed. */
  const flush = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    await save();
    return JSON.stringify(latest.current) === savedJson.current;
  }, [save]);

  /** After a reload from the server: adopt its content and version, and save again from there. */
  const adopt = useCallback((r: RevisionDto) => {
    versionRef.current = r.version;
    setVersion(r.version);
    savedJson.current = JSON.stringify(r.content.steps);
    stopped.current = false;
    setState({ kind: 'saved', at: r.updatedAt });
  }, []);

  return { state, version, flush, adopt };
}
