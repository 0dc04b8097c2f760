/**
 * The work a step asks for, derived once per step object: the expanded fastener actions and the
 * reading slots. Guards run on every event (and on every `can`), so the expansion is cached.
 */
import type { Step, StepOf } from '../procedure/schema';
import { expandPasses, type FastenerAction } from '../passes';
import { readingSlots, type ReadingSlot } from '../measure-plan';
import type { RunContext, StepRecord } from './run-types';

const actionCache = new WeakMap<Step, FastenerAction[]>();
const slotCache = new WeakMap<Step, ReadingSlot[]>();

/** The fastener actions of a sequence step, in the order they must be confirmed. */
export function actionsOf(step: StepOf<'fastener-sequence'>): FastenerAction[] {
  let actions = actionCache.get(step);
  if (!actions) {
    actions = expandPasses(step);
    actionCache.set(step, actions);
  }
  return actions;
}

/** The reading slots of a measure step. */
export function slotsOf(step: StepOf<'measure'>): ReadingSlot[] {
  let slots = slotCache.get(step);
  if (!slots) {
    slots = readingSlots(step);
    slotCache.set(step, slots);
  }
  return slots;
}

/** The step being worked and its record, or null once the run is complete. */
export function current(ctx: RunContext): { step: Step; record: StepRecord; index: number } | null {
  const step = ctx.steps[ctx.cursor];
  const record = ctx.records[ctx.cursor];
  return step && record ? { step, record, index: ctx.cursor } : null;
}

/** The next fastener action to confirm on a sequence step, or null when all are confirmed. */
export function nextAction(step: StepOf<'fastener-sequence'>, record: StepRecord): FastenerAction | null {
  return actionsOf(step)[record.confirmed] ?? null;
}
