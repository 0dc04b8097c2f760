/**
 * The runner: one run worked at the bench. State comes only from the server's log (replayed
 * through the run machine) plus this device's unsent events, so a reload or another device
 * continues at the exact point. Keys: Enter = main action, A = acknowledge, ? = legend.
 */
import { useEffect, useRef, useState } from 'react';
import { nextExpected, runProgress, stepStates } from '../../domain/run';
import { StatusRegion } from '../ui/StatusRegion';
import { StepExtras } from '../parts/StepExtras';
import { CurrentStep } from './CurrentStep';
import { Legend } from './Legend';
import { OfflineBanner } from './OfflineBanner';
import { StepList } from './StepList';
import type { PreferredUnits, RunDto, Viewer } from './types';
import { useRunSync } from './use-run-sync';

type Props = { run: RunDto; viewer: Viewer; units: PreferredUnits };

export default function Runner(props: Props) {
  return <RunnerView {...props} />;
}

const isField = (t: EventTarget | null) => t instanceof HTMLElement && (t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.tagName === 'BUTTON' || t.tagName === 'A' || (t.tagName === 'INPUT' && t.id !== 'reading-draft'));

function RunnerView({ run, viewer, units }: Props) {
  const sync = useRunSync(run, viewer);
  const [hydrated, setHydrated] = useState(false);
  const [legend, setLegend] = useState(false);
  const root = useRef<HTMLDivElement>(null);
  useEffect(() => setHydrated(true), []);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey) return;
      const click = (sel: string) => {
        const el = root.current?.querySelector<HTMLButtonElement>(`${sel}:not(:disabled)`);
        if (el) {
          e.preventDefault();
          el.click();
        }
      };
      if (e.key === '?') {
        e.preventDefault();
        setLegend((v) => !v);
      } else if (e.key === 'Enter' && !isField(e.target)) click('[data-primary="true"]');
      else if ((e.key === 'a' || e.key === 'A') && !isField(e.target) && !(e.target instanceof HTMLInputElement)) click('[data-ack="true"]');
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  const { snapshot } = sync;
  if (!snapshot)
    return (
      <div data-hydrated={hydrated ? 'true' : undefined}>
        <StatusRegion status={{ kind: 'error', message: `This run's log could not be read: ${sync.logError ?? 'unknown problem'}. Nothing was changed; tell the shop lead.` }} />
      </div>
    );
  const steps = sync.steps;
  const states = stepStates(snapshot);
  const progress = runProgress(snapshot);
  const next = nextExpected(snapshot);
  const cursor = snapshot.context.cursor;
  const step = steps[cursor];
  const following = steps[cursor + 1];
  const pct = progress.total ? Math.round((progress.done / progress.total) * 100) : 0;

  return (
    <div ref={root} data-hydrated={hydrated ? 'true' : undefined} data-testid="runner">
      <OfflineBanner online={sync.online} waiting={sync.pending.length} sending={sync.sending} />
      <header className="flex flex-wrap items-end justify-between gap-3 mb-4">
        <div>
          <p className="text-muted font-semibold">
            <a className="underline" href={`/jobs/${run.run.jobId}`}>Job {run.run.jobCode}</a> · revision {run.run.revisionNumber}
          </p>
          <h1 className="text-2xl font-bold">{run.run.procedureName}</h1>
        </div>
        <div className="flex flex-wrap gap-2 tt-no-print">
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setLegend((v) => !v)} aria-expanded={legend}>? Legend</button>
          <a className="tt-btn tt-btn-quiet" href={`/runs/${run.run.id}/history`}>History</a>
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => window.print()}>Print traveler</button>
        </div>
      </header>
      <div className="mb-4" data-testid="run-progress">
        <div className="flex justify-between text-lg font-semibold">
          <span>{progress.complete ? 'Run complete' : `Step ${Math.min(cursor + 1, progress.total)} of ${progress.total}`}</span>
          <span className="tabular-nums">{progress.done} of {progress.total} steps finished</span>
        </div>
        <div className="h-4 rounded-full bg-sunken border border-line overflow-hidden" role="progressbar" aria-valuemin={0} aria-valuemax={progress.total} aria-valuenow={progress.done} aria-label="Steps finished">
          <div className="h-full bg-accent" style={{ width: `${pct}%` }} />
        </div>
      </div>
      {legend && <Legend onClose={() => setLegend(false)} />}
      <StatusRegion status={sync.status} />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="space-y-4 min-w-0">
          {next && (
            <p className="text-2xl font-bold rounded-md bg-accent-soft px-4 py-3" data-testid="next-expected" aria-live="polite">
              {next.description}
            </p>
          )}
          {step ? (
            <CurrentStep key={step.id} step={step} index={cursor} total={steps.length} snapshot={snapshot} sync={sync} units={units} />
          ) : (
            <section className="tt-card p-6" data-testid="run-complete">
              <h2 className="text-3xl font-bold">Every step is finished</h2>
              <p className="text-lg">A reviewer can now check the run. The <a className="underline" href={`/runs/${run.run.id}/history`}>history</a> shows every event.</p>
            </section>
          )}
          {step && <StepExtras key={`extras-${step.id}`} runId={run.run.id} jobId={run.run.jobId} step={step} role={viewer.role} />}
        </div>
        <aside className="space-y-4 min-w-0" aria-label="Run overview">
          {following && (
            <section className="tt-card p-4" data-testid="coming-next">
              <h2 className="font-semibold text-muted">Coming next</h2>
              <p className="text-lg font-semibold">Step {cursor + 2}: {following.title}</p>
            </section>
          )}
          <section className="tt-card p-3">
            <h2 className="font-semibold px-3 pb-1">Traveler</h2>
            <StepList steps={steps} states={states} cursor={cursor} />
          </section>
        </aside>
      </div>
    </div>
  );
}
