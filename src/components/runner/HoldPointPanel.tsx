/**
 * A hold point: the run waits until a signer signs it. Signing needs the password re-entry and
 * the signed record, so a signer gets a link to the sign-off page rather than a button here.
 */
import type { StepOf } from '../../domain/procedure/schema';
import { nextExpected, type RunSnapshot } from '../../domain/run';
import type { StepPanelProps } from './step-panel';

/** The sign-off page for one hold point (its query parameter is `step`). */
export const holdSignoffHref = (runId: string, stepId: string) => `/runs/${runId}/signoff?step=${encodeURIComponent(stepId)}`;

export function HoldPointPanel({ step, snapshot, sync }: StepPanelProps & { step: StepOf<'hold-point'>; snapshot: RunSnapshot }) {
  // The machine decides whether this viewer signs this hold point now; the meaning is chosen on the sign-off page.
  const maySign = sync.can({ type: 'hold.sign', stepId: step.id, meaning: 'checked' });
  return (
    <div className="space-y-4">
      <div className="flex items-center gap-3 rounded-md border-l-8 border-hold bg-hold-soft px-4 py-4" data-testid="hold-waiting">
        <svg width="36" height="36" viewBox="0 0 24 24" aria-hidden="true" className="text-hold shrink-0" fill="currentColor"><rect x="5" y="4" width="5" height="16" rx="1" /><rect x="14" y="4" width="5" height="16" rx="1" /></svg>
        <p className="text-2xl font-bold">{nextExpected(snapshot)?.description ?? 'Waiting for a reviewer to sign'}</p>
      </div>
      {maySign && (
        <div className="tt-card p-4 space-y-3">
          <p className="text-lg">You sign this hold point. Check the work it covers, choose the meaning of your signature and confirm with your password.</p>
          <a className="tt-btn tt-btn-primary w-full text-2xl min-h-16" data-primary="true" href={holdSignoffHref(sync.runId, step.id)} data-testid="review-hold">
            <span aria-hidden="true">✎</span> Review and sign
          </a>
        </div>
      )}
    </div>
  );
}
