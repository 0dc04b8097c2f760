/** The /jobs desk: filters (status, technician, age), the sortable jobs table, and "New job" for leads. */
import { useEffect, useState } from 'react';
import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { JOB_STATUSES, JOB_STATUS_LABELS } from '../../domain/job-status';
import { api } from '../../lib/api-client';
import { StatusRegion } from '../ui/StatusRegion';
import { JobsTable } from './JobsTable';
import { NewJobForm } from './NewJobForm';
import type { JobSummaryDto, MemberOption } from './types';

export type JobFilters = { status: string; technician: string; olderThanDays: string };
type Props = { initial: JobSummaryDto[]; filters: JobFilters; members: MemberOption[]; canCreate: boolean };

export default function JobsDesk(props: Props) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: false } } }));
  return (
    <QueryClientProvider client={client}>
      <Desk {...props} />
    </QueryClientProvider>
  );
}

const query = (f: JobFilters) => new URLSearchParams(Object.entries(f).filter(([, v]) => v !== '')).toString();

function Desk({ initial, filters: start, members, canCreate }: Props) {
  const [filters, setFilters] = useState<JobFilters>(start);
  const [creating, setCreating] = useState(false);
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  const q = query(filters);
  const jobs = useQuery({
    queryKey: ['jobs', q],
    queryFn: () => api<{ jobs: JobSummaryDto[] }>(`/api/jobs${q ? `?${q}` : ''}`).then((r) => r.jobs),
    initialData: q === query(start) ? initial : undefined,
  });
  useEffect(() => {
    const url = new URL(window.location.href);
    url.search = q;
    window.history.replaceState(null, '', url);
  }, [q]);
  const set = (k: keyof JobFilters) => (e: React.ChangeEvent<HTMLSelectElement>) => setFilters({ ...filters, [k]: e.target.value });
  const technicians = members.filter((m) => m.role === 'technician' || m.role === 'lead' || m.role === 'owner');
  return (
    <div data-hydrated={hydrated ? 'true' : undefined}>
      <div className="flex flex-wrap items-end gap-4 mb-4">
        <h1 className="text-3xl font-bold mr-auto">Jobs</h1>
        {canCreate && !creating && (
          <button type="button" className="tt-btn tt-btn-primary" onClick={() => setCreating(true)} data-testid="new-job">+ New job</button>
        )}
      </div>
      {creating && <NewJobForm members={members} onCancel={() => setCreating(false)} />}
      <form className="flex flex-wrap gap-4 mb-4 tt-no-print" aria-label="Filter jobs" onSubmit={(e) => e.preventDefault()}>
        <div>
          <label className="tt-label" htmlFor="f-status">Status</label>
          <select id="f-status" className="tt-input" value={filters.status} onChange={set('status')}>
            <option value="">Any status</option>
            {JOB_STATUSES.map((s) => <option key={s} value={s}>{JOB_STATUS_LABELS[s]}</option>)}
          </select>
        </div>
        <div>
          <label className="tt-label" htmlFor="f-tech">Technician</label>
          <select id="f-tech" className="tt-input" value={filters.technician} onChange={set('technician')}>
            <option value="">Anyone</option>
            <option value="me">Assigned to me</option>
            {technicians.map((m) => <option key={m.id} value={m.id}>{m.name}</option>)}
          </select>
        </div>
        <div>
          <label className="tt-label" htmlFor="f-age">Age</label>
          <select id="f-age" className="tt-input" value={filters.olderThanDays} onChange={set('olderThanDays')}>
            <option value="">Any age</option>
            <option value="7">Older than 7 days</option>
            <option value="14">Older than 14 days</option>
            <option value="30">Older than 30 days</option>
            <option value="90">Older than 90 days</option>
          </select>
        </div>
      </form>
      <StatusRegion status={jobs.error ? { kind: 'error', message: jobs.error.message } : null} />
      {jobs.data ? <JobsTable jobs={jobs.data} /> : <p className="tt-card p-5">Loading jobs…</p>}
    </div>
  );
}
