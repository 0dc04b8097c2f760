/** Fastener sequence: direction, the map and its order, passes, final torque and the pass plan. */
import type { ReactNode } from 'react';
import { Controller, useFormContext, useWatch } from 'react-hook-form';
import type { FastenerMap, Pass, TorqueQuantity } from '../../domain/procedure/schema';
import { expandPasses, describePass } from '../../domain/passes';
import { CheckboxField, SelectField, TextField, useFieldError } from './fields';
import { FastenerMapEditor } from './FastenerMapEditor';
import { PassesEditor } from './PassesEditor';
import { TorqueFields } from './TorqueFields';
import { THREAD_LABELS, options } from './labels';

function firstMapError(e: unknown): string | null {
  if (!e || typeof e !== 'object') return null;
  const m = (e as { message?: unknown }).message;
  if (typeof m === 'string') return m;
  for (const v of Object.values(e)) {
    const found = firstMapError(v);
    if (found) return found;
  }
  return null;
}

export function FastenerSequenceFields({ readOnly }: { readOnly: boolean }) {
  const { control, setValue, formState } = useFormContext();
  const direction = (useWatch({ control, name: 'direction' }) as 'loosen' | 'tighten' | undefined) ?? 'tighten';
  const finalTorque = useWatch({ control, name: 'finalTorque' }) as TorqueQuantity | undefined;
  const finalError = useFieldError('finalTorque');
  return (
    <>
      <div className="grid grid-cols-2 gap-3">
        <SelectField name="direction" label="Direction" options={[{ value: 'loosen', label: 'Loosen' }, { value: 'tighten', label: 'Tighten' }]} />
        <SelectField name="threadCondition" label="Thread condition" options={options(THREAD_LABELS)} />
      </div>
      <TextField name="fastenerPart" label="Fastener part" hint="e.g. Head bolt M12 × 1.5" />
      <CheckboxField name="torqueToYield" label="Torque-to-yield (never reused: added to the parts to replace)" />
      <Controller
        control={control}
        name="map"
        render={({ field }) => (
          <FastenerMapEditor
            value={field.value as FastenerMap}
            onChange={(m) => field.onChange(m)}
            direction={direction}
            readOnly={readOnly}
            error={firstMapError((formState.errors as Record<string, unknown>).map)}
          />
        )}
      />
      <div className="flex items-center gap-3 min-h-12">
        <input
          id="has-final"
          type="checkbox"
          className="h-6 w-6"
          checked={!!finalTorque}
          onChange={(e) => setValue('finalTorque', e.target.checked ? { value: 50, unit: 'N·m' } : undefined, { shouldValidate: true, shouldDirty: true })}
        />
        <label htmlFor="has-final" className="font-semibold">Final torque (percentage passes are stages of it)</label>
      </div>
      {finalTorque && <TorqueFields name="finalTorque" label="Final torque" />}
      {finalError && !finalTorque && <p className="tt-field-error"><span aria-hidden="true">⚠ </span>{finalError}</p>}
      <PassesEditor />
      <PassPlan />
    </>
  );
}

/** The expanded plan, pass by pass, fastener labels in order: what the runner will enforce. */
function PassPlan() {
  const { control } = useFormContext();
  const [direction, map, passes, finalTorque] = useWatch({ control, name: ['direction', 'map', 'passes', 'finalTorque'] }) as [
    'loosen' | 'tighten',
    FastenerMap,
    Pass[],
    TorqueQuantity | undefined,
  ];
  let body: ReactNode;
  try {
    const actions = expandPasses({ direction, map, passes, finalTorque });
    const byPass = new Map<number, typeof actions>();
    for (const a of actions) byPass.set(a.pass, [...(byPass.get(a.pass) ?? []), a]);
    body = (
      <ol className="space-y-1 text-base" data-testid="pass-plan">
        {[...byPass.entries()].map(([n, list]) => (
          <li key={n}>
            <strong>{describePass(n, list[0]?.passCount ?? 0, list[0]!.target)}</strong>
            <span className="text-muted"> — {list.map((a) => a.label).join(' → ')}</span>
          </li>
        ))}
      </ol>
    );
  } catch (e) {
    body = (
      <p className="tt-field-error" data-testid="pass-plan-error">
        <span aria-hidden="true">⚠ </span>
        {e instanceof Error ? e.message : 'The plan cannot be worked out yet.'}
      </p>
    );
  }
  return (
    <section aria-label="Pass plan" className="tt-card p-3">
      <h4 className="font-semibold">Pass plan ({direction === 'loosen' ? 'loosening' : 'tightening'})</h4>
      {body}
    </section>
  );
}
