/** A revision's status as icon + word + colour (never colour alone). */
import type { RevisionStatus } from '../../server/entities/revision.entity';

export const REVISION_STATUS_LABELS: Record<RevisionStatus, string> = { draft: 'Draft', released: 'Released', retired: 'Retired' };
const COLOUR: Record<RevisionStatus, string> = { draft: 'text-warn', released: 'text-ok', retired: 'text-muted' };

function Icon({ status }: { status: RevisionStatus }) {
  const p = { width: 20, height: 20, viewBox: '0 0 24 24', 'aria-hidden': true, fill: 'none', stroke: 'currentColor', strokeWidth: 2.4, strokeLinecap: 'round', strokeLinejoin: 'round', className: `shrink-0 ${COLOUR[status]}` } as const;
  switch (status) {
    case 'draft': // a pencil: still being written
      return <svg {...p}><path d="M4 20l1-4L16 5l3 3L8 19z" /><path d="M14 7l3 3" /></svg>;
    case 'released': // a sealed stamp: frozen
      return <svg {...p}><path d="M12 3l7 3v5c0 4.5-3 8-7 10-4-2-7-5.5-7-10V6z" /><path d="M8.5 12l2.5 2.5 4.5-4.5" /></svg>;
    case 'retired': // a crossed-out circle: out of use
      return <svg {...p}><circle cx="12" cy="12" r="8.5" /><path d="M6 18L18 6" /></svg>;
  }
}

export function RevisionStatusMark({ status, number }: { status: RevisionStatus; number?: number | null }) {
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold whitespace-nowrap" data-status={status}>
      <Icon status={status} />
      <span className={COLOUR[status]}>{REVISION_STATUS_LABELS[status]}{number != null ? ` · rev ${number}` : ''}</span>
    </span>
  );
}

/** Server and browser write the same text, so hydration never disagrees. */
export const when = (iso: string | null | undefined) => (iso ? `${iso.slice(0, 10)} ${iso.slice(11, 16)}` : '');
