/**
 * The fastener map of a sequence step as SVG: each fastener where the layout puts it, its state in
 * the current pass as shape + word (next: double ring and "NEXT"; done: filled square with a
 * check and "done"; to do: hollow circle with its turn in the order). Tap or click one to confirm it.
 */
import type { StepOf } from '../../domain/procedure/schema';

export type FastenerState = 'next' | 'todo' | 'done';

/** One fastener's mark, centred on 0,0. */
export function FastenerGlyph({ state, r, label }: { state: FastenerState; r: number; label: string }) {
  const text = <text textAnchor="middle" dominantBaseline="central" fontWeight={700} fontSize={r * 0.85}>{label}</text>;
  if (state === 'done')
    return (
      <g>
        <rect x={-r} y={-r} width={2 * r} height={2 * r} rx={r * 0.25} fill="var(--color-ok)" />
        <g fill="var(--color-surface)">{text}</g>
        <path d={`M${r * 0.35} ${-r * 0.95} l${r * 0.25} ${r * 0.25} l${r * 0.45} ${-r * 0.45}`} stroke="var(--color-surface)" strokeWidth={r * 0.14} fill="none" strokeLinecap="round" />
      </g>
    );
  if (state === 'next')
    return (
      <g>
        <circle r={r * 1.3} fill="none" stroke="var(--color-accent)" strokeWidth={r * 0.16} />
        <circle r={r} fill="var(--color-accent)" />
        <g fill="var(--color-accent-ink)">{text}</g>
      </g>
    );
  return (
    <g>
      <circle r={r} fill="var(--color-surface)" stroke="var(--color-muted)" strokeWidth={r * 0.12} />
      <g fill="var(--color-ink)">{text}</g>
    </g>
  );
}

const WORDS: Record<FastenerState, string> = { next: 'NEXT', todo: 'to do', done: 'done' };

type Props = {
  step: StepOf<'fastener-sequence'>;
  /** Fastener ids confirmed in the pass being shown. */
  doneIds: readonly string[];
  nextId: string | null;
  /** 1-based turn of each fastener in the order. */
  orderOf: ReadonlyMap<string, number>;
  pass: number;
  onTap: (fastenerId: string) => void;
  disabled: boolean;
};

export function FastenerMap({ step, doneIds, nextId, orderOf, pass, onTap, disabled }: Props) {
  const fs = step.map.fasteners;
  const xs = fs.map((f) => f.x);
  const ys = fs.map((f) => f.y);
  let minDist = Infinity;
  for (let i = 0; i < fs.length; i++)
    for (let j = i + 1; j < fs.length; j++) minDist = Math.min(minDist, Math.hypot(fs[i]!.x - fs[j]!.x, fs[i]!.y - fs[j]!.y));
  const span = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys), 200);
  const r = Math.max(span * 0.035, Math.min(Number.isFinite(minDist) ? minDist * 0.34 : 40, span * 0.08));
  const pad = r * 2.4;
  const vb = [Math.min(...xs) - pad, Math.min(...ys) - pad, Math.max(...xs) - Math.min(...xs) + 2 * pad, Math.max(...ys) - Math.min(...ys) + 2 * pad + r * 0.8];
  const stateOf = (id: string): FastenerState => (doneIds.includes(id) ? 'done' : id === nextId ? 'next' : 'todo');
  return (
    <svg viewBox={vb.join(' ')} className="w-full max-h-[55vh] bg-sunken rounded-lg touch-manipulation select-none" role="group" aria-label={`Fastener map, pass ${pass}`} data-testid="fastener-map">
      {fs.map((f) => {
        const state = stateOf(f.id);
        const turn = orderOf.get(f.id);
        return (
          <g
            key={f.id}
            transform={`translate(${f.x} ${f.y})`}
            role="button"
            tabIndex={state === 'next' ? 0 : -1}
            aria-disabled={disabled || state !== 'next'}
            aria-label={`Fastener ${f.label}: ${state === 'next' ? 'next, confirm it' : state === 'done' ? `done in pass ${pass}` : `to do, ${turn ?? '?'} in the order`}`}
            data-fastener={f.label}
            data-fastener-state={state}
            className={state === 'next' && !disabled ? 'cursor-pointer' : ''}
            onClick={() => onTap(f.id)}
            onKeyDown={(e) => {
              if (e.key === ' ') {
                e.preventDefault();
                onTap(f.id);
              }
            }}
          >
            <FastenerGlyph state={state} r={r} label={f.label} />
            <text y={r * 1.3 + r * 0.55} textAnchor="middle" fontSize={r * 0.5} fontWeight={state === 'next' ? 700 : 400} fill="var(--color-ink)">
              {state === 'todo' && turn ? `#${turn} · to do` : WORDS[state]}
            </text>
          </g>
        );
      })}
    </svg>
  );
}
