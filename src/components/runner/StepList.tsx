/** The whole run at a glance: every step with its state (icon + word) and counts where a step has parts. */
import type { Step } from '../../domain/procedure/schema';
import type { StepProgress, StepState } from '../../domain/run';
import { StateMark } from './StateMark';

type Row = { stepId: string; state: StepState; progress?: StepProgress };

export function StepList({ steps, states, cursor }: { steps: readonly Step[]; states: readonly Row[]; cursor: number }) {
  return (
    <ol className="space-y-1" aria-label="Steps of this run" data-testid="step-list">
      {steps.map((step, i) => {
        const row = states[i];
        const here = i === cursor;
        return (
          <li
            key={step.id}
            data-step-id={step.id}
            data-state={row?.state}
            aria-current={here ? 'step' : undefined}
            className={`flex items-start gap-3 rounded-md px-3 py-2 ${here ? 'bg-accent-soft border-l-4 border-accent' : ''}`}
          >
            <span className="w-7 text-right text-muted tabular-nums shrink-0">{i + 1}.</span>
            <span className="flex-1 min-w-0">
              <span className={`block truncate ${here ? 'font-semibold' : ''}`}>{step.title}</span>
              <span className="flex flex-wrap items-center gap-x-3 text-sm">
                <StateMark state={row?.state ?? 'locked'} size={18} />
                {row?.progress && row.progress.total > 0 && (
                  <span className="text-muted tabular-nums">
                    {row.progress.done} of {row.progress.total}
                  </span>
                )}
              </span>
            </span>
          </li>
        );
      })}
    </ol>
  );
}
