/** Measure step: unit, spec, instrument, positions and how readings are reduced. */
import { useFormContext, useWatch } from 'react-hook-form';
import { ANGLE_UNITS, LENGTH_UNITS, TORQUE_UNITS, type MeasureMethod } from '../../domain/procedure/schema';
import { UNIT_LABELS } from '../../domain/units';
import { FieldError, LinesField, NumberField, SelectField } from './fields';
import { METHOD_LABELS, options } from './labels';

const UNIT_OPTIONS = [...LENGTH_UNITS, ...TORQUE_UNITS, ...ANGLE_UNITS].map((u) => ({ value: u, label: UNIT_LABELS[u] }));

/** A fresh method of a kind, keeping nothing from the old one that does not fit. */
function methodOf(kind: MeasureMethod['kind']): MeasureMethod {
  switch (kind) {
    case 'journal':
      return { kind, maxTaper: 0.01, maxOutOfRound: 0.01 };
    case 'valve-shim':
      return { kind, stock: { kind: 'range', from: 2, to: 3, step: 0.05 } };
    default:
      return { kind };
  }
}

export function MeasureFields() {
  const { control, setValue, register } = useFormContext();
  const method = useWatch({ control, name: 'method' }) as MeasureMethod | undefined;
  const unit = useWatch({ control, name: 'unit' }) as string | undefined;
  const stockKind = method?.kind === 'valve-shim' ? method.stock.kind : null;
  return (
    <>
      <div className="grid grid-cols-2 gap-3">
        <SelectField name="unit" label="Reading unit" options={UNIT_OPTIONS} />
        <SelectField name="spec.unit" label="Spec unit" options={UNIT_OPTIONS} />
      </div>
      <fieldset className="grid grid-cols-3 gap-3">
        <legend className="tt-label">Spec</legend>
        <NumberField name="spec.nominal" label="Nominal" />
        <NumberField name="spec.min" label="Min" />
        <NumberField name="spec.max" label="Max" />
      </fieldset>
      <FieldError name="spec" />
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="tt-label">Instrument</legend>
        <NumberField name="instrument.resolution" label={`Resolution (${unit ?? 'unit'})`} hint="Smallest step it reads." />
        <div>
          <label className="tt-label" htmlFor="instrument-name">Instrument name</label>
          <input id="instrument-name" className="tt-input" {...register('instrument.name')} />
          <FieldError name="instrument.name" />
        </div>
      </fieldset>
      <LinesField name="positions" label="Positions" hint="One position per line, e.g. Main 1." />
      <div>
        <label className="tt-label" htmlFor="method-kind">Method</label>
        <select
          id="method-kind"
          className="tt-input"
          value={method?.kind ?? 'direct'}
          onChange={(e) => setValue('method', methodOf(e.target.value as MeasureMethod['kind']), { shouldValidate: true, shouldDirty: true })}
        >
          {options(METHOD_LABELS).map((o) => (
            <option key={o.value} value={o.value}>{o.label}</option>
          ))}
        </select>
      </div>
      {method?.kind === 'journal' && (
        <div className="grid grid-cols-2 gap-3" key="journal">
          <NumberField name="method.maxTaper" label={`Max taper (${unit ?? ''})`} />
          <NumberField name="method.maxOutOfRound" label={`Max out-of-round (${unit ?? ''})`} />
        </div>
      )}
      {method?.kind === 'valve-shim' && (
        <fieldset className="space-y-2" key="shim">
          <legend className="tt-label">Shims the shop stocks</legend>
          <div className="flex gap-4">
            {(['range', 'list'] as const).map((k) => (
              <label key={k} className="flex items-center gap-2 min-h-12">
                <input
                  type="radio"
                  name="stock-kind"
                  className="h-6 w-6"
                  checked={stockKind === k}
                  onChange={() =>
                    setValue('method.stock', k === 'range' ? { kind: 'range', from: 2, to: 3, step: 0.05 } : { kind: 'list', sizes: [2, 2.05, 2.1] }, { shouldValidate: true, shouldDirty: true })
                  }
                />
                {k === 'range' ? 'A range with a step' : 'A list of sizes'}
              </label>
            ))}
          </div>
          {stockKind === 'range' && (
            <div className="grid grid-cols-3 gap-3" key="range">
              <NumberField name="method.stock.from" label="From" />
              <NumberField name="method.stock.to" label="To" />
              <NumberField name="method.stock.step" label="Step" />
            </div>
          )}
          {stockKind === 'list' && <ShimSizes key="list" />}
        </fieldset>
      )}
    </>
  );
}

function ShimSizes() {
  const { control, setValue } = useFormContext();
  const sizes = (useWatch({ control, name: 'method.stock.sizes' }) as number[] | undefined) ?? [];
  return (
    <div>
      <label className="tt-label" htmlFor="shim-sizes">Sizes</label>
      <input
        id="shim-sizes"
        className="tt-input"
        defaultValue={sizes.join(' ')}
        onChange={(e) =>
          setValue(
            'method.stock.sizes',
            e.target.value.split(/[\s,;]+/).filter((t) => t !== '').map(Number),
            { shouldValidate: true, shouldDirty: true },
          )
        }
      />
      <p className="text-sm text-muted">Separate sizes with spaces, e.g. 2.00 2.05 2.10.</p>
      <FieldError name="method.stock.sizes" />
    </div>
  );
}
