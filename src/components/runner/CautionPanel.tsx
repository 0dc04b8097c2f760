/** A caution step: read it, then acknowledge (A) — or continue when acknowledging is not required. */
import type { StepOf } from '../../domain/procedure/schema';
import type { RunEventDraft } from './use-run-sync';
import { HazardCautions } from './HazardCautions';
import type { StepPanelProps } from './step-panel';

const SEVERITY: Record<StepOf<'caution'>['severity'], string> = { notice: 'Notice', caution: 'Caution', warning: 'Warning', danger: 'Danger' };

export function CautionPanel({ step, sync }: StepPanelProps & { step: StepOf<'caution'> }) {
  const event: RunEventDraft = step.mustAcknowledge ? { type: 'caution.acknowledge', stepId: step.id } : { type: 'step.complete', stepId: step.id };
  const can = sync.can(event);
  return (
    <div className="space-y-4">
      <p className="inline-flex items-center gap-2 text-2xl font-bold text-warn" data-testid="caution-severity">
        <svg width="32" height="32" viewBox="0 0 24 24" aria-hidden="true"><path d="M12 2.8 22 20.5H2z" fill="currentColor" /><path d="M12 9v5.5M12 17.2v.3" stroke="var(--color-surface)" strokeWidth="2.6" strokeLinecap="round" /></svg>
        {SEVERITY[step.severity]}
      </p>
      <HazardCautions hazards={step.hazards} />
      <button type="button" className="tt-btn tt-btn-primary w-full text-2xl min-h-16" data-primary="true" data-ack="true" disabled={!can} onClick={() => sync.record(event)} data-testid="acknowledge-caution">
        {step.mustAcknowledge ? 'Acknowledge caution (A)' : 'I have read it — continue'}
      </button>
    </div>
  );
}
