/** Leads and owners change a procedure's name, engine family or description (kind and key stay). */
import { useState } from 'react';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { ProcedureDto } from '../../server/services/procedure-dto';

export function ProcedureDetailsForm({ procedure, onDone }: { procedure: ProcedureDto; onDone: (p: ProcedureDto | null) => void }) {
  const [v, setV] = useState({ name: procedure.name, engineFamily: procedure.engineFamily, description: procedure.description });
  const [fields, setFields] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof typeof v) => (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement>) => setV({ ...v, [k]: e.target.value });
  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    if (!v.name.trim()) return setFields({ name: 'Give the procedure a name' });
    setBusy(true);
    try {
      onDone(await api<ProcedureDto>(`/api/procedures/${procedure.id}`, { method: 'PATCH', body: v }));
    } catch (err) {
      setBusy(false);
      if (isApiError(err)) {
        setFields(err.fields);
        setStatus({ kind: 'error', message: err.message });
      } else setStatus({ kind: 'error', message: 'The details could not be saved; try again.' });
    }
  };
  return (
    <form className="tt-card p-5 space-y-4" onSubmit={submit} noValidate aria-labelledby="pd-title">
      <h2 id="pd-title" className="text-xl font-semibold">Procedure details</h2>
      <div>
        <label className="tt-label" htmlFor="pd-name">Name</label>
        <input id="pd-name" className="tt-input" value={v.name} onChange={set('name')} aria-invalid={!!fields['name']} />
        {fields['name'] && <p className="tt-field-error">{fields['name']}</p>}
      </div>
      <div>
        <label className="tt-label" htmlFor="pd-family">Engine family</label>
        <input id="pd-family" className="tt-input" value={v.engineFamily} onChange={set('engineFamily')} aria-invalid={!!fields['engineFamily']} />
        {fields['engineFamily'] && <p className="tt-field-error">{fields['engineFamily']}</p>}
      </div>
      <div>
        <label className="tt-label" htmlFor="pd-description">Description</label>
        <textarea id="pd-description" className="tt-input" rows={4} value={v.description} onChange={set('description')} aria-invalid={!!fields['description']} />
        {fields['description'] && <p className="tt-field-error">{fields['description']}</p>}
      </div>
      <StatusRegion status={status} />
      <div className="flex gap-3">
        <button type="submit" className="tt-btn tt-btn-primary" disabled={busy}>{busy ? 'Saving…' : 'Save details'}</button>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => onDone(null)}>Cancel</button>
      </div>
    </form>
  );
}
