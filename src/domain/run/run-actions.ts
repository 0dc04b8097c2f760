/** How each accepted event changes the run's context: pure functions, wired in as machine actions. */
import { evaluateMeasure } from '../measure-plan';
import type { RunEvent } from './run-events';
import { current } from './run-plan';
import { emptyRecord, type RunContext, type StepRecord } from './run-types';

/** Replace the current step's record; the context is never mutated in place. */
function updateCurrent(ctx: RunContext, change: (record: StepRecord) => StepRecord): RunContext {
  const at = current(ctx);
  if (!at) return ctx;
  const records = ctx.records.slice();
  records[at.index] = change(at.record);
  return { ...ctx, records };
}

const by = (ev: RunEvent) => ev.actor.userId;

/** One context update per machine action, named as the action is. */
export const UPDATES = {
  start: (ctx: RunContext, ev: RunEvent) =>
    updateCurrent(ctx, (r) => ({ ...r, started: true, startedBy: by(ev), hazardsAcknowledged: ev.type === 'step.start' ? ev.hazards : [] })),
  confirmFastener: (ctx: RunContext) => updateCurrent(ctx, (r) => ({ ...r, confirmed: r.confirmed + 1 })),
  finishSequence: (ctx: RunContext, ev: RunEvent) =>
    updateCurrent(ctx, (r) => ({ ...r, confirmed: r.confirmed + 1, outcome: { state: 'done', by: by(ev) } })),
  enterReading: (ctx: RunContext, ev: RunEvent) =>
    ev.type === 'reading.enter' ? updateCurrent(ctx, (r) => ({ ...r, readings: { ...r.readings, [ev.key]: ev.value } })) : ctx,
  submitInSpec: (ctx: RunContext, ev: RunEvent) => {
    const at = current(ctx);
    if (at?.step.kind !== 'measure') return ctx;
    const result = evaluateMeasure(at.step, at.record.readings);
    return updateCurrent(ctx, (r) => ({ ...r, outcome: { state: 'done', by: by(ev), inSpec: true, summary: result.summary } }));
  },
  submitOutOfSpec: (ctx: RunContext) => updateCurrent(ctx, (r) => ({ ...r, submitted: true })),
  acknowledgeCaution: (ctx: RunContext, ev: RunEvent) => updateCurrent(ctx, (r) => ({ ...r, outcome: { state: 'done', by: by(ev) } })),
  recordTorque: (ctx: RunContext, ev: RunEvent) => (ev.type === 'torque.confirm' ? updateCurrent(ctx, (r) => ({ ...r, applied: ev.applied })) : ctx),
  complete: (ctx: RunContext, ev: RunEvent) => {
    if (ev.type !== 'step.complete') return ctx;
    return updateCurrent(ctx, (r) => {
      const applied = ev.applied ?? r.applied ?? undefined;
      return {
        ...r,
        applied: applied ?? null,
        outcome: {
          state: 'done',
          by: by(ev),
          ...(ev.note ? { note: ev.note } : {}),
          ...(applied ? { applied } : {}),
          ...(ev.tags ? { tags: ev.tags } : {}),
        },
      };
    });
  },
  requestDeviation: (ctx: RunContext, ev: RunEvent) =>
    ev.type === 'deviation.request'
      ? updateCurrent(ctx, (r) => ({ ...r, deviation: { kind: ev.kind, reason: ev.reason, requestedBy: by(ev), requestedByRole: ev.actor.role } }))
      : ctx,
  approveDeviation: (ctx: RunContext, ev: RunEvent) => {
    const at = current(ctx);
    const deviation = at?.record.deviation;
    if (!at || !deviation || ev.type !== 'deviation.approve') return ctx;
    // An out-of-spec approval keeps the measured summary on the record it accepts.
    const summary = at.step.kind === 'measure' && deviation.kind === 'out-of-spec' ? evaluateMeasure(at.step, at.record.readings).summary : undefined;
    return updateCurrent(ctx, (r) => ({
      ...r,
      deviation: null,
      outcome: { state: 'deviated', by: by(ev), deviation, ...(ev.note ? { note: ev.note } : {}), ...(summary ? { summary } : {}) },
    }));
  },
  rejectDeviation: (ctx: RunContext, ev: RunEvent) =>
    ev.type === 'deviation.reject'
      ? updateCurrent(ctx, (r) => ({ ...r, deviation: null, submitted: false, lastRejection: { reason: ev.reason, by: by(ev) } }))
      : ctx,
  signHold: (ctx: RunContext, ev: RunEvent) =>
    ev.type === 'hold.sign' ? updateCurrent(ctx, (r) => ({ ...r, outcome: { state: 'signed', by: by(ev), role: ev.actor.role, meaning: ev.meaning } })) : ctx,
  advance: (ctx: RunContext) => ({ ...ctx, cursor: ctx.cursor + 1 }),
  reopen: (ctx: RunContext, ev: RunEvent) => {
    if (ev.type !== 'run.reopen') return ctx;
    const index = ctx.steps.findIndex((s) => s.id === ev.stepId);
    if (index < 0) return ctx;
    const archived = ctx.records.slice(index).flatMap((r) => (r.outcome ? [{ stepId: r.stepId, outcome: r.outcome }] : []));
    return {
      ...ctx,
      cursor: index,
      records: ctx.records.map((r, i) => (i < index ? r : emptyRecord(r.stepId))),
      reopens: [...ctx.reopens, { stepId: ev.stepId, reason: ev.reason, by: by(ev), archived }],
    };
  },
} satisfies Record<string, (ctx: RunContext, ev: RunEvent) => RunContext>;
