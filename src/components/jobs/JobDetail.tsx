/**
 * One job: the unit, its status and the moves allowed to this member, who works it, its parts
 * pages and label sheet, its runs (traveler, report PDF, history, sign-off), and "Start a run".
 */
import { useEffect, useState } from 'react';
import { QueryClient, QueryClientProvider, useMutation } from '@tanstack/react-query';
import { JOB_STATUS_LABELS, type JobStatus } from '../../domain/job-status';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { JobStatusMark } from './JobStatusMark';
import type { JobDto, RevisionOption } from './types';

/** `canReview`: this member signs off runs or sends work back, so complete runs link to the sign-off page. */
type Props = { initial: JobDto; revisions: RevisionOption[]; canStartRun: boolean; canReview: boolean };

export default function JobDetail(props: Props) {
  const [client] = useState(() => new QueryClient());
  return (
    <QueryClientProvider client={client}>
      <Detail {...props} />
    </QueryClientProvider>
  );
}

const message = (e: unknown, fallback: string) => (isApiError(e) ? e.message : fallback);

function Detail({ initial, revisions, canStartRun, canReview }: Props) {
  const [job, setJob] = useState(initial);
  const [status, setStatus] = useState<Status>(null);
  const [revisionId, setRevisionId] = useState(revisions[0]?.id ?? '');
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  const move = useMutation({
    mutationFn: (to: JobStatus) => api<JobDto>(`/api/jobs/${job.id}/status`, { body: { to } }),
    onSuccess: (j) => {
      setJob(j);
      setStatus({ kind: 'ok', message: `Job ${j.code} is now ${JOB_STATUS_LABELS[j.status].toLowerCase()}.` });
    },
    onError: (e) => setStatus({ kind: 'error', message: message(e, 'The status could not be changed; try again.') }),
  });
  const start = useMutation({
    mutationFn: (id: string) => api<{ run: { id: string } }>(`/api/jobs/${job.id}/runs`, { body: { revisionId: id } }),
    onSuccess: (r) => window.location.assign(`/runs/${r.run.id}`),
    onError: (e) => setStatus({ kind: 'error', message: message(e, 'The run could not be started; try again.') }),
  });
  const closedForRuns = job.status === 'closed' || job.status === 'awaiting-signoff';
  return (
    <div className="space-y-6" data-hydrated={hydrated ? 'true' : undefined}>
      <header className="flex flex-wrap items-start gap-4">
        <div className="mr-auto">
          <p className="text-muted font-semibold"><a className="underline" href="/jobs">Jobs</a> · {job.code}</p>
          <h1 className="text-3xl font-bold">{job.unitDescription}</h1>
        </div>
        <div className="text-xl" data-testid="job-status"><JobStatusMark status={job.status} /></div>
      </header>
      <StatusRegion status={status} />
      <section className="grid gap-4 md:grid-cols-2">
        <dl className="tt-card p-5 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
          <dt className="font-semibold">Serial</dt><dd>{job.serial || '—'}</dd>
          <dt className="font-semibold">Hours / odometer</dt><dd>{job.hoursOrOdometer || '—'}</dd>
          <dt className="font-semibold">Customer</dt><dd>{job.customer || '—'}</dd>
          <dt className="font-semibold">Opened</dt><dd>{job.createdAt.slice(0, 10)} ({job.ageDays} days ago)</dd>
          {job.notes && (<><dt className="font-semibold">Notes</dt><dd className="whitespace-pre-line">{job.notes}</dd></>)}
        </dl>
        <div className="tt-card p-5 space-y-2">
          <h2 className="text-xl font-semibold">Assigned</h2>
          <p><strong>Technicians:</strong> {job.technicians.map((t) => t.name).join(', ') || 'none yet'}</p>
          <p><strong>Reviewer:</strong> {job.reviewer?.name ?? 'none yet'}</p>
          {job.nextStatuses.length > 0 && (
            <div className="pt-2">
              <h3 className="font-semibold mb-1">Move the job to</h3>
              <div className="flex flex-wrap gap-2" data-testid="status-moves">
                {job.nextStatuses.map((s) => (
                  <button key={s} type="button" className="tt-btn tt-btn-quiet" disabled={move.isPending} onClick={() => move.mutate(s)}>
                    <JobStatusMark status={s} />
                  </button>
                ))}
              </div>
            </div>
          )}
        </div>
      </section>
      <nav className="tt-card p-5 space-y-3" aria-labelledby="job-parts-h" data-testid="job-links">
        <h2 id="job-parts-h" className="text-xl font-semibold">Parts and labels</h2>
        <div className="flex flex-wrap gap-3">
          <a className="tt-btn tt-btn-quiet" href={`/jobs/${job.id}/tags`}><span aria-hidden="true">🏷</span> Tag board</a>
          <a className="tt-btn tt-btn-quiet" href={`/jobs/${job.id}/findings`}><span aria-hidden="true">⚠</span> Findings</a>
          <a className="tt-btn tt-btn-quiet" href={`/jobs/${job.id}/parts`}><span aria-hidden="true">☰</span> Parts to replace</a>
          <a className="tt-btn tt-btn-quiet" href={`/api/jobs/${job.id}/labels.pdf`}><span aria-hidden="true">⎙</span> Label sheet (PDF)</a>
        </div>
      </nav>
      <section className="tt-card p-5 space-y-3">
        <h2 className="text-xl font-semibold">Runs</h2>
        {job.runs.length === 0 ? (
          <p className="text-muted">No runs yet.</p>
        ) : (
          <ul className="space-y-2" data-testid="job-runs">
            {job.runs.map((r) => {
              const pct = r.progress.total ? Math.round((r.progress.done / r.progress.total) * 100) : 0;
              return (
                <li key={r.id} className="border-2 border-line rounded-md p-3 flex flex-wrap items-center gap-3" data-run-id={r.id}>
                  <div className="mr-auto min-w-0">
                    <a className="font-semibold text-lg underline text-accent" href={`/runs/${r.id}`}>{r.procedureName}</a>
                    <span className="text-muted"> · revision {r.revisionNumber} · {r.status === 'complete' ? '✓ complete' : r.status === 'reopened' ? '↺ sent back' : '◐ in progress'}</span>
                    <p>{r.progress.done} of {r.progress.total} steps finished{r.next ? ` · ${r.next}` : ''}</p>
                    <div className="h-3 rounded-full bg-sunken border border-line overflow-hidden mt-1 max-w-md" role="progressbar" aria-label={`${r.procedureName} progress`} aria-valuemin={0} aria-valuemax={r.progress.total} aria-valuenow={r.progress.done}>
                      <div className="h-full bg-accent" style={{ width: `${pct}%` }} />
                    </div>
                  </div>
                  <div className="flex flex-wrap gap-2" data-testid="run-links">
                    <a className="tt-btn tt-btn-primary" href={`/runs/${r.id}`}>{r.status === 'complete' ? 'Open traveler' : 'Continue'}</a>
                    <a className="tt-btn tt-btn-quiet" href={`/api/runs/${r.id}/report.pdf`}><span aria-hidden="true">⎙</span> Report (PDF)</a>
                    <a className="tt-btn tt-btn-quiet" href={`/runs/${r.id}/history`}><span aria-hidden="true">⌚</span> History</a>
                    {canReview && r.status === 'complete' && <a className="tt-btn tt-btn-quiet" href={`/runs/${r.id}/signoff`}><span aria-hidden="true">✎</span> Sign-off</a>}
                  </div>
                </li>
              );
            })}
          </ul>
        )}
        {canStartRun && !closedForRuns && (
          <form className="flex flex-wrap items-end gap-3 pt-3 border-t border-line" onSubmit={(e) => { e.preventDefault(); if (revisionId) start.mutate(revisionId); else setStatus({ kind: 'error', message: 'Choose a released revision to start from.' }); }}>
            <div className="flex-1 min-w-64">
              <label className="tt-label" htmlFor="start-revision">Start a run from a released revision</label>
              <select id="start-revision" className="tt-input" value={revisionId} onChange={(e) => setRevisionId(e.target.value)}>
                {revisions.length === 0 && <option value="">No released procedures yet</option>}
                {revisions.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
              </select>
            </div>
            <button type="submit" className="tt-btn tt-btn-quiet" disabled={start.isPending || revisions.length === 0}>{start.isPending ? 'Starting…' : 'Start a run'}</button>
          </form>
        )}
      </section>
    </div>
  );
}
