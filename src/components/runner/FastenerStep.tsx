/** A fastener sequence at the bench: the pass target, the map with the next fastener, and one big confirm. */
import { useMemo } from 'react';
import type { StepOf } from '../../domain/procedure/schema';
import { expandPasses } from '../../domain/passes';
import { fastenerProgress, type RunSnapshot } from '../../domain/run';
import { FastenerMap } from './FastenerMap';
import { targetText } from './targets';
import type { StepPanelProps } from './step-panel';

export function FastenerStep({ step, snapshot, sync, units }: StepPanelProps & { step: StepOf<'fastener-sequence'>; snapshot: RunSnapshot }) {
  const progress = fastenerProgress(snapshot, step.id);
  const orderOf = useMemo(() => new Map(expandPasses(step).filter((a) => a.pass === 1).map((a) => [a.fastenerId, a.index])), [step]);
  if (!progress) return null;
  const next = progress.next;
  const shownPass = next?.pass ?? progress.passes.at(-1)?.pass ?? 1;
  const pass = progress.passes.find((p) => p.pass === shownPass);
  const canConfirm = next !== null && sync.can({ type: 'fastener.confirm', stepId: step.id, pass: next.pass, fastenerId: next.fastenerId });
  const confirm = (fastenerId: string) => {
    if (!next) return;
    sync.record({ type: 'fastener.confirm', stepId: step.id, pass: next.pass, fastenerId });
  };
  const target = pass ? targetText(pass.target, units.torque) : null;
  const verb = step.direction === 'loosen' ? 'Loosening' : 'Tightening';
  return (
    <div className="space-y-4">
      <ol className="flex flex-wrap gap-2" aria-label="Passes">
        {progress.passes.map((p) => {
          const t = targetText(p.target, units.torque);
          const done = p.confirmedIds.length === p.total;
          const here = p.pass === shownPass && !done;
          return (
            <li key={p.pass} className={`rounded-md border-2 px-3 py-1 ${here ? 'border-accent bg-accent-soft' : 'border-line'}`} data-pass={p.pass}>
              <span className="font-semibold">Pass {p.pass}</span> · {t.main}
              {t.other && <span className="text-muted"> ({t.other})</span>} ·{' '}
              <span className="tabular-nums">{p.confirmedIds.length} of {p.total}</span> {done ? '✓ done' : here ? '◀ now' : ''}
            </li>
          );
        })}
      </ol>
      {pass && target && (
        <p className="text-2xl" data-testid="pass-target">
          {verb}, pass {pass.pass} of {progress.passes.length}: <strong className="text-3xl">{target.main}</strong>
          {target.other && <span className="text-muted"> ({target.other})</span>}
        </p>
      )}
      <FastenerMap step={step} doneIds={pass?.confirmedIds ?? []} nextId={next?.fastenerId ?? null} orderOf={orderOf} pass={shownPass} onTap={confirm} disabled={!canConfirm} />
      {next && (
        <button
          type="button"
          className="tt-btn tt-btn-primary w-full text-2xl min-h-16"
          data-primary="true"
          disabled={!canConfirm}
          onClick={() => confirm(next.fastenerId)}
          data-testid="confirm-fastener"
        >
          Confirm fastener {next.label} — pass {next.pass}
        </button>
      )}
      <p className="text-muted">
        {progress.confirmed} of {progress.total} fastener actions confirmed{step.torqueToYield ? ' · torque-to-yield: fit new fasteners, never reuse' : ''}
      </p>
    </div>
  );
}
