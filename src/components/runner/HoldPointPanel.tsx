/** A hold point: the run waits until a signer signs it. Signers see "Sign hold point" with a meaning. */
import { useState } from 'react';
import type { StepOf } from '../../domain/procedure/schema';
import { nextExpected, type RunSnapshot } from '../../domain/run';
import type { StepPanelProps } from './step-panel';

export const SIGN_MEANINGS = ['reviewed', 'approved for assembly', 'approved for release'] as const;

export function HoldPointPanel({ step, snapshot, sync }: StepPanelProps & { step: StepOf<'hold-point'>; snapshot: RunSnapshot }) {
  const [meaning, setMeaning] = useState<string>(SIGN_MEANINGS[0]);
  const event = { type: 'hold.sign', stepId: step.id, meaning };
  const canSign = sync.can(event);
  return (
    <div className="space-y-4">
      <div className="flex items-center gap-3 rounded-md border-l-8 border-hold bg-hold-soft px-4 py-4" data-testid="hold-waiting">
        <svg width="36" height="36" viewBox="0 0 24 24" aria-hidden="true" className="text-hold shrink-0" fill="currentColor"><rect x="5" y="4" width="5" height="16" rx="1" /><rect x="14" y="4" width="5" height="16" rx="1" /></svg>
        <p className="text-2xl font-bold">{nextExpected(snapshot)?.description ?? 'Waiting for a reviewer to sign'}</p>
      </div>
      {canSign && (
        <div className="tt-card p-4 space-y-3">
          <label className="tt-label" htmlFor="sign-meaning">Meaning of your signature</label>
          <select id="sign-meaning" className="tt-input text-lg" value={meaning} onChange={(e) => setMeaning(e.target.value)}>
            {SIGN_MEANINGS.map((m) => <option key={m} value={m}>{m[0]!.toUpperCase() + m.slice(1)}</option>)}
          </select>
          <p className="text-muted">Sign-off with password re-entry comes later; this records your name, role, the time and the meaning.</p>
          <button type="button" className="tt-btn tt-btn-primary w-full text-2xl min-h-16" data-primary="true" onClick={() => sync.record(event)} data-testid="sign-hold">
            Sign hold point
          </button>
        </div>
      )}
    </div>
  );
}
