/**
 * The run machine: one revision's steps worked in order. The same machine guides the technician
 * in the browser and validates every event on the server before it is stored.
 *
 * States under `running` are the current step's phase (the step itself is `context.cursor`):
 * `ready` → (`step.start`) `working` → done, or out of spec → `outOfSpec` → (`deviation.request`)
 * `deviationPending` → approved (deviated) or rejected (back to work). A finished step goes
 * through `entering`, which opens the next step or ends in `complete`. `run.reopen` is taken in
 * any state. Hazard cautions are acknowledged by listing them on `step.start`; caution steps are
 * finished by `caution.acknowledge` and hold points by `hold.sign`, neither needs `step.start`.
 */
import { and, assign, setup } from 'xstate';
import type { Step } from '../procedure/schema';
import type { RunEvent } from './run-events';
import { UPDATES } from './run-actions';
import { BRANCHES, REQUIREMENTS, RULES, type RuleName } from './run-rules';
import { initialContext, type RunContext } from './run-types';

type Args = { context: RunContext; event: RunEvent };
type Update = (ctx: RunContext, ev: RunEvent) => RunContext;

const update = (f: Update) => assign<RunContext, RunEvent, undefined, RunEvent, never>(({ context, event }: Args) => f(context, event));
const rule = (name: RuleName) => ({ context, event }: Args) => RULES[name].test(context, event);
const branch = (f: (ctx: RunContext) => boolean) => ({ context }: Args) => f(context);

/** All the rules an event needs in a phase, plus branch guards that pick the way it goes. */
const needs = (rules: readonly RuleName[], ...more: Array<keyof typeof BRANCHES | RuleName>) => and([...rules, ...more]);

const runSetup = setup({
  types: { context: {} as RunContext, events: {} as RunEvent },
  guards: {
    onCurrentStep: rule('onCurrentStep'),
    isWorker: rule('isWorker'),
    isStartable: rule('isStartable'),
    hazardsAcknowledged: rule('hazardsAcknowledged'),
    isFastenerStep: rule('isFastenerStep'),
    isMeasureStep: rule('isMeasureStep'),
    isTorqueStep: rule('isTorqueStep'),
    isCautionStep: rule('isCautionStep'),
    isHoldPoint: rule('isHoldPoint'),
    isOptionalCaution: rule('isOptionalCaution'),
    completesByEvent: rule('completesByEvent'),
    knownFastener: rule('knownFastener'),
    isExpectedFastener: rule('isExpectedFastener'),
    knownSlot: rule('knownSlot'),
    plausibleReading: rule('plausibleReading'),
    readingsComplete: rule('readingsComplete'),
    torqueRecorded: rule('torqueRecorded'),
    tagsCoverPositions: rule('tagsCoverPositions'),
    isSkipRequest: rule('isSkipRequest'),
    isSkippable: rule('isSkippable'),
    isOutOfSpecRequest: rule('isOutOfSpecRequest'),
    isApprover: rule('isApprover'),
    notOwnRequest: rule('notOwnRequest'),
    isSigner: rule('isSigner'),
    isReopener: rule('isReopener'),
    reopenTargetFinished: rule('reopenTargetFinished'),
    isLastFastener: branch(BRANCHES.isLastFastener),
    readingsInSpec: branch(BRANCHES.readingsInSpec),
    wasStarted: branch(BRANCHES.wasStarted),
    runFinished: branch(BRANCHES.runFinished),
  },
  actions: {
    start: update(UPDATES.start),
    confirmFastener: update(UPDATES.confirmFastener),
    finishSequence: update(UPDATES.finishSequence),
    enterReading: update(UPDATES.enterReading),
    submitInSpec: update(UPDATES.submitInSpec),
    submitOutOfSpec: update(UPDATES.submitOutOfSpec),
    acknowledgeCaution: update(UPDATES.acknowledgeCaution),
    recordTorque: update(UPDATES.recordTorque),
    complete: update(UPDATES.complete),
    requestDeviation: update(UPDATES.requestDeviation),
    approveDeviation: update(UPDATES.approveDeviation),
    rejectDeviation: update(UPDATES.rejectDeviation),
    signHold: update(UPDATES.signHold),
    advance: update(UPDATES.advance),
    reopen: update(UPDATES.reopen),
  },
});

const R = REQUIREMENTS;

/** The run machine for a released revision's steps. */
export function createRunMachine(steps: Step[]) {
  return runSetup.createMachine({
    id: 'run',
    context: initialContext(steps),
    initial: 'running',
    on: {
      'run.reopen': { guard: needs(R.any['run.reopen']), target: '.running.entering', actions: 'reopen' },
    },
    states: {
      running: {
        initial: 'entering',
        states: {
          entering: {
            always: [{ guard: 'runFinished', target: '#run.complete' }, { target: 'ready' }],
          },
          ready: {
            on: {
              'step.start': { guard: needs(R.ready['step.start']), target: 'working', actions: 'start' },
              'caution.acknowledge': { guard: needs(R.ready['caution.acknowledge']), target: 'entering', actions: ['acknowledgeCaution', 'advance'] },
              'step.complete': { guard: needs(R.ready['step.complete']), target: 'entering', actions: ['acknowledgeCaution', 'advance'] },
              'deviation.request': { guard: needs(R.ready['deviation.request']), target: 'deviationPending', actions: 'requestDeviation' },
              'hold.sign': { guard: needs(R.ready['hold.sign']), target: 'entering', actions: ['signHold', 'advance'] },
            },
          },
          working: {
            // Where two transitions share an event, the first whose guard holds is taken.
            on: {
              'fastener.confirm': [
                { guard: needs(R.working['fastener.confirm'], 'isLastFastener'), target: 'entering', actions: ['finishSequence', 'advance'] },
                { guard: needs(R.working['fastener.confirm']), actions: 'confirmFastener' },
              ],
              'reading.enter': { guard: needs(R.working['reading.enter']), actions: 'enterReading' },
              'measure.submit': [
                { guard: needs(R.working['measure.submit'], 'readingsInSpec'), target: 'entering', actions: ['submitInSpec', 'advance'] },
                { guard: needs(R.working['measure.submit']), target: 'outOfSpec', actions: 'submitOutOfSpec' },
              ],
              'torque.confirm': { guard: needs(R.working['torque.confirm']), actions: 'recordTorque' },
              'step.complete': { guard: needs(R.working['step.complete']), target: 'entering', actions: ['complete', 'advance'] },
              'deviation.request': { guard: needs(R.working['deviation.request']), target: 'deviationPending', actions: 'requestDeviation' },
            },
          },
          outOfSpec: {
            on: {
              'deviation.request': { guard: needs(R.outOfSpec['deviation.request']), target: 'deviationPending', actions: 'requestDeviation' },
            },
          },
          deviationPending: {
            on: {
              'deviation.approve': { guard: needs(R.deviationPending['deviation.approve']), target: 'entering', actions: ['approveDeviation', 'advance'] },
              'deviation.reject': [
                { guard: needs(R.deviationPending['deviation.reject'], 'wasStarted'), target: 'working', actions: 'rejectDeviation' },
                { guard: needs(R.deviationPending['deviation.reject']), target: 'ready', actions: 'rejectDeviation' },
              ],
            },
          },
        },
      },
      // Not final: a reviewer can still send work back from here.
      complete: {},
    },
  });
}

/** The machine's type, for selectors and the React island. */
export type RunMachine = ReturnType<typeof createRunMachine>;
