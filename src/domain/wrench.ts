/**
 * Torque wrench with an in-line extension or crow's-foot adapter. The adapter lengthens the
 * lever, so the fastener sees more than the wrench is set to:
 *
 *   setting = desired × L / (L + E)        applied = setting × (L + E) / L
 *
 * L is the wrench's lever length (centre of the grip to the centre of the drive), E the
 * adapter's length measured along the wrench's axis (centre of the drive to the centre of
 * the fastener). Formula as in U.S. Army TM 1-1500-204-23-9 (torque wrench attachments,
 * "extending lever length"). An adapter at 90° to the wrench changes nothing and needs no
 * correction; this module covers the in-line case only.
 */
import { DomainError } from './errors';
import type { LengthUnit, TorqueQuantity } from './procedure/schema';
import { assertTorque, convert, isLengthUnit, isUnit, type Quantity } from './units';

function lengthMm(q: Quantity<LengthUnit>, what: string): number {
  if (!q || typeof q !== 'object') throw new DomainError('invalid-input', `${what} is required`);
  if (!isLengthUnit(q.unit)) {
    if (isUnit(q.unit)) throw new DomainError('unit-mismatch', `${what} needs a length unit, not ${q.unit}`);
    throw new DomainError('unknown-unit', `${what} has an unknown unit "${String(q.unit)}"`);
  }
  if (typeof q.value !== 'number' || !Number.isFinite(q.value))
    throw new DomainError('invalid-input', `${what} must be a finite number (got ${String(q.value)})`);
  if (q.value <= 0) throw new DomainError('invalid-input', `${what} must be greater than zero (got ${q.value} ${q.unit})`);
  return convert(q, 'mm').value;
}

/**
 * What to set the wrench to so the fastener gets `desired`, in `desired`'s unit. Lengths may
 * be in any length units (mixed is fine); zero or negative lengths are refused.
 */
export function wrenchSetting(desired: TorqueQuantity, wrenchLength: Quantity<LengthUnit>, extensionLength: Quantity<LengthUnit>): TorqueQuantity {
  assertTorque(desired, 'Desired torque');
  const l = lengthMm(wrenchLength, 'Wrench length');
  const e = lengthMm(extensionLength, 'Extension length');
  return { value: (desired.value * l) / (l + e), unit: desired.unit };
}

/** The torque the fastener gets when the wrench is set to `setting` with the adapter on. */
export function appliedTorque(setting: TorqueQuantity, wrenchLength: Quantity<LengthUnit>, extensionLength: Quantity<LengthUnit>): TorqueQuantity {
  assertTorque(setting, 'Wrench setting');
  const l = lengthMm(wrenchLength, 'Wrench length');
  const e = lengthMm(extensionLength, 'Extension length');
  return { value: (setting.value * (l + e)) / l, unit: setting.unit };
}
