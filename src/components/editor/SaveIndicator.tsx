/** The draft's save state as an icon and a word (never colour alone), with retry or reload. */
import type { SaveState } from './useAutosave';

export function SaveIndicator({ state, onRetry, onReload }: { state: SaveState; onRetry: () => void; onReload: () => void }) {
  const { icon, text, tone } =
    state.kind === 'saved' ? { icon: '✓', text: 'Saved', tone: 'text-ok' }
    : state.kind === 'pending' || state.kind === 'saving' ? { icon: '⟳', text: 'Saving…', tone: 'text-muted' }
    : { icon: '⚠', text: `Not saved — ${state.reason}`, tone: 'text-danger' };
  return (
    <div className="flex flex-wrap items-center gap-2" data-testid="save-state" data-state={state.kind}>
      <span className={`font-semibold ${tone}`} role="status" aria-live="polite">
        <span aria-hidden="true">{icon} </span>
        <span data-testid="save-text">{text}</span>
      </span>
      {state.kind === 'error' && (
        <button type="button" className="tt-btn tt-btn-quiet" onClick={onRetry}>Retry saving</button>
      )}
      {state.kind === 'conflict' && (
        <button type="button" className="tt-btn tt-btn-primary" onClick={onReload}>Reload the latest draft</button>
      )}
    </div>
  );
}
