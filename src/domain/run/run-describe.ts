/** Words for what the run expects next: shared by the runner's prompt and every refusal message. */
import type { Hazard, Role } from '../procedure/schema';
import { evaluateMeasure } from '../measure-plan';
import { current, nextAction, slotsOf } from './run-plan';
import type { RunContext, RunPhase } from './run-types';

const ROLE_WORDS: Record<Role, string> = { owner: 'owner', lead: 'lead', technician: 'technician', reviewer: 'reviewer' };

/** "a reviewer", "a reviewer or lead", "an owner". */
export function whoOf(roles: readonly Role[]): string {
  const words = roles.map((r) => ROLE_WORDS[r]);
  const first = words[0] ?? 'member';
  const article = /^[aeiou]/.test(first) ? 'an' : 'a';
  return `${article} ${words.length > 1 ? `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}` : first}`;
}

/** "lifting, hot fluid". */
export const hazardWords = (hazards: readonly Hazard[]): string => hazards.map((h) => h.replace(/-/g, ' ')).join(', ');

/** The one thing the run waits for now, in the shop's words; null once the run is complete. */
export function describeNext(ctx: RunContext, phase: RunPhase): string | null {
  const at = current(ctx);
  if (!at || phase === 'complete') return null;
  const { step, record } = at;
  if (phase === 'deviationPending') return 'Waiting for a lead to approve the deviation';
  if (phase === 'outOfSpec') return 'Next: request a deviation for the out-of-spec readings';
  if (phase === 'ready') {
    if (step.kind === 'hold-point') return `Waiting for ${whoOf(step.signers)} to sign the hold point`;
    if (step.kind === 'caution') return step.mustAcknowledge ? 'Next: acknowledge the caution' : 'Next: read the caution and continue';
    if (step.hazards.length > 0) return `Next: acknowledge the hazards (${hazardWords(step.hazards)}) and start the step`;
    return 'Next: start the step';
  }
  switch (step.kind) {
    case 'fastener-sequence': {
      const action = nextAction(step, record);
      return action ? `Next: pass ${action.pass}, fastener ${action.label}` : 'Next: complete the step';
    }
    case 'measure': {
      const missing = slotsOf(step).find((s) => record.readings[s.key] === undefined);
      if (missing) return `Next: enter the reading for ${missing.label}`;
      return evaluateMeasure(step, record.readings).complete ? 'Next: submit the readings' : 'Next: enter the remaining readings';
    }
    case 'torque':
      return record.applied ? 'Next: complete the step' : 'Next: confirm the applied torque';
    case 'tag-part':
      return 'Next: tag each part (bin and disposition) and complete the step';
    default:
      return 'Next: complete the step';
  }
}
