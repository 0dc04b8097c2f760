/** Big numeric keys for gloved hands: digits, decimal point, backspace; the keyboard types into it too. */
import { useEffect } from 'react';

const KEYS = ['7', '8', '9', '4', '5', '6', '1', '2', '3', '.', '0', '⌫'] as const;

/** The draft after pressing one key (comma is a decimal point; one point at most; a leading minus allowed). */
export function pressKey(draft: string, key: string): string {
  if (key === '⌫' || key === 'Backspace') return draft.slice(0, -1);
  if (key === '.' || key === ',') return draft.includes('.') ? draft : `${draft || '0'}.`;
  if (key === '-') return draft.startsWith('-') ? draft.slice(1) : `-${draft}`;
  if (/^[0-9]$/.test(key)) return draft.length >= 12 ? draft : draft + key;
  return draft;
}

const typingInField = (t: EventTarget | null) => t instanceof HTMLElement && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.isContentEditable);

export function EntryPad({ draft, onChange, label, unit }: { draft: string; onChange: (d: string) => void; label: string; unit: string }) {
  // Typing anywhere on the page (outside a text field) goes into the pad.
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (typingInField(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
      if (/^[0-9.,-]$/.test(e.key) || e.key === 'Backspace') {
        e.preventDefault();
        onChange(pressKey(draft, e.key));
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [draft, onChange]);
  return (
    <div className="space-y-3">
      <label className="tt-label text-xl" htmlFor="reading-draft">
        Reading for {label}
      </label>
      <div className="flex items-center gap-3">
        <input
          id="reading-draft"
          className="tt-input text-3xl font-bold tabular-nums text-right min-h-16"
          inputMode="decimal"
          autoComplete="off"
          value={draft}
          onChange={(e) => onChange(e.target.value.replace(',', '.').replace(/[^0-9.-]/g, ''))}
          data-testid="reading-draft"
        />
        <span className="text-2xl font-semibold" aria-label={`unit ${unit}`}>{unit}</span>
      </div>
      <div className="grid grid-cols-3 gap-2" role="group" aria-label="Number keys">
        {KEYS.map((k) => (
          <button key={k} type="button" tabIndex={-1} className="tt-btn tt-btn-quiet text-3xl min-h-16" onPointerDown={(e) => e.preventDefault()} onClick={() => onChange(pressKey(draft, k))} aria-label={k === '⌫' ? 'Backspace' : k === '.' ? 'Decimal point' : k}>
            {k}
          </button>
        ))}
      </div>
    </div>
  );
}
