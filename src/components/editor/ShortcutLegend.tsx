/** The desk shortcuts, listed where the lead can see them. */
export const SHORTCUTS: ReadonlyArray<[string, string]> = [
  ['N', 'New step (opens the kinds)'],
  ['Alt + ↑ / ↓', 'Move the selected step up or down'],
  ['Ctrl + D', 'Duplicate the selected step'],
  ['Delete', 'Delete the selected step (asks first)'],
  ['Ctrl + Z', 'Undo the last change'],
  ['Space, ↑/↓, Space', 'On a step’s handle: pick up, move, drop (Escape cancels)'],
  ['Arrow keys', 'On a fastener: nudge it (Shift for bigger steps)'],
];

export function ShortcutLegend() {
  return (
    <details className="tt-card p-3 text-sm tt-no-print" data-testid="shortcut-legend">
      <summary className="cursor-pointer font-semibold min-h-12 flex items-center">Keyboard shortcuts</summary>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 mt-2">
        {SHORTCUTS.map(([k, v]) => (
          <div key={k} className="contents">
            <dt><kbd className="font-mono bg-sunken rounded px-1">{k}</kbd></dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}
