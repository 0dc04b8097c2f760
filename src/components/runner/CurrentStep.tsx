/** The step being worked, large: its text, hazards, and the panel for its kind and phase. */
import { useState } from 'react';
import type { Step } from '../../domain/procedure/schema';
import { renderRichTextHtml } from '../../domain/procedure/rich-text';
import { runPhase, stepRecord, type RunSnapshot } from '../../domain/run';
import { CautionPanel } from './CautionPanel';
import { DeviationForm, DeviationPending } from './DeviationPanel';
import { FastenerStep } from './FastenerStep';
import { HazardCautions } from './HazardCautions';
import { HoldPointPanel } from './HoldPointPanel';
import { MeasureStep } from './MeasureStep';
import { StartPanel, SkipButton } from './StartPanel';
import { WorkPanel } from './WorkPanel';
import type { StepPanelProps } from './step-panel';

export const KIND_WORDS: Record<Step['kind'], string> = {
  action: 'Action',
  'fastener-sequence': 'Fastener sequence',
  torque: 'Torque',
  measure: 'Measurement',
  'tag-part': 'Tag parts',
  inspect: 'Inspection',
  caution: 'Caution',
  'hold-point': 'Hold point',
  replace: 'Parts to replace',
};

export function CurrentStep({ step, index, total, snapshot, sync, units }: StepPanelProps & { step: Step; index: number; total: number; snapshot: RunSnapshot }) {
  const [skipping, setSkipping] = useState(false);
  const phase = runPhase(snapshot);
  const record = stepRecord(snapshot, step.id);
  const props = { sync, units };
  let panel: React.ReactNode;
  if (phase === 'deviationPending') panel = <DeviationPending step={step} snapshot={snapshot} {...props} />;
  else if (phase === 'outOfSpec')
    panel = (
      <>
        {step.kind === 'measure' && <MeasureStep step={step} snapshot={snapshot} editable={false} {...props} />}
        <DeviationForm step={step} kind="out-of-spec" {...props} />
      </>
    );
  else if (skipping) panel = <DeviationForm step={step} kind="skip" onCancel={() => setSkipping(false)} {...props} />;
  else if (step.kind === 'caution') panel = <CautionPanel step={step} {...props} />;
  else if (step.kind === 'hold-point') panel = <HoldPointPanel step={step} snapshot={snapshot} {...props} />;
  else if (phase === 'ready') panel = <StartPanel step={step} onSkip={() => setSkipping(true)} {...props} />;
  else if (step.kind === 'fastener-sequence')
    panel = (
      <>
        <FastenerStep step={step} snapshot={snapshot} {...props} />
        <div className="mt-3"><SkipButton step={step} sync={sync} onSkip={() => setSkipping(true)} /></div>
      </>
    );
  else if (step.kind === 'measure')
    panel = (
      <>
        <MeasureStep step={step} snapshot={snapshot} editable {...props} />
        <div className="mt-3"><SkipButton step={step} sync={sync} onSkip={() => setSkipping(true)} /></div>
      </>
    );
  else panel = <WorkPanel step={step} onSkip={() => setSkipping(true)} {...props} />;

  return (
    <article className="tt-card p-5 space-y-4" aria-labelledby="current-step-title" data-testid="current-step" data-step-id={step.id} data-kind={step.kind} data-phase={phase}>
      <header>
        <p className="text-muted font-semibold">
          Step {index + 1} of {total} · {KIND_WORDS[step.kind]}
          {step.section ? ` · ${step.section}` : ''}
        </p>
        <h2 id="current-step-title" className="text-3xl font-bold leading-tight">{step.title}</h2>
      </header>
      {step.body && <div className="text-lg space-y-2 [&_ul]:list-disc [&_ul]:pl-6" dangerouslySetInnerHTML={{ __html: renderRichTextHtml(step.body) }} />}
      {step.kind !== 'caution' && step.hazards.length > 0 && <HazardCautions hazards={step.hazards} />}
      {record?.lastRejection && phase !== 'deviationPending' && (
        <p className="tt-status rounded-md px-4 py-3" data-kind="error" data-testid="last-rejection">
          Deviation rejected by {sync.nameOf(record.lastRejection.by)}: “{record.lastRejection.reason}”. Carry on with the step.
        </p>
      )}
      {panel}
    </article>
  );
}
