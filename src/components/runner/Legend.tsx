/** What every mark means and the keyboard shortcuts; opened with "?" or the Legend button. */
import { StateMark } from './StateMark';
import { FastenerGlyph } from './FastenerMap';

export function Legend({ onClose }: { onClose: () => void }) {
  return (
    <section className="tt-card p-5 mb-4" aria-labelledby="legend-title" data-testid="legend">
      <div className="flex items-center justify-between gap-4 mb-3">
        <h2 id="legend-title" className="text-xl font-semibold">Legend and shortcuts</h2>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={onClose}>Close legend</button>
      </div>
      <div className="grid gap-6 sm:grid-cols-3">
        <div>
          <h3 className="font-semibold mb-1">Steps</h3>
          <ul className="space-y-1">
            {(['locked', 'ready', 'in-progress', 'done', 'deviated', 'signed'] as const).map((s) => (
              <li key={s}><StateMark state={s} /></li>
            ))}
          </ul>
        </div>
        <div>
          <h3 className="font-semibold mb-1">Fasteners (this pass)</h3>
          <ul className="space-y-2">
            {(['next', 'todo', 'done'] as const).map((s) => (
              <li key={s} className="flex items-center gap-2">
                <svg width="40" height="40" viewBox="-30 -30 60 60" aria-hidden="true"><FastenerGlyph state={s} r={22} label="" /></svg>
                <span className="font-semibold">{s === 'next' ? 'Next — work this one' : s === 'todo' ? 'To do' : 'Done in this pass'}</span>
              </li>
            ))}
          </ul>
        </div>
        <div>
          <h3 className="font-semibold mb-1">Keys</h3>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
            <dt><kbd className="font-mono">Enter</kbd></dt><dd>the main action (confirm, save, submit)</dd>
            <dt><kbd className="font-mono">A</kbd></dt><dd>acknowledge a caution or hazards</dd>
            <dt><kbd className="font-mono">0–9 . ⌫</kbd></dt><dd>type a reading</dd>
            <dt><kbd className="font-mono">?</kbd></dt><dd>this legend</dd>
          </dl>
        </div>
      </div>
    </section>
  );
}
