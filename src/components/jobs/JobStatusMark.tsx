/** A job status as icon + word + colour (never colour alone). */
import { JOB_STATUS_LABELS, type JobStatus } from '../../domain/job-status';

const COLOUR: Record<JobStatus, string> = {
  open: 'text-accent',
  teardown: 'text-warn',
  'at-machine-shop': 'text-hold',
  assembly: 'text-accent',
  'awaiting-signoff': 'text-hold',
  closed: 'text-ok',
};

function Icon({ status }: { status: JobStatus }) {
  const p = { width: 20, height: 20, viewBox: '0 0 24 24', 'aria-hidden': true, fill: 'none', stroke: 'currentColor', strokeWidth: 2.4, strokeLinecap: 'round', strokeLinejoin: 'round', className: `shrink-0 ${COLOUR[status]}` } as const;
  switch (status) {
    case 'open':
      return <svg {...p}><circle cx="12" cy="12" r="8.5" /></svg>;
    case 'teardown':
      return <svg {...p}><circle cx="12" cy="12" r="9" /><path d="M12 7v9M8 12.5l4 4 4-4" /></svg>;
    case 'at-machine-shop':
      return <svg {...p}><rect x="3" y="6" width="11" height="12" rx="1" /><path d="M11 12h10M17.5 8.5 21 12l-3.5 3.5" /></svg>;
    case 'assembly':
      return <svg {...p}><circle cx="12" cy="12" r="9" /><path d="M12 17V8M8 11.5l4-4 4 4" /></svg>;
    case 'awaiting-signoff':
      return <svg {...p}><path d="M7 3h10M7 21h10M8 3c0 5 8 5 8 9s-8 4-8 9M16 3c0 5-8 5-8 9s8 4 8 9" /></svg>;
    case 'closed':
      return <svg {...p}><rect x="3" y="3" width="18" height="18" rx="3" fill="currentColor" stroke="none" /><path d="M7 12.5l3.2 3.2L17 9" stroke="var(--color-surface)" /></svg>;
  }
}

export function JobStatusMark({ status }: { status: JobStatus }) {
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold whitespace-nowrap" data-status={status}>
      <Icon status={status} />
      <span className={COLOUR[status]}>{JOB_STATUS_LABELS[status]}</span>
    </span>
  );
}
