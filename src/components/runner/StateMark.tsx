/** A step state as shape + word + colour, never colour alone. Shapes are Torquetrail's own. */
import type { StepState } from '../../domain/run';

export const STATE_WORDS: Record<StepState, string> = {
  locked: 'Locked',
  ready: 'Ready',
  'in-progress': 'In progress',
  done: 'Done',
  deviated: 'Deviated',
  signed: 'Signed',
};

const COLOURS: Record<StepState, string> = {
  locked: 'text-muted',
  ready: 'text-accent',
  'in-progress': 'text-accent',
  done: 'text-ok',
  deviated: 'text-warn',
  signed: 'text-hold',
};

/** The icon alone (decorative: always shown next to its word). */
export function StateIcon({ state, size = 22 }: { state: StepState; size?: number }) {
  const common = { width: size, height: size, viewBox: '0 0 24 24', 'aria-hidden': true, className: `shrink-0 ${COLOURS[state]}` } as const;
  switch (state) {
    case 'locked':
      return (
        <svg {...common} fill="none" stroke="currentColor" strokeWidth="2.2">
          <rect x="5" y="11" width="14" height="10" rx="1.5" />
          <path d="M8 11V8a4 4 0 0 1 8 0v3" />
        </svg>
      );
    case 'ready':
      return (
        <svg {...common} fill="none" stroke="currentColor" strokeWidth="2.6">
          <circle cx="12" cy="12" r="8.5" />
        </svg>
      );
    case 'in-progress':
      return (
        <svg {...common} stroke="currentColor" strokeWidth="2.2">
          <circle cx="12" cy="12" r="8.5" fill="none" />
          <path d="M12 3.5a8.5 8.5 0 0 1 0 17z" fill="currentColor" />
        </svg>
      );
    case 'done':
      return (
        <svg {...common} fill="none" stroke="currentColor" strokeWidth="2.6" strokeLinecap="round" strokeLinejoin="round">
          <rect x="3" y="3" width="18" height="18" rx="3" fill="currentColor" stroke="none" />
          <path d="M7 12.5l3.2 3.2L17 9" stroke="var(--color-surface)" />
        </svg>
      );
    case 'deviated':
      return (
        <svg {...common} fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinejoin="round">
          <path d="M12 2.8 22 20.5H2z" fill="currentColor" stroke="none" />
          <path d="M12 9v5.5M12 17.2v.3" stroke="var(--color-surface)" strokeLinecap="round" strokeWidth="2.6" />
        </svg>
      );
    case 'signed':
      return (
        <svg {...common} fill="currentColor" stroke="none">
          <path d="M12 1.8l2.6 2.1 3.3-.3.9 3.2 2.9 1.6-1.2 3.1 1.2 3.1-2.9 1.6-.9 3.2-3.3-.3L12 22.2l-2.6-2.1-3.3.3-.9-3.2-2.9-1.6 1.2-3.1-1.2-3.1 2.9-1.6.9-3.2 3.3.3z" />
          <path d="M8 12.5l2.7 2.7L16.5 9.5" fill="none" stroke="var(--color-surface)" strokeWidth="2.4" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      );
  }
}

/** Icon and word together. */
export function StateMark({ state, size }: { state: StepState; size?: number }) {
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold" data-state={state}>
      <StateIcon state={state} {...(size ? { size } : {})} />
      <span className={COLOURS[state]}>{STATE_WORDS[state]}</span>
    </span>
  );
}
