/** A step not yet started: its hazards to acknowledge, Start, and "Skip this step" (a deviation). */
import type { Step } from '../../domain/procedure/schema';
import type { RunEventDraft } from './use-run-sync';
import type { StepPanelProps } from './step-panel';

export function StartPanel({ step, sync, onSkip }: StepPanelProps & { step: Step; onSkip: () => void }) {
  const event: RunEventDraft = { type: 'step.start', stepId: step.id, hazards: step.hazards };
  const can = sync.can(event);
  const hasHazards = step.hazards.length > 0;
  return (
    <div className="flex flex-wrap gap-3">
      <button type="button" className="tt-btn tt-btn-primary text-2xl min-h-16 flex-1" data-primary="true" data-ack={hasHazards ? 'true' : undefined} disabled={!can} onClick={() => sync.record(event)} data-testid="start-step">
        {hasHazards ? 'I have read the cautions — start step' : 'Start step'}
      </button>
      <SkipButton step={step} sync={sync} onSkip={onSkip} />
    </div>
  );
}

export function SkipButton({ step, sync, onSkip }: { step: Step; sync: StepPanelProps['sync']; onSkip: () => void }) {
  const can = sync.can({ type: 'deviation.request', stepId: step.id, kind: 'skip', reason: 'check' });
  if (!can) return null;
  return (
    <button type="button" className="tt-btn tt-btn-quiet min-h-16" onClick={onSkip} data-testid="skip-step">
      Skip this step…
    </button>
  );
}
