/** Finding severities as a mark, a word and a colour. */
import type { FindingSeverity } from '../../server/entities/finding.entity';

export const SEVERITY_MARKS: Record<FindingSeverity, { glyph: string; label: string; cls: string }> = {
  note: { glyph: '○', label: 'Note', cls: 'border-line text-ink' },
  minor: { glyph: '△', label: 'Minor', cls: 'border-accent text-accent' },
  major: { glyph: '▲', label: 'Major', cls: 'border-warn text-warn bg-warn-soft' },
  critical: { glyph: '⬣', label: 'Critical', cls: 'border-danger text-danger bg-danger-soft' },
};
