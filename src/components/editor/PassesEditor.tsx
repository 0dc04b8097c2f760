/** The passes of a fastener sequence: add, remove, reorder; torque shown in both common units. */
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import type { Pass, TorqueQuantity } from '../../domain/procedure/schema';
import { TORQUE_UNITS } from '../../domain/procedure/schema';
import { describePassTarget, passTarget } from '../../domain/passes';
import { FieldError, NumberField, SelectField } from './fields';
import { PASS_KIND_LABELS, convertedTorque, options } from './labels';

const freshPass = (kind: Pass['kind'], unit: TorqueQuantity['unit']): Pass => {
  switch (kind) {
    case 'percent':
      return { kind, percent: 50 };
    case 'torque':
      return { kind, target: { value: 10, unit } };
    case 'angle':
      return { kind, degrees: 90 };
    case 'loosen':
      return { kind, degrees: 90 };
    default:
      return { kind };
  }
};

/** What a pass comes to ("60 % → 54 N·m"), or why it cannot be worked out yet. */
function passSummary(p: Pass | undefined, final: TorqueQuantity | undefined): string {
  if (!p) return '';
  try {
    const t = passTarget(p, final);
    const text = describePassTarget(t);
    return t.kind === 'torque' ? `${text} (${convertedTorque(t.torque.value, t.torque.unit)})` : text;
  } catch (e) {
    return e instanceof Error ? e.message : 'Not complete yet';
  }
}

export function PassesEditor() {
  const { control } = useFormContext();
  const { fields, append, remove, move, update } = useFieldArray({ control, name: 'passes' });
  const passes = (useWatch({ control, name: 'passes' }) as Pass[] | undefined) ?? [];
  const final = useWatch({ control, name: 'finalTorque' }) as TorqueQuantity | undefined;
  const unit = final?.unit ?? 'N·m';
  return (
    <fieldset className="space-y-3" data-testid="passes">
      <legend className="tt-label">Passes</legend>
      <ol className="space-y-3">
        {fields.map((f, i) => {
          const p = passes[i];
          return (
            <li key={f.id} className="tt-card p-3 space-y-2" data-testid={`pass-${i + 1}`}>
              <div className="flex flex-wrap items-end gap-2">
                <span className="font-semibold min-w-16">Pass {i + 1}</span>
                <div className="grow">
                  <label className="tt-label" htmlFor={`pass-kind-${f.id}`}>Kind of pass {i + 1}</label>
                  <select
                    id={`pass-kind-${f.id}`}
                    className="tt-input"
                    value={p?.kind ?? 'snug'}
                    onChange={(e) => update(i, freshPass(e.target.value as Pass['kind'], unit))}
                  >
                    {options(PASS_KIND_LABELS).map((o) => (
                      <option key={o.value} value={o.value}>{o.label}</option>
                    ))}
                  </select>
                </div>
                <button type="button" className="tt-btn tt-btn-quiet" disabled={i === 0} onClick={() => move(i, i - 1)} aria-label={`Move pass ${i + 1} up`}>↑</button>
                <button type="button" className="tt-btn tt-btn-quiet" disabled={i === fields.length - 1} onClick={() => move(i, i + 1)} aria-label={`Move pass ${i + 1} down`}>↓</button>
                <button type="button" className="tt-btn tt-btn-quiet" onClick={() => remove(i)} aria-label={`Remove pass ${i + 1}`}>✕</button>
              </div>
              {p?.kind === 'percent' && <NumberField name={`passes.${i}.percent`} label="Percent of final torque" />}
              {p?.kind === 'torque' && (
                <div className="grid grid-cols-[1fr_9rem] gap-2">
                  <NumberField name={`passes.${i}.target.value`} label="Torque" />
                  <SelectField name={`passes.${i}.target.unit`} label="Unit" options={TORQUE_UNITS.map((u) => ({ value: u, label: u }))} />
                </div>
              )}
              {(p?.kind === 'angle' || p?.kind === 'loosen') && <NumberField name={`passes.${i}.degrees`} label="Degrees" />}
              <p className="text-sm text-muted" data-testid={`pass-summary-${i + 1}`}>{passSummary(p, final)}</p>
            </li>
          );
        })}
      </ol>
      <FieldError name="passes" />
      <div className="flex flex-wrap gap-2">
        {(['snug', 'percent', 'torque', 'angle', 'loosen', 'remove'] as const).map((k) => (
          <button key={k} type="button" className="tt-btn tt-btn-quiet" disabled={fields.length >= 10} onClick={() => append(freshPass(k, unit))}>
            + {PASS_KIND_LABELS[k].replace(/ \(.*\)$/, '')}
          </button>
        ))}
      </div>
    </fieldset>
  );
}
