/**
 * Sign-off of a run or one hold point: everything the signature covers (steps, readings against
 * spec, deviations, tags, photos), the signatures already made and whether they still match,
 * the meaning, the password re-entry, and sending work back with a reason.
 */
import { useEffect, useState } from 'react';
import { MEANING_LABELS, SIGNOFF_MEANINGS, type SignoffMeaning } from '../../domain/signoff';
import { api, isApiError } from '../../lib/api-client';
import type { ReportData } from '../../server/reports/report-data';
import type { SignatureDto } from '../../server/services/signoff.service';
import { StatusRegion, type Status } from '../ui/StatusRegion';

type Props = {
  runId: string;
  jobId: string;
  jobCode: string;
  stepId: string | null;
  stepTitle: string | null;
  data: ReportData;
  coveredStepIds: string[];
  signatures: SignatureDto[];
  canSign: boolean;
  refusal: string | null;
  canSendBack: boolean;
  finishedSteps: Array<{ id: string; label: string }>;
};

export function MatchMark({ matches }: { matches: boolean }) {
  return matches ? (
    <span className="inline-flex items-center gap-1 font-semibold text-ok" data-testid="sig-match"><span aria-hidden="true">✔</span> Record unchanged</span>
  ) : (
    <span className="inline-flex items-center gap-1 font-semibold text-danger" data-testid="sig-changed"><span aria-hidden="true">⚠</span> Record changed after signing</span>
  );
}

const Verdict = ({ inSpec }: { inSpec: boolean | null }) =>
  inSpec === null ? <span className="text-muted">○ Not read</span> : inSpec ? <span className="text-ok font-semibold">✔ In spec</span> : <span className="text-danger font-semibold">✖ Out of spec</span>;

export default function SignoffPanel(p: Props) {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  const [signatures, setSignatures] = useState(p.signatures);
  const [meaning, setMeaning] = useState<SignoffMeaning>(p.stepId ? 'approved-for-assembly' : 'reviewed');
  const [password, setPassword] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<Status>(null);
  const [busy, setBusy] = useState(false);
  const [signed, setSigned] = useState(false);
  const [backStep, setBackStep] = useState(p.finishedSteps.at(-1)?.id ?? '');
  const [reason, setReason] = useState('');

  const covered = new Set(p.coveredStepIds);
  const readings = p.data.readings.filter((r) => covered.has(r.stepId));
  const deviations = p.data.deviations.filter((d) => covered.has(d.stepId));
  const tags = p.data.tags.filter((t) => t.stepId === null || covered.has(t.stepId));
  const steps = p.data.steps.filter((s) => covered.has(s.stepId));

  async function sign(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setFields({});
    setStatus(null);
    try {
      const sig = await api<SignatureDto>(`/api/runs/${p.runId}/signoffs`, { body: { meaning, password, ...(p.stepId ? { stepId: p.stepId } : {}) } });
      setSignatures((s) => [...s, sig]);
      setPassword('');
      setSigned(true);
      setStatus({ kind: 'ok', message: `Signed: ${sig.meaningLabel}, ${sig.signedAt.slice(0, 16).replace('T', ' ')} UTC. Record hash ${sig.recordHash.slice(0, 12)}…` });
    } catch (err) {
      if (isApiError(err)) {
        setFields(err.fields);
        setStatus({ kind: 'error', message: err.message });
      } else setStatus({ kind: 'error', message: 'The signature could not be saved; try again.' });
    } finally {
      setBusy(false);
    }
  }

  async function sendBack(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setStatus(null);
    try {
      await api(`/api/runs/${p.runId}/send-back`, { body: { stepId: backStep, reason } });
      setStatus({ kind: 'ok', message: 'Work sent back. The technicians are told by e-mail; the traveler reopens at that step.' });
      setReason('');
      setSignatures((s) => s.map((x) => ({ ...x, matches: false })));
    } catch (err) {
      setStatus({ kind: 'error', message: isApiError(err) ? err.message : 'The work could not be sent back; try again.' });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6" data-hydrated={hydrated ? 'true' : undefined}>
      {p.data.exampleData && <p className="tt-status rounded-md px-4 py-2" data-kind="info">⚑ Example data — not a maker's specification.</p>}
      <StatusRegion status={status} />

      <section className="tt-card p-5 space-y-3" aria-labelledby="covers">
        <h2 id="covers" className="text-xl font-bold">What this signature covers</h2>
        <p className="text-muted">{p.stepId ? `Steps 1–${steps.length} before hold point "${p.stepTitle}"` : `All ${steps.length} steps of the run`} · {p.data.photos} photo{p.data.photos === 1 ? '' : 's'} on the run</p>
        <div className="overflow-x-auto relative"><table className="w-full text-base" data-testid="covered-steps">
          <thead className="bg-sunken"><tr><th className="text-left p-2">#</th><th className="text-left p-2">Step</th><th className="text-left p-2">State</th><th className="text-left p-2">By</th><th className="text-left p-2">Note</th></tr></thead>
          <tbody>{steps.map((s) => <tr key={s.stepId} className="border-t border-line"><td className="p-2">{s.n}</td><td className="p-2">{s.title}</td><td className="p-2">{s.state}</td><td className="p-2">{s.by}</td><td className="p-2">{s.note}</td></tr>)}</tbody>
        </table></div>
      </section>

      <section className="tt-card p-5 space-y-3" aria-labelledby="readings">
        <h2 id="readings" className="text-xl font-bold">Readings against spec</h2>
        {readings.length === 0 ? <p className="text-muted">No readings.</p> : (
          <div className="overflow-x-auto relative"><table className="w-full text-base" data-testid="covered-readings">
            <thead className="bg-sunken"><tr><th className="text-left p-2">Step</th><th className="text-left p-2">Position</th><th className="text-left p-2">Readings</th><th className="text-left p-2">Spec</th><th className="text-left p-2">Result</th><th className="text-left p-2">Verdict</th></tr></thead>
            <tbody>{readings.map((r) => <tr key={`${r.stepId}-${r.position}`} className="border-t border-line"><td className="p-2">{r.step}</td><td className="p-2">{r.position}</td><td className="p-2">{r.readings}</td><td className="p-2">{r.spec}</td><td className="p-2">{r.result}</td><td className="p-2"><Verdict inSpec={r.inSpec} /></td></tr>)}</tbody>
          </table></div>
        )}
      </section>

      <section className="grid gap-4 md:grid-cols-2">
        <div className="tt-card p-5 space-y-2">
          <h2 className="text-xl font-bold">Deviations</h2>
          {deviations.length === 0 ? <p className="text-muted">None.</p> : <ul className="space-y-2">{deviations.map((d, i) => <li key={i}><strong>{d.step}</strong> — {d.kind}: {d.reason} <span className="text-muted">(asked by {d.requestedBy}; {d.decision})</span></li>)}</ul>}
        </div>
        <div className="tt-card p-5 space-y-2">
          <h2 className="text-xl font-bold">Tags</h2>
          {tags.length === 0 ? <p className="text-muted">No parts tagged.</p> : <ul className="space-y-1" data-testid="covered-tags">{tags.map((t, i) => <li key={i}>{t.part} {t.position} — <strong>{t.disposition}</strong>{t.bin ? `, bin ${t.bin}` : ''}{t.photos ? `, ${t.photos} photo${t.photos === 1 ? '' : 's'}` : ''}</li>)}</ul>}
        </div>
      </section>

      <section className="tt-card p-5 space-y-3" aria-labelledby="sigs">
        <h2 id="sigs" className="text-xl font-bold">Signatures</h2>
        {signatures.length === 0 ? <p className="text-muted">Not signed yet.</p> : (
          <ul className="space-y-2" data-testid="signatures">
            {signatures.map((s) => (
              <li key={s.id} className="border-l-4 border-line pl-3" data-testid="signature">
                <div><strong>{s.signerName}</strong> ({s.signerRole}) · {s.meaningLabel} · {s.scope} · {s.signedAt.slice(0, 16).replace('T', ' ')} UTC</div>
                <div className="text-sm text-muted break-all">SHA-256 {s.recordHash}</div>
                <MatchMark matches={s.matches} />
              </li>
            ))}
          </ul>
        )}
      </section>

      {p.canSign && !signed && (
        <form className="tt-card p-5 space-y-4" onSubmit={sign} aria-labelledby="sign-h" data-testid="sign-form">
          <h2 id="sign-h" className="text-xl font-bold">{p.stepId ? 'Sign the hold point' : 'Sign off the run'}</h2>
          <fieldset className="space-y-2">
            <legend className="tt-label">Meaning of your signature</legend>
            {SIGNOFF_MEANINGS.map((m) => (
              <label key={m} className="flex items-center gap-3 min-h-12 text-lg">
                <input type="radio" name="meaning" value={m} checked={meaning === m} onChange={() => setMeaning(m)} className="w-6 h-6" /> {MEANING_LABELS[m]}
              </label>
            ))}
          </fieldset>
          <div>
            <label className="tt-label" htmlFor="sign-password">Your password (to confirm it is you)</label>
            <input id="sign-password" type="password" autoComplete="current-password" className="tt-input max-w-sm" value={password} onChange={(e) => setPassword(e.target.value)} aria-invalid={fields.password ? true : undefined} aria-describedby={fields.password ? 'sign-password-error' : undefined} />
            {fields.password && <p id="sign-password-error" className="tt-field-error">{fields.password}</p>}
          </div>
          <button type="submit" className="tt-btn tt-btn-primary text-xl min-h-14" disabled={busy} data-testid="sign-submit">✎ Sign as {MEANING_LABELS[meaning].toLowerCase()}</button>
        </form>
      )}
      {!p.canSign && p.refusal && <p className="tt-status rounded-md px-4 py-3" data-kind="info" data-testid="sign-refusal">ⓘ {p.refusal}</p>}

      {p.canSendBack && p.finishedSteps.length > 0 && (
        <form className="tt-card p-5 space-y-3 tt-no-print" onSubmit={sendBack} aria-labelledby="back-h">
          <h2 id="back-h" className="text-xl font-bold">Send work back</h2>
          <div>
            <label className="tt-label" htmlFor="back-step">Reopen at step</label>
            <select id="back-step" className="tt-input" value={backStep} onChange={(e) => setBackStep(e.target.value)}>
              {p.finishedSteps.map((s) => <option key={s.id} value={s.id}>{s.label}</option>)}
            </select>
          </div>
          <div>
            <label className="tt-label" htmlFor="back-reason">Reason (the technicians see it)</label>
            <textarea id="back-reason" className="tt-input min-h-24" value={reason} onChange={(e) => setReason(e.target.value)} />
          </div>
          <button type="submit" className="tt-btn tt-btn-quiet" disabled={busy || !reason.trim()}>↩ Send back</button>
        </form>
      )}
      <p className="tt-no-print"><a className="underline" href={`/api/runs/${p.runId}/report.pdf`}>Open the {p.data.title.toLowerCase()} (PDF)</a> · <a className="underline" href={`/jobs/${p.jobId}`}>Job {p.jobCode}</a> · <a className="underline" href={`/runs/${p.runId}`}>Traveler</a></p>
    </div>
  );
}
