/** A lead's or owner's form to open a job: the unit, the customer, who works it and who reviews it. */
import { useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { api, isApiError } from '../../lib/api-client';
import { roleCan } from '../../lib/access';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { JobDto, MemberOption } from './types';

type Values = { unitDescription: string; serial: string; hoursOrOdometer: string; customer: string; notes: string; technicianIds: string[]; reviewerId: string };
const EMPTY: Values = { unitDescription: '', serial: '', hoursOrOdometer: '', customer: '', notes: '', technicianIds: [], reviewerId: '' };

export function NewJobForm({ members, onCancel }: { members: MemberOption[]; onCancel: () => void }) {
  const [v, setV] = useState<Values>(EMPTY);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<Status>(null);
  const workers = members.filter((m) => roleCan(m.role, { run: ['record'] }));
  const reviewers = members.filter((m) => roleCan(m.role, { signoff: ['sign'] }));
  const create = useMutation({
    mutationFn: (body: object) => api<JobDto>('/api/jobs', { body }),
    onSuccess: (job) => window.location.assign(`/jobs/${job.id}`),
    onError: (e) => {
      if (isApiError(e)) {
        setFields(e.fields);
        setStatus({ kind: 'error', message: e.message });
      } else setStatus({ kind: 'error', message: 'The job could not be opened. Nothing was lost; try again.' });
    },
  });
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    if (!v.unitDescription.trim()) {
      setFields({ unitDescription: 'Describe the unit (engine, model, what it came out of)' });
      return;
    }
    setFields({});
    setStatus(null);
    create.mutate({ ...v, reviewerId: v.reviewerId || null });
  };
  const set = (k: keyof Values) => (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>) => setV({ ...v, [k]: e.target.value });
  const err = (k: string) => fields[k] && <p className="tt-field-error" id={`${k}-error`}>{fields[k]}</p>;
  const techErrors = Object.entries(fields).filter(([k]) => k.startsWith('technicianIds'));
  return (
    <form className="tt-card p-5 space-y-4 mb-6" onSubmit={submit} noValidate aria-labelledby="new-job-title" data-testid="new-job-form">
      <h2 id="new-job-title" className="text-2xl font-semibold">New job</h2>
      <div>
        <label className="tt-label" htmlFor="job-unit">Unit description</label>
        <input id="job-unit" className="tt-input" value={v.unitDescription} onChange={set('unitDescription')} aria-invalid={!!fields['unitDescription']} placeholder="e.g. 4-cylinder diesel out of a farm tractor" />
        {err('unitDescription')}
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <div>
          <label className="tt-label" htmlFor="job-serial">Serial</label>
          <input id="job-serial" className="tt-input" value={v.serial} onChange={set('serial')} aria-invalid={!!fields['serial']} />
          {err('serial')}
        </div>
        <div>
          <label className="tt-label" htmlFor="job-hours">Hours or odometer</label>
          <input id="job-hours" className="tt-input" value={v.hoursOrOdometer} onChange={set('hoursOrOdometer')} aria-invalid={!!fields['hoursOrOdometer']} placeholder="e.g. 6 420 h" />
          {err('hoursOrOdometer')}
        </div>
        <div>
          <label className="tt-label" htmlFor="job-customer">Customer</label>
          <input id="job-customer" className="tt-input" value={v.customer} onChange={set('customer')} aria-invalid={!!fields['customer']} />
          {err('customer')}
        </div>
      </div>
      <div>
        <label className="tt-label" htmlFor="job-notes">Notes</label>
        <textarea id="job-notes" className="tt-input min-h-20" value={v.notes} onChange={set('notes')} aria-invalid={!!fields['notes']} />
        {err('notes')}
      </div>
      <fieldset>
        <legend className="tt-label">Technicians</legend>
        <div className="flex flex-wrap gap-2">
          {workers.map((m) => (
            <label key={m.id} className="inline-flex items-center gap-2 min-h-12 px-3 rounded-md border-2 border-line cursor-pointer">
              <input type="checkbox" className="w-6 h-6" checked={v.technicianIds.includes(m.id)} onChange={(e) => setV({ ...v, technicianIds: e.target.checked ? [...v.technicianIds, m.id] : v.technicianIds.filter((x) => x !== m.id) })} />
              {m.name} <span className="text-muted">({m.role})</span>
            </label>
          ))}
        </div>
        {techErrors.map(([k, msg]) => <p key={k} className="tt-field-error">{msg}</p>)}
      </fieldset>
      <div>
        <label className="tt-label" htmlFor="job-reviewer">Reviewer</label>
        <select id="job-reviewer" className="tt-input" value={v.reviewerId} onChange={set('reviewerId')} aria-invalid={!!fields['reviewerId']}>
          <option value="">No reviewer yet</option>
          {reviewers.map((m) => <option key={m.id} value={m.id}>{m.name} ({m.role})</option>)}
        </select>
        {err('reviewerId')}
      </div>
      <StatusRegion status={status} />
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="tt-btn tt-btn-primary" disabled={create.isPending}>{create.isPending ? 'Opening…' : 'Open job'}</button>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={onCancel}>Cancel</button>
      </div>
    </form>
  );
}
