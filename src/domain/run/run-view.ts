/** Selectors over a run snapshot: what the traveler, the runner and the reviewer's queue show. */
import type { StateValue } from 'xstate';
import type { Step } from '../procedure/schema';
import type { FastenerAction, PassTarget } from '../passes';
import { evaluateMeasure, type MeasureResult, type ReadingSlot } from '../measure-plan';
import { describeNext } from './run-describe';
import { actionsOf, slotsOf } from './run-plan';
import type { PendingDeviation, RunContext, RunPhase, StepRecord, StepState } from './run-types';

/** Anything with the machine's state value and context: a live snapshot or a restored one. */
export type RunSnapshotLike = { value: StateValue; context: RunContext };

/** The current step's phase, read from the state value. */
export function runPhase(snapshot: { value: StateValue }): RunPhase {
  const { value } = snapshot;
  if (value === 'complete') return 'complete';
  const inner = typeof value === 'object' ? value['running'] : undefined;
  return inner === 'working' || inner === 'outOfSpec' || inner === 'deviationPending' ? inner : 'ready';
}

/** What the run waits for now; null once every step is finished. */
export function nextExpected(snapshot: RunSnapshotLike): { stepId: string; stepIndex: number; description: string } | null {
  const { context } = snapshot;
  const step = context.steps[context.cursor];
  const description = describeNext(context, runPhase(snapshot));
  return step && description ? { stepId: step.id, stepIndex: context.cursor, description } : null;
}

/** Work done out of work asked for, where a step has countable parts. */
export type StepProgress = { done: number; total: number };

function progressOf(step: Step, record: StepRecord): StepProgress | undefined {
  if (step.kind === 'fastener-sequence') return { done: record.confirmed, total: actionsOf(step).length };
  if (step.kind === 'measure') {
    const slots = slotsOf(step);
    return { done: slots.filter((s) => record.readings[s.key] !== undefined).length, total: slots.length };
  }
  return undefined;
}

function stateAt(context: RunContext, index: number, record: StepRecord): StepState {
  if (index < context.cursor) return record.outcome?.state ?? 'done';
  if (index > context.cursor) return 'locked';
  return record.started ? 'in-progress' : 'ready';
}

/** Every step's state on the traveler, with counts for sequences and measurements. */
export function stepStates(snapshot: RunSnapshotLike): Array<{ stepId: string; state: StepState; progress?: StepProgress }> {
  const { context } = snapshot;
  return context.steps.map((step, i) => {
    const record = context.records[i];
    if (!record) return { stepId: step.id, state: 'locked' };
    const progress = progressOf(step, record);
    return { stepId: step.id, state: stateAt(context, i, record), ...(progress ? { progress } : {}) };
  });
}

/** Finished steps (done, deviated or signed) out of all steps. */
export function runProgress(snapshot: RunSnapshotLike): { done: number; total: number; complete: boolean } {
  const total = snapshot.context.steps.length;
  const done = Math.min(snapshot.context.cursor, total);
  return { done, total, complete: runPhase(snapshot) === 'complete' };
}

function find(snapshot: RunSnapshotLike, stepId: string): { step: Step; record: StepRecord } | null {
  const i = snapshot.context.steps.findIndex((s) => s.id === stepId);
  const step = snapshot.context.steps[i];
  const record = snapshot.context.records[i];
  return step && record ? { step, record } : null;
}

/** The run's record of one step (readings, deviation, outcome), or null for an unknown id. */
export const stepRecord = (snapshot: RunSnapshotLike, stepId: string): StepRecord | null => find(snapshot, stepId)?.record ?? null;

/** A sequence step pass by pass: the target, the fastener ids confirmed so far, and what comes next. */
export function fastenerProgress(
  snapshot: RunSnapshotLike,
  stepId: string,
): { passes: Array<{ pass: number; target: PassTarget; confirmedIds: string[]; total: number }>; next: FastenerAction | null; confirmed: number; total: number } | null {
  const found = find(snapshot, stepId);
  if (found?.step.kind !== 'fastener-sequence') return null;
  const actions = actionsOf(found.step);
  const done = actions.slice(0, found.record.confirmed);
  const passes = [...new Set(actions.map((a) => a.pass))].map((pass) => {
    const inPass = actions.filter((a) => a.pass === pass);
    const first = inPass[0] as FastenerAction;
    return { pass, target: first.target, confirmedIds: done.filter((a) => a.pass === pass).map((a) => a.fastenerId), total: inPass.length };
  });
  return { passes, next: actions[found.record.confirmed] ?? null, confirmed: done.length, total: actions.length };
}

/** A measure step's slots, the readings entered and, once any is entered, the evaluation. */
export function measureDetail(
  snapshot: RunSnapshotLike,
  stepId: string,
): { slots: ReadingSlot[]; readings: Record<string, number>; result: MeasureResult | null; submitted: boolean } | null {
  const found = find(snapshot, stepId);
  if (found?.step.kind !== 'measure') return null;
  const { readings } = found.record;
  const result = Object.keys(readings).length > 0 ? evaluateMeasure(found.step, readings) : null;
  return { slots: slotsOf(found.step), readings, result, submitted: found.record.submitted || found.record.outcome !== null };
}

/** The deviation waiting for a lead on the current step, or null. */
export function pendingDeviation(snapshot: RunSnapshotLike): (PendingDeviation & { stepId: string }) | null {
  const record = snapshot.context.records[snapshot.context.cursor];
  return record?.deviation ? { stepId: record.stepId, ...record.deviation } : null;
}
