/** A torque value with its unit and the same torque in the other common unit, live. */
import { useFormContext, useWatch } from 'react-hook-form';
import { TORQUE_UNITS } from '../../domain/procedure/schema';
import { convertedTorque } from './labels';
import { NumberField, SelectField } from './fields';

const UNIT_OPTIONS = TORQUE_UNITS.map((u) => ({ value: u, label: u }));

export function TorqueFields({ name, label }: { name: string; label: string }) {
  const { control } = useFormContext();
  const value: unknown = useWatch({ control, name: `${name}.value` });
  const unit: unknown = useWatch({ control, name: `${name}.unit` });
  const other = convertedTorque(value, unit);
  return (
    <fieldset className="grid grid-cols-[1fr_9rem] gap-2 items-start">
      <legend className="sr-only">{label}</legend>
      <NumberField name={`${name}.value`} label={label} />
      <SelectField name={`${name}.unit`} label="Unit" options={UNIT_OPTIONS} />
      <p className="col-span-2 text-sm text-muted" data-testid={`converted-${name}`} aria-live="polite">{other || '—'}</p>
    </fieldset>
  );
}
