/** The fields of the smaller step kinds; each reads and writes the surrounding form. */
import { Controller, useFieldArray, useFormContext } from 'react-hook-form';
import { ROLE_LABELS, SHOP_ROLES } from '../../lib/access';
import { CheckboxField, FieldError, LinesField, NumberField, SelectField, TextField } from './fields';
import { DISPOSITION_LABELS, SEVERITY_LABELS, options } from './labels';
import { TorqueFields } from './TorqueFields';

export function ActionFields() {
  return (
    <>
      <LinesField name="tools" label="Tools" hint="One tool per line." />
      <CheckboxField name="photoRequired" label="Photo required" />
    </>
  );
}

export function TorqueStepFields() {
  return (
    <>
      <TorqueFields name="target" label="Torque target" />
      <NumberField name="angleDegrees" label="Then turn by (degrees)" hint="Leave empty for torque only." />
      <TextField name="fastenerLabel" label="Fastener" hint="e.g. Crank pulley bolt" />
    </>
  );
}

export function TagPartFields() {
  return (
    <>
      <TextField name="partName" label="Part" />
      <LinesField name="positions" label="Positions" hint="One position per line, e.g. Cyl 1 intake." />
      <TextField name="bin" label="Bin" />
      <CheckboxField name="photoRequired" label="Photo required" />
      <SelectField name="defaultDisposition" label="Default disposition" options={options(DISPOSITION_LABELS)} />
    </>
  );
}

export function InspectFields() {
  return <LinesField name="lookFor" label="Look for" hint="One thing per line, e.g. Cracks between valve seats." />;
}

export function CautionFields() {
  return (
    <>
      <SelectField name="severity" label="Severity" options={options(SEVERITY_LABELS)} />
      <CheckboxField name="mustAcknowledge" label="Technician must acknowledge" />
    </>
  );
}

export function HoldPointFields() {
  const { control } = useFormContext();
  return (
    <Controller
      control={control}
      name="signers"
      render={({ field }) => {
        const value = (field.value as string[] | undefined) ?? [];
        return (
          <fieldset>
            <legend className="tt-label">Who signs</legend>
            <div className="flex flex-wrap gap-4">
              {SHOP_ROLES.map((r) => (
                <label key={r} className="flex items-center gap-2 min-h-12">
                  <input
                    type="checkbox"
                    className="h-6 w-6"
                    checked={value.includes(r)}
                    onChange={(e) => field.onChange(e.target.checked ? [...value, r] : value.filter((v) => v !== r))}
                  />
                  {ROLE_LABELS[r]}
                </label>
              ))}
            </div>
            <FieldError name="signers" />
          </fieldset>
        );
      }}
    />
  );
}

export function ReplaceFields() {
  const { control } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name: 'parts' });
  return (
    <fieldset className="space-y-2">
      <legend className="tt-label">Parts to replace</legend>
      {fields.map((f, i) => (
        <div key={f.id} className="grid grid-cols-[1fr_6rem_1fr_auto] gap-2 items-end">
          <TextField name={`parts.${i}.part`} label={`Part ${i + 1}`} />
          <NumberField name={`parts.${i}.quantity`} label="Quantity" step="1" />
          <TextField name={`parts.${i}.note`} label="Note" />
          <button type="button" className="tt-btn tt-btn-quiet" onClick={() => remove(i)} aria-label={`Remove part ${i + 1}`}>✕ Remove</button>
        </div>
      ))}
      <FieldError name="parts" />
      <button type="button" className="tt-btn tt-btn-quiet" onClick={() => append({ part: '', quantity: 1, note: '' })}>+ Add part</button>
    </fieldset>
  );
}
