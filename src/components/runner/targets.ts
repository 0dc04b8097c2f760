/** Pass targets in the shop's preferred unit with the step's own unit beside (display only; maths in src/domain). */
import { describePassTarget, type PassTarget } from '../../domain/passes';
import { convert, formatQuantity, isTorqueUnit, type Quantity } from '../../domain/units';
import { clean } from '../../domain/units';

/** "33.2 ft·lbf" and "(45 N·m)" — the second is empty when the units agree. */
export function inPreferred(q: Quantity, preferred: string): { main: string; other: string } {
  if (!isTorqueUnit(q.unit) || !isTorqueUnit(preferred) || q.unit === preferred) return { main: formatQuantity(q), other: '' };
  return { main: formatQuantity(convert(q, preferred)), other: formatQuantity(q) };
}

/** A pass target for the big display: main text and the other unit. */
export function targetText(t: PassTarget, preferredTorque: string): { main: string; other: string } {
  if (t.kind !== 'torque') return { main: describePassTarget(t), other: '' };
  const q = inPreferred(t.torque, preferredTorque);
  return { main: t.percent !== undefined ? `${clean(t.percent)} % → ${q.main}` : q.main, other: q.other };
}
