/** The run machine and everything around it: events, replay, selectors. */
export { createRunMachine, type RunMachine } from './run.machine';
export { runEvent, runActor, tagEntry, deviationKind, RUN_EVENT_TYPES } from './run-events';
export type { RunEvent, RunEventInput, RunEventType, RunEventOf, RunActor, TagEntry, DeviationKind } from './run-events';
export { applyEvent, replay, startRun, storeRun, restoreRun, refusalFor, applyRunEvent, replayEvents } from './run-replay';
export type { ApplyResult, RunSnapshot, StoredRun } from './run-replay';
export { nextExpected, stepStates, runProgress, runPhase, stepRecord, fastenerProgress, measureDetail, pendingDeviation } from './run-view';
export type { RunSnapshotLike, StepProgress } from './run-view';
export { WORKER_ROLES, APPROVER_ROLES, REOPENER_ROLES, type Refusal } from './run-rules';
export type { RunContext, RunPhase, StepRecord, StepOutcome, StepState, PendingDeviation, Reopen } from './run-types';
