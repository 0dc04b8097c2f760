/** Short words for what a log entry recorded: the runner's conflict notes and the history page share them. */
import type { Step } from '../../domain/procedure/schema';
import type { RunEvent } from '../../domain/run';

const stepTitle = (steps: readonly Step[], id: string) => {
  const i = steps.findIndex((s) => s.id === id);
  return i >= 0 ? `step ${i + 1} “${steps[i]!.title}”` : `step ${id}`;
};

function fastenerLabel(steps: readonly Step[], stepId: string, fastenerId: string): string {
  const step = steps.find((s) => s.id === stepId);
  return step?.kind === 'fastener-sequence' ? (step.map.fasteners.find((f) => f.id === fastenerId)?.label ?? fastenerId) : fastenerId;
}

/** "recorded pass 1, fastener 3", "entered the reading for Main 1 bore: 60.05", … */
export function describeEvent(ev: RunEvent, steps: readonly Step[]): string {
  switch (ev.type) {
    case 'step.start':
      return ev.hazards.length ? `started ${stepTitle(steps, ev.stepId)} (hazards acknowledged)` : `started ${stepTitle(steps, ev.stepId)}`;
    case 'fastener.confirm':
      return `recorded pass ${ev.pass}, fastener ${fastenerLabel(steps, ev.stepId, ev.fastenerId)}`;
    case 'reading.enter': {
      const step = steps.find((s) => s.id === ev.stepId);
      return `entered the reading for ${ev.key}: ${ev.value}${step?.kind === 'measure' ? ` ${step.unit}` : ''}`;
    }
    case 'measure.submit':
      return `submitted the readings of ${stepTitle(steps, ev.stepId)}`;
    case 'caution.acknowledge':
      return `acknowledged the caution ${stepTitle(steps, ev.stepId)}`;
    case 'torque.confirm':
      return `recorded the applied torque ${ev.applied.value} ${ev.applied.unit}`;
    case 'step.complete':
      return `marked ${stepTitle(steps, ev.stepId)} done`;
    case 'deviation.request':
      return ev.kind === 'skip' ? `asked to skip ${stepTitle(steps, ev.stepId)}: “${ev.reason}”` : `asked to accept out-of-spec readings: “${ev.reason}”`;
    case 'deviation.approve':
      return `approved the deviation on ${stepTitle(steps, ev.stepId)}`;
    case 'deviation.reject':
      return `rejected the deviation on ${stepTitle(steps, ev.stepId)}: “${ev.reason}”`;
    case 'hold.sign':
      return `signed the hold point ${stepTitle(steps, ev.stepId)} (${ev.meaning})`;
    case 'run.reopen':
      return `sent ${stepTitle(steps, ev.stepId)} back: “${ev.reason}”`;
  }
}
