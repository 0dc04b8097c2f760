/** A tag's disposition as a shape, a word and a colour (never the colour alone). */
import type { Disposition } from '../../domain/procedure/schema';

export const DISPOSITIONS: Array<{ value: Disposition; label: string }> = [
  { value: 'reuse', label: 'Reuse' },
  { value: 'replace', label: 'Replace' },
  { value: 'machine-shop', label: 'Machine shop' },
  { value: 'scrap', label: 'Scrap' },
];
export const dispositionLabel = (d: Disposition) => DISPOSITIONS.find((x) => x.value === d)?.label ?? d;

// Shapes: ring = goes back in, square-with-arrow = new one needed, gear-ish diamond = away for work, cross = discarded.
const MARKS: Record<Disposition, { glyph: string; cls: string }> = {
  reuse: { glyph: '◯', cls: 'bg-ok-soft text-ok border-ok' },
  replace: { glyph: '⟳', cls: 'bg-warn-soft text-warn border-warn' },
  'machine-shop': { glyph: '◆', cls: 'bg-hold-soft text-hold border-hold' },
  scrap: { glyph: '✕', cls: 'bg-danger-soft text-danger border-danger' },
};

export function DispositionMark({ value }: { value: Disposition }) {
  const m = MARKS[value];
  return (
    <span className={`inline-flex items-center gap-1 rounded-md border-2 px-2 py-0.5 font-semibold ${m.cls}`} data-disposition={value}>
      <span aria-hidden="true">{m.glyph}</span>
      <span>{dispositionLabel(value)}</span>
    </span>
  );
}
