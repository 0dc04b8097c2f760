/**
 * /procedures/[id]: the procedure's details and its revisions, with what the member's role may
 * do to each (open the draft, release, retire, start a new draft, derive an assembly, export),
 * and a compare picker. Every action reloads the procedure and reports in the status region.
 */
import { useEffect, useState } from 'react';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { ProcedureDto, RevisionDto, RevisionSummaryDto } from '../../server/services/procedure-dto';
import { ProcedureDetailsForm } from './ProcedureDetailsForm';
import { RevisionStatusMark, when } from './RevisionStatusMark';

type Props = { initial: ProcedureDto; canAuthor: boolean; canRelease: boolean; canRetire: boolean; canCreate: boolean };

const revName = (r: Pick<RevisionSummaryDto, 'number' | 'status'>) => (r.number != null ? `Revision ${r.number}` : 'Draft');
const exportHref = (p: ProcedureDto, r: RevisionSummaryDto) => `/api/procedures/${p.id}/export?revision=${r.id}`;

export default function ProcedureDetail({ initial, canAuthor, canRelease, canRetire, canCreate }: Props) {
  const [p, setP] = useState(initial);
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);
  const [releasing, setReleasing] = useState<string | null>(null);
  const [releaseNote, setReleaseNote] = useState('');
  const [editing, setEditing] = useState(false);
  /** Retiring and deleting cannot be undone, so each asks once more in place. */
  const [confirming, setConfirming] = useState<{ id: string; what: 'retire' | 'delete' } | null>(null);
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  const frozen = p.revisions.filter((r) => r.status !== 'draft');
  const [cmpA, setCmpA] = useState(frozen[1]?.id ?? frozen[0]?.id ?? '');
  const [cmpB, setCmpB] = useState(p.revisions[0]?.id ?? '');

  const reload = async () => setP(await api<ProcedureDto>(`/api/procedures/${p.id}`));
  const act = async (what: () => Promise<string | void>) => {
    setBusy(true);
    setStatus(null);
    try {
      const message = await what();
      if (message) setStatus({ kind: 'ok', message });
    } catch (e) {
      setStatus({ kind: 'error', message: isApiError(e) ? e.message : 'That did not work. Nothing was lost; try again.' });
      await reload().catch(() => undefined);
    } finally {
      setBusy(false);
    }
  };
  const release = (r: RevisionSummaryDto) => act(async () => {
    const out = await api<RevisionDto>(`/api/revisions/${r.id}/release`, { body: { note: releaseNote } });
    setReleasing(null);
    await reload();
    return `${revName(out)} is released. Technicians can now run it.`;
  });
  const retire = (r: RevisionSummaryDto) => act(async () => {
    await api<RevisionDto>(`/api/revisions/${r.id}/retire`, { method: 'POST' });
    await reload();
    return `${revName(r)} is retired. Runs already on it keep it; new runs cannot start on it.`;
  });
  const newDraft = (r: RevisionSummaryDto) => act(async () => {
    const d = await api<RevisionDto>(`/api/procedures/${p.id}/drafts`, { body: { fromRevisionId: r.id } });
    window.location.assign(`/revisions/${d.id}/edit`);
  });
  const removeDraft = (r: RevisionSummaryDto) => act(async () => {
    await api<null>(`/api/revisions/${r.id}`, { method: 'DELETE' });
    await reload();
    return 'The draft was deleted.';
  });
  const derive = (r: RevisionSummaryDto) => act(async () => {
    const out = await api<{ procedure: ProcedureDto; draft: RevisionDto }>(`/api/revisions/${r.id}/derive-assembly`, { method: 'POST' });
    window.location.assign(`/procedures/${out.procedure.id}`);
  });

  const draft = p.revisions.find((r) => r.status === 'draft');
  const latest = p.revisions.find((r) => r.status === 'released');
  return (
    <div data-hydrated={hydrated ? 'true' : undefined} className="space-y-6">
      <header className="flex flex-wrap items-start gap-3">
        <div className="mr-auto">
          <p className="text-muted"><a href="/procedures" className="underline">Procedures</a> · {p.kind} · <code>{p.key}</code></p>
          <h1 className="text-3xl font-bold" data-testid="procedure-name">{p.name}</h1>
          <p className="text-muted">{p.engineFamily || 'No engine family given'}</p>
          {p.derivedFrom && <p>Derived from <a className="underline text-accent" href={`/procedures/${p.derivedFrom.procedureId}`}>{p.derivedFrom.procedureName}{p.derivedFrom.number != null ? `, revision ${p.derivedFrom.number}` : ''}</a></p>}
        </div>
        {draft && canAuthor && <a className="tt-btn tt-btn-primary" href={`/revisions/${draft.id}/edit`} data-testid="open-draft">Open the draft in the editor</a>}
        {!draft && latest && canAuthor && <button type="button" className="tt-btn tt-btn-primary" disabled={busy} onClick={() => newDraft(latest)} data-testid="new-draft">Start a new draft from {revName(latest).toLowerCase()}</button>}
        {canAuthor && !editing && <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setEditing(true)}>Edit details</button>}
      </header>
      {editing && <ProcedureDetailsForm procedure={p} onDone={(next) => { if (next) setP(next); setEditing(false); }} />}
      {p.description && <p className="whitespace-pre-line max-w-prose">{p.description}</p>}
      <StatusRegion status={status} />

      <section aria-labelledby="revs-title">
        <h2 id="revs-title" className="text-2xl font-semibold mb-2">Revisions</h2>
        <div className="tt-card overflow-x-auto">
          <table className="w-full text-left" data-testid="revisions-table">
            <thead className="bg-sunken">
              <tr><th className="px-3 py-2">Revision</th><th className="px-3 py-2">Status</th><th className="px-3 py-2">Note</th><th className="px-3 py-2">Steps</th><th className="px-3 py-2">Written</th><th className="px-3 py-2">Released / retired</th><th className="px-3 py-2 tt-no-print">Actions</th></tr>
            </thead>
            <tbody>
              {p.revisions.map((r) => (
                <tr key={r.id} className="border-t border-line align-top" data-revision-status={r.status} data-revision-number={r.number ?? 'draft'}>
                  <td className="px-3 py-2 font-semibold whitespace-nowrap">{revName(r)}</td>
                  <td className="px-3 py-2"><RevisionStatusMark status={r.status} /></td>
                  <td className="px-3 py-2 max-w-80">{r.note || <span className="text-muted">—</span>}</td>
                  <td className="px-3 py-2">{r.stepCount}</td>
                  <td className="px-3 py-2 text-sm">{r.createdBy?.name ?? '—'}<span className="block text-muted">{when(r.createdAt)}</span></td>
                  <td className="px-3 py-2 text-sm">
                    {r.releasedAt && <span className="block">Released by {r.releasedBy?.name ?? '—'}, {when(r.releasedAt)}</span>}
                    {r.retiredAt && <span className="block">Retired by {r.retiredBy?.name ?? '—'}, {when(r.retiredAt)}</span>}
                  </td>
                  <td className="px-3 py-2 tt-no-print">
                    <div className="flex flex-wrap gap-2">
                      {r.status === 'draft' && canAuthor && <a className="tt-btn tt-btn-quiet" href={`/revisions/${r.id}/edit`}>Edit</a>}
                      {r.status === 'draft' && canRelease && releasing !== r.id && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy || r.stepCount === 0} title={r.stepCount === 0 ? 'Add a step first' : undefined} onClick={() => { setReleasing(r.id); setReleaseNote(r.note); }}>Release…</button>}
                      {r.status === 'draft' && canAuthor && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy} onClick={() => setConfirming({ id: r.id, what: 'delete' })}>Delete draft</button>}
                      {r.status !== 'draft' && canAuthor && !draft && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy} onClick={() => newDraft(r)}>New draft from this</button>}
                      {r.status === 'released' && canRetire && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy} onClick={() => setConfirming({ id: r.id, what: 'retire' })}>Retire…</button>}
                      {p.kind === 'teardown' && canCreate && r.stepCount > 0 && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy} onClick={() => derive(r)}>Derive assembly</button>}
                      <a className="tt-btn tt-btn-quiet" href={exportHref(p, r)} download>Export JSON</a>
                    </div>
                    {confirming?.id === r.id && (
                      <div className="mt-3 p-3 rounded-md bg-danger-soft space-y-2" role="group" aria-label={confirming.what === 'retire' ? `Retire ${revName(r).toLowerCase()}` : 'Delete the draft'}>
                        <p>{confirming.what === 'retire' ? `Retire ${revName(r).toLowerCase()}? No new run can start on it; this cannot be undone.` : 'Delete this draft and every change in it? This cannot be undone.'}</p>
                        <div className="flex gap-2">
                          <button type="button" className="tt-btn tt-btn-danger" disabled={busy} onClick={() => { setConfirming(null); void (confirming.what === 'retire' ? retire(r) : removeDraft(r)); }}>{confirming.what === 'retire' ? 'Yes, retire it' : 'Yes, delete the draft'}</button>
                          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setConfirming(null)}>Keep it</button>
                        </div>
                      </div>
                    )}
                    {r.status === 'draft' && r.stepCount === 0 && <p className="text-muted text-sm mt-1">Add at least one step before release.</p>}
                    {releasing === r.id && (
                      <form className="mt-3 space-y-2" onSubmit={(e) => { e.preventDefault(); void release(r); }} aria-label="Release this draft">
                        <label className="tt-label" htmlFor={`note-${r.id}`}>Release note</label>
                        <textarea id={`note-${r.id}`} className="tt-input" rows={2} value={releaseNote} onChange={(e) => setReleaseNote(e.target.value)} placeholder="What changed and why" />
                        <p className="text-sm text-muted">Once released, this revision gets the next number and can never change.</p>
                        <div className="flex gap-2">
                          <button type="submit" className="tt-btn tt-btn-primary" disabled={busy}>Release</button>
                          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setReleasing(null)}>Cancel</button>
                        </div>
                      </form>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      {p.revisions.length > 1 && (
        <section aria-labelledby="cmp-title" className="tt-card p-4 tt-no-print">
          <h2 id="cmp-title" className="text-xl font-semibold mb-2">Compare two revisions</h2>
          <form className="flex flex-wrap items-end gap-3" action="/revisions/compare" method="get">
            <div>
              <label className="tt-label" htmlFor="cmp-a">From</label>
              <select id="cmp-a" name="a" className="tt-input" value={cmpA} onChange={(e) => setCmpA(e.target.value)}>
                {p.revisions.map((r) => <option key={r.id} value={r.id}>{revName(r)}</option>)}
              </select>
            </div>
            <div>
              <label className="tt-label" htmlFor="cmp-b">To</label>
              <select id="cmp-b" name="b" className="tt-input" value={cmpB} onChange={(e) => setCmpB(e.target.value)}>
                {p.revisions.map((r) => <option key={r.id} value={r.id}>{revName(r)}</option>)}
              </select>
            </div>
            <a className="tt-btn tt-btn-quiet" href={`/revisions/compare?a=${cmpA}&b=${cmpB}`} aria-disabled={cmpA === cmpB} data-testid="compare-link">Compare</a>
            {cmpA === cmpB && <p className="text-muted">Choose two different revisions.</p>}
          </form>
        </section>
      )}
    </div>
  );
}
