/**
 * The rules of a run as named predicates. Each is a guard of the run machine (so `snapshot.can`
 * answers from them) and carries the refusal a person sees when it fails; `REQUIREMENTS` says,
 * per phase and event, which rules must hold and in what order they are explained.
 */
import { isDomainError } from '../errors';
import type { Role } from '../procedure/schema';
import { evaluateMeasure } from '../measure-plan';
import { describeNext, hazardWords, whoOf } from './run-describe';
import type { RunEvent, RunEventType } from './run-events';
import { actionsOf, current, nextAction, slotsOf } from './run-plan';
import type { RunContext, RunPhase } from './run-types';

/** Why an event was refused: `code` for programs, `message` for the person. */
export type Refusal = { code: 'out-of-order' | 'not-allowed' | 'invalid-input'; message: string };

type Rule = {
  test: (ctx: RunContext, ev: RunEvent) => boolean;
  refuse: (ctx: RunContext, ev: RunEvent, phase: RunPhase) => Refusal;
};

/** Roles that work steps at the bench. */
export const WORKER_ROLES: readonly Role[] = ['technician', 'lead', 'owner'];
/** Roles that decide deviations. */
export const APPROVER_ROLES: readonly Role[] = ['lead', 'owner'];
/** Roles that may send finished work back. */
export const REOPENER_ROLES: readonly Role[] = ['reviewer', 'lead', 'owner'];

const COMPLETED_BY_EVENT = new Set(['action', 'torque', 'inspect', 'tag-part', 'replace']);

const next = (ctx: RunContext, phase: RunPhase): Refusal => ({
  code: 'out-of-order',
  message: describeNext(ctx, phase) ?? 'The run is complete',
});
const notAllowed = (message: string): Refusal => ({ code: 'not-allowed', message });
const invalid = (message: string): Refusal => ({ code: 'invalid-input', message });
const kind = (ctx: RunContext) => current(ctx)?.step.kind;
/** A rule about the current step's kind: refused with what is expected instead. */
const kindIs = (...kinds: string[]): Rule => ({ test: (ctx) => kinds.includes(kind(ctx) ?? ''), refuse: (ctx, _ev, phase) => next(ctx, phase) });

/** Positions a tag-part completion leaves untagged or tags twice; empty when it covers each once. */
function tagProblems(ctx: RunContext, ev: RunEvent): string[] {
  const at = current(ctx);
  if (at?.step.kind !== 'tag-part' || ev.type !== 'step.complete') return [];
  const given = (ev.tags ?? []).map((t) => t.position);
  const expected = at.step.positions;
  return [
    ...expected.filter((p) => !given.includes(p)).map((p) => `tag ${p}`),
    ...given.filter((p, i) => !expected.includes(p) || given.indexOf(p) !== i).map((p) => `${p} is not a position to tag once`),
  ];
}

/** Why a reading cannot be real (NaN, negative size, absurd), as measure-plan judges it; null when it can. */
function readingProblem(ctx: RunContext, ev: RunEvent): string | null {
  const at = current(ctx);
  if (ev.type !== 'reading.enter' || at?.step.kind !== 'measure') return null;
  try {
    evaluateMeasure(at.step, { [ev.key]: ev.value });
    return null;
  } catch (e) {
    if (isDomainError(e)) return e.message;
    throw e;
  }
}

/** Every rule by name: the machine's guards and the refusals explained from them. */
export const RULES = {
  onCurrentStep: {
    test: (ctx, ev) => current(ctx)?.step.id === ev.stepId,
    refuse: (ctx, ev, phase) =>
      ctx.steps.some((s) => s.id === ev.stepId) ? next(ctx, phase) : invalid(`There is no step "${ev.stepId}" in this procedure`),
  },
  isWorker: {
    test: (_ctx, ev) => WORKER_ROLES.includes(ev.actor.role),
    refuse: (_ctx, ev) => notAllowed(`A ${ev.actor.role} does not work steps; ${whoOf(WORKER_ROLES)} does`),
  },
  isStartable: { test: (ctx) => !['hold-point', 'caution'].includes(kind(ctx) ?? 'hold-point'), refuse: (ctx, _ev, phase) => next(ctx, phase) },
  hazardsAcknowledged: {
    test: (ctx, ev) => {
      const hazards = current(ctx)?.step.hazards ?? [];
      return ev.type === 'step.start' && hazards.every((h) => ev.hazards.includes(h));
    },
    refuse: (ctx) => ({ code: 'out-of-order', message: `Next: acknowledge the hazards (${hazardWords(current(ctx)?.step.hazards ?? [])}) and start the step` }),
  },
  isFastenerStep: kindIs('fastener-sequence'),
  isMeasureStep: kindIs('measure'),
  isTorqueStep: kindIs('torque'),
  isCautionStep: kindIs('caution'),
  isHoldPoint: kindIs('hold-point'),
  isOptionalCaution: {
    test: (ctx) => {
      const step = current(ctx)?.step;
      return step?.kind === 'caution' && !step.mustAcknowledge;
    },
    refuse: (ctx, _ev, phase) => next(ctx, phase),
  },
  completesByEvent: kindIs(...COMPLETED_BY_EVENT),
  knownFastener: {
    test: (ctx, ev) => {
      const step = current(ctx)?.step;
      return ev.type === 'fastener.confirm' && step?.kind === 'fastener-sequence' && step.map.fasteners.some((f) => f.id === ev.fastenerId);
    },
    refuse: (_ctx, ev) => invalid(`There is no fastener "${ev.type === 'fastener.confirm' ? ev.fastenerId : ''}" in this sequence`),
  },
  isExpectedFastener: {
    test: (ctx, ev) => {
      const at = current(ctx);
      if (ev.type !== 'fastener.confirm' || at?.step.kind !== 'fastener-sequence') return false;
      const action = nextAction(at.step, at.record);
      return action !== null && action.pass === ev.pass && action.fastenerId === ev.fastenerId;
    },
    refuse: (ctx, _ev, phase) => next(ctx, phase),
  },
  knownSlot: {
    test: (ctx, ev) => {
      const step = current(ctx)?.step;
      return ev.type === 'reading.enter' && step?.kind === 'measure' && slotsOf(step).some((s) => s.key === ev.key);
    },
    refuse: (_ctx, ev) => invalid(`There is no reading "${ev.type === 'reading.enter' ? ev.key : ''}" on this step`),
  },
  plausibleReading: {
    test: (ctx, ev) => readingProblem(ctx, ev) === null,
    refuse: (ctx, ev) => invalid(readingProblem(ctx, ev) ?? 'This reading cannot be right'),
  },
  readingsComplete: {
    test: (ctx) => {
      const at = current(ctx);
      return at?.step.kind === 'measure' && evaluateMeasure(at.step, at.record.readings).complete;
    },
    refuse: (ctx, _ev, phase) => next(ctx, phase),
  },
  torqueRecorded: {
    test: (ctx, ev) => {
      const at = current(ctx);
      return at?.step.kind !== 'torque' || at.record.applied !== null || (ev.type === 'step.complete' && ev.applied !== undefined);
    },
    refuse: (ctx, _ev, phase) => next(ctx, phase),
  },
  tagsCoverPositions: {
    test: (ctx, ev) => tagProblems(ctx, ev).length === 0,
    refuse: (ctx, ev) => invalid(`Tag each position once: ${tagProblems(ctx, ev).join('; ')}`),
  },
  isSkipRequest: {
    test: (_ctx, ev) => ev.type === 'deviation.request' && ev.kind === 'skip',
    refuse: () => ({ code: 'out-of-order', message: 'An out-of-spec deviation is requested after out-of-spec readings are submitted' }),
  },
  isSkippable: {
    test: (ctx) => kind(ctx) !== 'hold-point',
    refuse: (ctx, _ev, phase) => ({ code: 'out-of-order', message: `A hold point cannot be skipped. ${describeNext(ctx, phase) ?? ''}`.trim() }),
  },
  isOutOfSpecRequest: {
    test: (_ctx, ev) => ev.type === 'deviation.request' && ev.kind === 'out-of-spec',
    refuse: (ctx, _ev, phase) => next(ctx, phase),
  },
  isApprover: {
    test: (_ctx, ev) => APPROVER_ROLES.includes(ev.actor.role),
    refuse: () => notAllowed(`Only ${whoOf(APPROVER_ROLES)} may decide a deviation`),
  },
  notOwnRequest: {
    test: (ctx, ev) => current(ctx)?.record.deviation?.requestedBy !== ev.actor.userId,
    refuse: () => notAllowed('A deviation must be approved by someone other than the member who requested it'),
  },
  isSigner: {
    test: (ctx, ev) => {
      const step = current(ctx)?.step;
      return step?.kind === 'hold-point' && step.signers.includes(ev.actor.role);
    },
    refuse: (ctx) => {
      const step = current(ctx)?.step;
      return notAllowed(`Only ${whoOf(step?.kind === 'hold-point' ? step.signers : [])} may sign this hold point`);
    },
  },
  isReopener: {
    test: (_ctx, ev) => REOPENER_ROLES.includes(ev.actor.role),
    refuse: () => notAllowed(`Only ${whoOf(REOPENER_ROLES)} may send work back`),
  },
  reopenTargetFinished: {
    test: (ctx, ev) => {
      const index = ctx.steps.findIndex((s) => s.id === ev.stepId);
      return index >= 0 && index < ctx.cursor;
    },
    refuse: (ctx, ev) =>
      ctx.steps.some((s) => s.id === ev.stepId)
        ? { code: 'out-of-order', message: 'Only finished steps can be sent back' }
        : invalid(`There is no step "${ev.stepId}" in this procedure`),
  },
} satisfies Record<string, Rule>;

/** The name of one rule. */
export type RuleName = keyof typeof RULES;

type Table = Partial<Record<RunEventType, readonly RuleName[]>>;

/** Which rules each event needs in each phase, in the order their refusals are explained. */
export const REQUIREMENTS = {
  ready: {
    'step.start': ['onCurrentStep', 'isWorker', 'isStartable', 'hazardsAcknowledged'],
    'caution.acknowledge': ['onCurrentStep', 'isWorker', 'isCautionStep'],
    'step.complete': ['onCurrentStep', 'isWorker', 'isOptionalCaution'],
    'deviation.request': ['onCurrentStep', 'isWorker', 'isSkipRequest', 'isSkippable'],
    'hold.sign': ['onCurrentStep', 'isHoldPoint', 'isSigner'],
  },
  working: {
    'fastener.confirm': ['onCurrentStep', 'isWorker', 'isFastenerStep', 'knownFastener', 'isExpectedFastener'],
    'reading.enter': ['onCurrentStep', 'isWorker', 'isMeasureStep', 'knownSlot', 'plausibleReading'],
    'measure.submit': ['onCurrentStep', 'isWorker', 'isMeasureStep', 'readingsComplete'],
    'torque.confirm': ['onCurrentStep', 'isWorker', 'isTorqueStep'],
    'step.complete': ['onCurrentStep', 'isWorker', 'completesByEvent', 'torqueRecorded', 'tagsCoverPositions'],
    'deviation.request': ['onCurrentStep', 'isWorker', 'isSkipRequest', 'isSkippable'],
  },
  outOfSpec: {
    'deviation.request': ['onCurrentStep', 'isWorker', 'isOutOfSpecRequest'],
  },
  deviationPending: {
    'deviation.approve': ['onCurrentStep', 'isApprover', 'notOwnRequest'],
    'deviation.reject': ['onCurrentStep', 'isApprover'],
  },
  complete: {},
  /** Accepted whatever the current step is doing. */
  any: {
    'run.reopen': ['isReopener', 'reopenTargetFinished'],
  },
} as const satisfies Record<RunPhase | 'any', Table>;

/** The first rule an event breaks in this phase, as a refusal; null when the event is accepted. */
export function explainRefusal(ctx: RunContext, phase: RunPhase, ev: RunEvent): Refusal | null {
  const any: Table = REQUIREMENTS.any;
  const own: Table = REQUIREMENTS[phase];
  const rules = any[ev.type] ?? own[ev.type];
  if (!rules) return phase === 'complete' ? { code: 'out-of-order', message: 'The run is complete' } : next(ctx, phase);
  for (const name of rules) {
    const rule: Rule = RULES[name];
    if (!rule.test(ctx, ev)) return rule.refuse(ctx, ev, phase);
  }
  return null;
}

/** Branch conditions: which way an accepted event goes (never a reason to refuse). */
export const BRANCHES = {
  isLastFastener: (ctx: RunContext) => {
    const at = current(ctx);
    return at?.step.kind === 'fastener-sequence' && at.record.confirmed + 1 >= actionsOf(at.step).length;
  },
  readingsInSpec: (ctx: RunContext) => {
    const at = current(ctx);
    return at?.step.kind === 'measure' && evaluateMeasure(at.step, at.record.readings).inSpec;
  },
  wasStarted: (ctx: RunContext) => current(ctx)?.record.started === true,
  runFinished: (ctx: RunContext) => ctx.cursor >= ctx.steps.length,
};
