/**
 * Multi-pass plans for a fastener sequence: each pass works every fastener once, in the
 * step's order. `expandPasses` turns a step into the ordered list of actions the runner
 * enforces.
 */
import { DomainError } from './errors';
import { centreOutOrder, crossOrder, looseningOrder, validateFasteners, validateManualOrder } from './fastener-order';
import type { FastenerMap, Pass, TorqueQuantity } from './procedure/schema';
import { assertFinite, assertTorque, clean, formatQuantity } from './units';

export type PassTarget =
  | { kind: 'snug' }
  /** `percent` is set when the stage came from a percentage of the final torque. */
  | { kind: 'torque'; torque: TorqueQuantity; percent?: number }
  | { kind: 'angle'; degrees: number }
  | { kind: 'loosen'; degrees: number }
  | { kind: 'remove' };

export type FastenerAction = {
  /** 1-based pass number. */
  pass: number;
  passCount: number;
  /** 1-based position within the pass. */
  index: number;
  fastenerId: string;
  label: string;
  target: PassTarget;
};

export type SequenceInput = {
  direction: 'loosen' | 'tighten';
  passes: Pass[];
  finalTorque?: TorqueQuantity;
  map: FastenerMap;
};

/**
 * The order a sequence step works its fasteners in: `map.order` when it is set (validated:
 * every fastener exactly once), else generated — cross for `orderMethod: 'cross'`, otherwise
 * centre-out to tighten and its exact reverse to loosen. A 'manual' method with no order set
 * is an error ('invalid-order') rather than a guess.
 */
export function sequenceOrder(step: Pick<SequenceInput, 'direction' | 'map'>): string[] {
  const map = step.map;
  if (!map || typeof map !== 'object') throw new DomainError('invalid-input', 'The step has no fastener map');
  validateFasteners(map.fasteners);
  const order = map.order ?? [];
  if (order.length > 0) return validateManualOrder(map.fasteners, order);
  if (map.orderMethod === 'manual')
    throw new DomainError('invalid-order', 'The order is set to manual but no order has been entered');
  if (map.orderMethod === 'cross') return crossOrder(map.fasteners);
  if (step.direction === 'loosen') return looseningOrder(map.fasteners);
  if (step.direction === 'tighten') return centreOutOrder(map.fasteners);
  throw new DomainError('invalid-input', `Unknown direction "${String(step.direction)}"`);
}

/** One pass as a target. Percent stages become torque stages of `finalTorque`, in its unit. */
export function passTarget(p: Pass, finalTorque?: TorqueQuantity): PassTarget {
  switch (p?.kind) {
    case 'snug':
      return { kind: 'snug' };
    case 'percent': {
      assertFinite(p.percent, 'Percentage');
      if (p.percent <= 0 || p.percent > 100)
        throw new DomainError('invalid-input', `A percentage stage must be above 0 % and at most 100 % (got ${p.percent} %)`);
      if (!finalTorque) throw new DomainError('invalid-input', 'Percentage passes need a final torque');
      assertTorque(finalTorque, 'Final torque');
      return { kind: 'torque', torque: { value: clean((finalTorque.value * p.percent) / 100), unit: finalTorque.unit }, percent: p.percent };
    }
    case 'torque':
      assertTorque(p.target, 'Pass torque');
      return { kind: 'torque', torque: { value: p.target.value, unit: p.target.unit } };
    case 'angle':
      assertAngle(p.degrees, 'Angle');
      return { kind: 'angle', degrees: p.degrees };
    case 'loosen':
      assertAngle(p.degrees, 'Loosening angle');
      return { kind: 'loosen', degrees: p.degrees };
    case 'remove':
      return { kind: 'remove' };
    default:
      throw new DomainError('invalid-input', `Unknown pass kind "${String((p as { kind?: unknown })?.kind)}"`);
  }
}

function assertAngle(deg: number, what: string): void {
  assertFinite(deg, what);
  if (deg <= 0) throw new DomainError('invalid-input', `${what} must be greater than zero (got ${deg}°)`);
}

/** Every (pass, fastener) action in the order the runner enforces: pass by pass, in order. */
export function expandPasses(step: SequenceInput): FastenerAction[] {
  if (!step || typeof step !== 'object') throw new DomainError('invalid-input', 'A fastener sequence is required');
  if (!Array.isArray(step.passes) || step.passes.length === 0)
    throw new DomainError('invalid-input', 'Add at least one pass');
  const order = sequenceOrder(step);
  const labelOf = new Map(step.map.fasteners.map((f) => [f.id, f.label]));
  const targets = step.passes.map((p) => passTarget(p, step.finalTorque));
  const passCount = targets.length;
  const actions: FastenerAction[] = [];
  targets.forEach((target, i) => {
    order.forEach((fastenerId, j) => {
      actions.push({ pass: i + 1, passCount, index: j + 1, fastenerId, label: labelOf.get(fastenerId) ?? fastenerId, target });
    });
  });
  return actions;
}

const TURN_WORDS: Record<number, string> = { 45: '⅛ turn', 90: '¼ turn', 135: '⅜ turn', 180: '½ turn', 270: '¾ turn', 360: '1 turn' };

/** "¼ turn", "2 turns", "1½ turns", or '' when the angle is not a simple fraction of a turn. */
export function turnWords(degrees: number): string {
  const known = TURN_WORDS[degrees];
  if (known) return known;
  if (degrees > 360 && degrees % 90 === 0) {
    const whole = Math.floor(degrees / 360);
    const rest = TURN_WORDS[degrees % 360]?.replace(' turn', '') ?? '';
    return `${whole}${rest} turns`;
  }
  return '';
}

const deg = (d: number) => `${clean(d)}°`;

/** "snug", "45 N·m", "30 % → 45 N·m", "+90°", "loosen 90° (¼ turn)", "remove". */
export function describePassTarget(t: PassTarget): string {
  switch (t.kind) {
    case 'snug':
      return 'snug';
    case 'torque': {
      const torque = formatQuantity(t.torque);
      return t.percent !== undefined ? `${clean(t.percent)} % → ${torque}` : torque;
    }
    case 'angle':
      return `+${deg(t.degrees)}`;
    case 'loosen': {
      const words = turnWords(t.degrees);
      return words ? `loosen ${deg(t.degrees)} (${words})` : `loosen ${deg(t.degrees)}`;
    }
    case 'remove':
      return 'remove';
    default:
      throw new DomainError('invalid-input', `Unknown pass target "${String((t as { kind?: unknown }).kind)}"`);
  }
}

/** "Pass 2 of 3: 60 % → 90 N·m" */
export function describePass(pass: number, passCount: number, t: PassTarget): string {
  return `Pass ${pass} of ${passCount}: ${describePassTarget(t)}`;
}
