/**
 * Deviations: the form that asks for one (skip a step, or accept out-of-spec readings), and the
 * waiting panel — where a lead or owner (not the requester) sees "Approve deviation" and "Reject".
 */
import { useState } from 'react';
import type { RunEventDraft } from './use-run-sync';
import type { Step } from '../../domain/procedure/schema';
import { pendingDeviation, type RunSnapshot } from '../../domain/run';
import type { StepPanelProps } from './step-panel';

export function DeviationForm({ step, kind, sync, onCancel }: StepPanelProps & { step: Step; kind: 'skip' | 'out-of-spec'; onCancel?: () => void }) {
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  const submit = () => {
    if (!reason.trim()) {
      setError('Give a reason, so the lead knows what they are approving');
      return;
    }
    setError(null);
    if (sync.record({ type: 'deviation.request', stepId: step.id, kind, reason: reason.trim() })) onCancel?.();
  };
  return (
    <form className="tt-card p-4 space-y-3 border-warn border-2" data-testid="deviation-form" onSubmit={(e) => { e.preventDefault(); submit(); }}>
      <h3 className="text-xl font-semibold">{kind === 'skip' ? 'Skip this step: ask a lead' : 'Readings out of spec: ask a lead to accept them'}</h3>
      <label className="tt-label" htmlFor="deviation-reason">Reason</label>
      <textarea id="deviation-reason" className="tt-input min-h-24" value={reason} maxLength={1000} onChange={(e) => setReason(e.target.value)} aria-invalid={!!error} aria-describedby={error ? 'deviation-error' : undefined} />
      {error && <p id="deviation-error" className="tt-field-error">{error}</p>}
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="tt-btn tt-btn-primary text-xl min-h-16 flex-1" data-primary="true" data-testid="request-deviation">
          Request deviation
        </button>
        {onCancel && <button type="button" className="tt-btn tt-btn-quiet min-h-16" onClick={onCancel}>Cancel</button>}
      </div>
    </form>
  );
}

export function DeviationPending({ step, snapshot, sync }: StepPanelProps & { step: Step; snapshot: RunSnapshot }) {
  const pending = pendingDeviation(snapshot);
  const [note, setNote] = useState('');
  const [rejecting, setRejecting] = useState(false);
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  if (!pending) return null;
  const approve: RunEventDraft = { type: 'deviation.approve', stepId: step.id, ...(note.trim() ? { note: note.trim() } : {}) };
  const canApprove = sync.can(approve);
  const canReject = sync.can({ type: 'deviation.reject', stepId: step.id, reason: 'check' });
  const ownRequest = pending.requestedBy === sync.actor.userId;
  return (
    <div className="space-y-4">
      <div className="flex items-start gap-3 rounded-md border-l-8 border-warn bg-warn-soft px-4 py-4" data-testid="deviation-waiting">
        <svg width="36" height="36" viewBox="0 0 24 24" aria-hidden="true" className="text-warn shrink-0" fill="none" stroke="currentColor" strokeWidth="2.2"><circle cx="12" cy="12" r="9" /><path d="M12 7v5l3 3" strokeLinecap="round" /></svg>
        <div>
          <p className="text-2xl font-bold">Waiting for a lead to approve the deviation</p>
          <p>
            {pending.kind === 'skip' ? 'Skip requested' : 'Out-of-spec readings'} by {sync.nameOf(pending.requestedBy)}: “{pending.reason}”
          </p>
          {ownRequest && <p className="text-muted">You asked; another lead or owner decides. This page updates by itself.</p>}
        </div>
      </div>
      {(canApprove || canReject) && (
        <div className="tt-card p-4 space-y-3">
          {!rejecting ? (
            <>
              <label className="tt-label" htmlFor="approve-note">Note (optional)</label>
              <input id="approve-note" className="tt-input" value={note} onChange={(e) => setNote(e.target.value)} />
              <div className="flex flex-wrap gap-3">
                <button type="button" className="tt-btn tt-btn-primary text-xl min-h-16 flex-1" data-primary="true" disabled={!canApprove} onClick={() => sync.record(approve)} data-testid="approve-deviation">
                  Approve deviation
                </button>
                <button type="button" className="tt-btn tt-btn-quiet min-h-16" disabled={!canReject} onClick={() => setRejecting(true)} data-testid="reject-deviation">
                  Reject…
                </button>
              </div>
            </>
          ) : (
            <form
              className="space-y-3"
              onSubmit={(e) => {
                e.preventDefault();
                if (!reason.trim()) return setError('Say why, so the technician knows what to redo');
                sync.record({ type: 'deviation.reject', stepId: step.id, reason: reason.trim() });
              }}
            >
              <label className="tt-label" htmlFor="reject-reason">Why is it rejected?</label>
              <textarea id="reject-reason" className="tt-input min-h-20" value={reason} onChange={(e) => setReason(e.target.value)} aria-invalid={!!error} />
              {error && <p className="tt-field-error">{error}</p>}
              <div className="flex gap-3">
                <button type="submit" className="tt-btn tt-btn-danger min-h-16 flex-1" data-primary="true">Reject deviation</button>
                <button type="button" className="tt-btn tt-btn-quiet min-h-16" onClick={() => setRejecting(false)}>Back</button>
              </div>
            </form>
          )}
        </div>
      )}
    </div>
  );
}
