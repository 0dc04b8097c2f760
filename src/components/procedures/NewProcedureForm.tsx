/** A lead's or owner's form for a new procedure; it opens with an empty draft in the editor. */
import { useState } from 'react';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { ProcedureDto, RevisionDto } from '../../server/services/procedure-dto';

const KINDS = [
  { value: 'teardown', label: 'Teardown' },
  { value: 'assembly', label: 'Assembly' },
  { value: 'inspection', label: 'Inspection' },
] as const;
type Values = { name: string; kind: string; engineFamily: string; description: string };

export function NewProcedureForm({ engineFamilies, onCancel }: { engineFamilies: string[]; onCancel: () => void }) {
  const [v, setV] = useState<Values>({ name: '', kind: 'teardown', engineFamily: '', description: '' });
  const [fields, setFields] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof Values) => (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>) => setV({ ...v, [k]: e.target.value });
  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    if (!v.name.trim()) return setFields({ name: 'Give the procedure a name' });
    setFields({});
    setStatus(null);
    setBusy(true);
    try {
      const res = await api<{ procedure: ProcedureDto; draft: RevisionDto }>('/api/procedures', { body: v });
      window.location.assign(`/revisions/${res.draft.id}/edit`);
    } catch (err) {
      setBusy(false);
      if (isApiError(err)) {
        setFields(err.fields);
        setStatus({ kind: 'error', message: err.message });
      } else setStatus({ kind: 'error', message: 'The procedure could not be created. Nothing was lost; try again.' });
    }
  };
  const err = (k: string) => fields[k] && <p className="tt-field-error" id={`np-${k}-error`}>{fields[k]}</p>;
  return (
    <form className="tt-card p-5 space-y-4 mb-6" onSubmit={submit} noValidate aria-labelledby="np-title" data-testid="new-procedure-form">
      <h2 id="np-title" className="text-2xl font-semibold">New procedure</h2>
      <div className="grid gap-4 sm:grid-cols-3">
        <div className="sm:col-span-2">
          <label className="tt-label" htmlFor="np-name">Name</label>
          <input id="np-name" className="tt-input" value={v.name} onChange={set('name')} aria-invalid={!!fields['name']} aria-describedby={fields['name'] ? 'np-name-error' : undefined} placeholder="e.g. Cylinder head — teardown" />
          {err('name')}
        </div>
        <div>
          <label className="tt-label" htmlFor="np-kind">Kind</label>
          <select id="np-kind" className="tt-input" value={v.kind} onChange={set('kind')}>
            {KINDS.map((k) => <option key={k.value} value={k.value}>{k.label}</option>)}
          </select>
          {err('kind')}
        </div>
      </div>
      <div>
        <label className="tt-label" htmlFor="np-family">Engine family</label>
        <input id="np-family" className="tt-input" list="np-families" value={v.engineFamily} onChange={set('engineFamily')} aria-invalid={!!fields['engineFamily']} />
        <datalist id="np-families">{engineFamilies.map((f) => <option key={f} value={f} />)}</datalist>
        {err('engineFamily')}
      </div>
      <div>
        <label className="tt-label" htmlFor="np-description">Description</label>
        <textarea id="np-description" className="tt-input" rows={3} value={v.description} onChange={set('description')} aria-invalid={!!fields['description']} />
        {err('description')}
      </div>
      <StatusRegion status={status} />
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="tt-btn tt-btn-primary" disabled={busy}>{busy ? 'Creating…' : 'Create and open the draft'}</button>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={onCancel}>Cancel</button>
      </div>
    </form>
  );
}
