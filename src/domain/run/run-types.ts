/** The run machine's context: plain JSON, so a snapshot can be persisted and restored as is. */
import type { Hazard, Role, Step, TorqueQuantity } from '../procedure/schema';
import type { DeviationKind, TagEntry } from './run-events';

/** The state a step shows on the traveler. */
export type StepState = 'locked' | 'ready' | 'in-progress' | 'done' | 'deviated' | 'signed';

/** A deviation waiting for a lead's decision. */
export type PendingDeviation = { kind: DeviationKind; reason: string; requestedBy: string; requestedByRole: Role };

/** How a finished step was finished. */
export type StepOutcome =
  | { state: 'done'; by: string; note?: string; applied?: TorqueQuantity; tags?: TagEntry[]; inSpec?: boolean; summary?: string }
  | { state: 'deviated'; by: string; note?: string; deviation: PendingDeviation; summary?: string }
  | { state: 'signed'; by: string; role: Role; meaning: string };

/** What the run knows about one step. */
export type StepRecord = {
  stepId: string;
  started: boolean;
  startedBy: string | null;
  hazardsAcknowledged: Hazard[];
  /** Fastener actions confirmed so far; they are confirmed strictly in order, so a count is enough. */
  confirmed: number;
  readings: Record<string, number>;
  /** Readings submitted and found out of spec: the step waits for a deviation. */
  submitted: boolean;
  applied: TorqueQuantity | null;
  deviation: PendingDeviation | null;
  lastRejection: { reason: string; by: string } | null;
  outcome: StepOutcome | null;
};

/** A reviewer's send-back: kept so the traveler shows why work was redone. */
export type Reopen = { stepId: string; reason: string; by: string; archived: Array<{ stepId: string; outcome: StepOutcome }> };

/** The run machine's context. `steps` is the pinned revision's steps. */
export type RunContext = {
  steps: Step[];
  /** Index of the step being worked; equals steps.length once every step is finished. */
  cursor: number;
  records: StepRecord[];
  reopens: Reopen[];
};

/** Where the current step is in its own small life cycle (the machine's state under `running`). */
export type RunPhase = 'ready' | 'working' | 'outOfSpec' | 'deviationPending' | 'complete';

/** A fresh record for a step nobody has touched. */
export const emptyRecord = (stepId: string): StepRecord => ({
  stepId,
  started: false,
  startedBy: null,
  hazardsAcknowledged: [],
  confirmed: 0,
  readings: {},
  submitted: false,
  applied: null,
  deviation: null,
  lastRejection: null,
  outcome: null,
});

/** The initial context for a run over these steps. */
export const initialContext = (steps: Step[]): RunContext => ({
  steps,
  cursor: 0,
  records: steps.map((s) => emptyRecord(s.id)),
  reopens: [],
});
