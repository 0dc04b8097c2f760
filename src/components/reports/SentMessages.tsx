/**
 * A job's reports leaving the shop: send a run's report by e-mail (queued, with the PDF and a
 * read-only link), make and withdraw read-only links, and see every message's delivery state
 * and every view of every link.
 */
import { useCallback, useEffect, useState } from 'react';
import { api, isApiError } from '../../lib/api-client';
import type { OutgoingMessageDto } from '../../server/services/mail-queue.service';
import type { ShareLinkDto } from '../../server/services/share.service';
import { StatusRegion, type Status } from '../ui/StatusRegion';

type RunOption = { id: string; label: string };
type Props = { jobId: string; runs: RunOption[]; canSend: boolean; canShare: boolean; messages: OutgoingMessageDto[]; links: ShareLinkDto[] };

const STATE: Record<OutgoingMessageDto['status'], { icon: string; word: string; cls: string }> = {
  queued: { icon: '◷', word: 'Queued', cls: 'text-muted' },
  sent: { icon: '✔', word: 'Sent', cls: 'text-ok' },
  failed: { icon: '✖', word: 'Failed', cls: 'text-danger' },
};
const LINK_STATE: Record<ShareLinkDto['state'], string> = { active: '● Active', expired: '◌ Expired', revoked: '⊘ Revoked' };
const when = (iso: string | null) => (iso ? iso.slice(0, 16).replace('T', ' ') : '');

export default function SentMessages(p: Props) {
  const [hydrated, setHydrated] = useState(false);
  const [messages, setMessages] = useState(p.messages);
  const [links, setLinks] = useState(p.links);
  const [status, setStatus] = useState<Status>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [runId, setRunId] = useState(p.runs[0]?.id ?? '');
  const [to, setTo] = useState('');
  const [message, setMessage] = useState('');
  const [days, setDays] = useState(14);
  const [busy, setBusy] = useState(false);
  const [newUrl, setNewUrl] = useState<string | null>(null);
  useEffect(() => setHydrated(true), []);

  const refresh = useCallback(async () => {
    const [m, l] = await Promise.all([
      api<{ messages: OutgoingMessageDto[] }>(`/api/jobs/${p.jobId}/send-report`),
      p.canShare ? api<{ links: ShareLinkDto[] }>(`/api/jobs/${p.jobId}/share-links`) : Promise.resolve({ links: [] as ShareLinkDto[] }),
    ]);
    setMessages(m.messages);
    setLinks(l.links);
  }, [p.jobId, p.canShare]);

  // While anything is queued, look again every two seconds until it is sent or failed.
  useEffect(() => {
    if (!messages.some((m) => m.status === 'queued')) return;
    const t = setTimeout(() => void refresh().catch(() => setStatus({ kind: 'error', message: 'Could not refresh the message list.' })), 2000);
    return () => clearTimeout(t);
  }, [messages, refresh]);

  async function send(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setFields({});
    try {
      const m = await api<OutgoingMessageDto>(`/api/jobs/${p.jobId}/send-report`, { body: { runId, to, message, days } });
      setMessages((ms) => [m, ...ms]);
      setStatus({ kind: 'ok', message: `Report queued for ${m.to}. Its state shows below.` });
      setTo('');
      setMessage('');
      await refresh();
    } catch (err) {
      if (isApiError(err)) setFields(err.fields);
      setStatus({ kind: 'error', message: isApiError(err) ? err.message : 'The report could not be queued; try again.' });
    } finally {
      setBusy(false);
    }
  }

  async function share() {
    setBusy(true);
    try {
      const r = await api<{ link: ShareLinkDto; url: string }>(`/api/jobs/${p.jobId}/share-links`, { body: { runId, days } });
      setNewUrl(r.url);
      setLinks((ls) => [r.link, ...ls]);
      setStatus({ kind: 'ok', message: 'Link made. Copy it now: it is shown only once.' });
    } catch (err) {
      setStatus({ kind: 'error', message: isApiError(err) ? err.message : 'The link could not be made; try again.' });
    } finally {
      setBusy(false);
    }
  }

  async function revoke(id: string) {
    try {
      const l = await api<ShareLinkDto>(`/api/jobs/${p.jobId}/share-links/${id}`, { method: 'DELETE' });
      setLinks((ls) => ls.map((x) => (x.id === id ? l : x)));
      setStatus({ kind: 'ok', message: 'Link withdrawn; it no longer opens.' });
    } catch (err) {
      setStatus({ kind: 'error', message: isApiError(err) ? err.message : 'The link could not be withdrawn; try again.' });
    }
  }

  return (
    <section className="tt-card p-5 space-y-4" data-hydrated={hydrated ? 'true' : undefined} aria-labelledby="reports-h" data-testid="job-reports">
      <h2 id="reports-h" className="text-xl font-bold">Reports and links</h2>
      <StatusRegion status={status} />
      {p.runs.length === 0 ? <p className="text-muted">Start a run to send its report.</p> : (
        <>
          <div className="flex flex-wrap gap-3 items-end">
            <div>
              <label className="tt-label" htmlFor="report-run">Run</label>
              <select id="report-run" className="tt-input" value={runId} onChange={(e) => setRunId(e.target.value)}>
                {p.runs.map((r) => <option key={r.id} value={r.id}>{r.label}</option>)}
              </select>
            </div>
            <div>
              <label className="tt-label" htmlFor="report-days">Link valid for (days)</label>
              <input id="report-days" type="number" min={1} max={90} className="tt-input w-28" value={days} onChange={(e) => setDays(Number(e.target.value))} />
            </div>
            <a className="tt-btn tt-btn-quiet" href={runId ? `/api/runs/${runId}/report.pdf` : undefined}>Open PDF</a>
            {p.canShare && <button type="button" className="tt-btn tt-btn-quiet" disabled={busy || !runId} onClick={() => void share()}>Make read-only link</button>}
          </div>
          {newUrl && <p className="break-all" data-testid="new-share-url">New link: <a className="underline" href={newUrl}>{newUrl}</a></p>}
          {p.canSend && (
            <form className="space-y-3" onSubmit={send}>
              <div>
                <label className="tt-label" htmlFor="report-to">Send to (e-mail)</label>
                <input id="report-to" type="email" className="tt-input max-w-md" value={to} onChange={(e) => setTo(e.target.value)} aria-invalid={fields.to ? true : undefined} />
                {fields.to && <p className="tt-field-error">{fields.to}</p>}
              </div>
              <div>
                <label className="tt-label" htmlFor="report-message">Message</label>
                <textarea id="report-message" className="tt-input min-h-20 max-w-2xl" value={message} onChange={(e) => setMessage(e.target.value)} />
              </div>
              <button type="submit" className="tt-btn tt-btn-primary" disabled={busy || !to || !runId} data-testid="send-report">✉ Send report</button>
            </form>
          )}
        </>
      )}
      <div>
        <h3 className="font-bold text-lg">Messages</h3>
        {messages.length === 0 ? <p className="text-muted">Nothing sent yet.</p> : (
          <div className="overflow-x-auto relative"><table className="w-full text-base" data-testid="sent-messages">
            <thead className="bg-sunken"><tr><th className="text-left p-2">State</th><th className="text-left p-2">To</th><th className="text-left p-2">Subject</th><th className="text-left p-2">Attempts</th><th className="text-left p-2">When</th></tr></thead>
            <tbody>{messages.map((m) => (
              <tr key={m.id} className="border-t border-line" data-testid="sent-message" data-status={m.status}>
                <td className={`p-2 font-semibold ${STATE[m.status].cls}`}><span aria-hidden="true">{STATE[m.status].icon}</span> {STATE[m.status].word}</td>
                <td className="p-2 break-all">{m.to}</td>
                <td className="p-2">{m.subject}{m.lastError && m.status !== 'sent' && <div className="text-sm text-danger">Last error: {m.lastError}</div>}</td>
                <td className="p-2">{m.attempts}</td>
                <td className="p-2 whitespace-nowrap">{when(m.sentAt ?? m.createdAt)}</td>
              </tr>
            ))}</tbody>
          </table></div>
        )}
      </div>
      {p.canShare && (
        <div>
          <h3 className="font-bold text-lg">Read-only links</h3>
          {links.length === 0 ? <p className="text-muted">No links yet.</p> : (
            <ul className="space-y-3" data-testid="share-links">{links.map((l) => (
              <li key={l.id} className="border-l-4 border-line pl-3">
                <div><strong>{LINK_STATE[l.state]}</strong> · {l.procedureName} · by {l.createdBy} {when(l.createdAt)} · until {when(l.expiresAt)}
                  {l.state === 'active' && <button type="button" className="tt-btn tt-btn-quiet ml-2" onClick={() => void revoke(l.id)}>Withdraw</button>}</div>
                <div className="text-sm text-muted">{l.views.length} view{l.views.length === 1 ? '' : 's'}{l.views.length > 0 && ':'}</div>
                {l.views.length > 0 && <ul className="text-sm text-muted">{l.views.slice(0, 10).map((v, i) => <li key={i}>{when(v.at)} · {v.what} · {v.ip || 'unknown address'} · {v.userAgent.slice(0, 60)}</li>)}</ul>}
              </li>
            ))}</ul>
          )}
        </div>
      )}
    </section>
  );
}
