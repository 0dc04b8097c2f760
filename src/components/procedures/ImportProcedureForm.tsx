/** Import a procedure file: it becomes a new procedure with a draft; every problem is listed by path. */
import { useRef, useState } from 'react';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { ProcedureDto, RevisionDto } from '../../server/services/procedure-dto';

type Problem = { path: string; message: string };

export function ImportProcedureForm({ onCancel }: { onCancel: () => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [status, setStatus] = useState<Status>(null);
  const [problems, setProblems] = useState<Problem[]>([]);
  const [busy, setBusy] = useState(false);
  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    setProblems([]);
    const file = input.current?.files?.[0];
    if (!file) return setStatus({ kind: 'error', message: 'Choose a procedure file (.json) first.' });
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch {
      return setStatus({ kind: 'error', message: `${file.name} is not a JSON file; nothing was imported.` });
    }
    setBusy(true);
    setStatus({ kind: 'info', message: `Importing ${file.name}…` });
    try {
      const res = await api<{ procedure: ProcedureDto; draft: RevisionDto }>('/api/procedures/import', { body: json });
      window.location.assign(`/procedures/${res.procedure.id}`);
    } catch (err) {
      setBusy(false);
      if (isApiError(err)) {
        const list = err.body['problems'];
        setProblems(Array.isArray(list) ? (list as Problem[]) : []);
        setStatus({ kind: 'error', message: err.message });
      } else setStatus({ kind: 'error', message: 'The file could not be imported; nothing was stored. Try again.' });
    }
  };
  return (
    <form className="tt-card p-5 space-y-4 mb-6" onSubmit={submit} noValidate aria-labelledby="imp-title" data-testid="import-form">
      <h2 id="imp-title" className="text-2xl font-semibold">Import a procedure file</h2>
      <p className="text-muted">A Torquetrail procedure file (.json) becomes a new procedure with a draft you can check before release.</p>
      <div>
        <label className="tt-label" htmlFor="imp-file">Procedure file</label>
        <input id="imp-file" ref={input} type="file" accept="application/json,.json" className="tt-input" />
      </div>
      <StatusRegion status={status} />
      {problems.length > 0 && (
        <ul className="list-disc pl-6 space-y-1" aria-label="Problems in the file" data-testid="import-problems">
          {problems.map((p, i) => (
            <li key={i}><code className="font-semibold">{p.path || '(the file)'}</code>: {p.message}</li>
          ))}
        </ul>
      )}
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="tt-btn tt-btn-primary" disabled={busy}>{busy ? 'Importing…' : 'Import'}</button>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={onCancel}>Cancel</button>
      </div>
    </form>
  );
}
