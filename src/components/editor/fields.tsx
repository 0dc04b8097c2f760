/** Small form controls bound to the surrounding react-hook-form (useFormContext), errors beside them. */
import { useId, useState, type ReactNode } from 'react';
import { Controller, get, useFormContext } from 'react-hook-form';

/** zod's wording for a missing or non-numeric number, in plain words. */
export function humanMessage(message: unknown): string {
  const m = typeof message === 'string' ? message : 'Not valid';
  if (/expected number/i.test(m)) return 'Enter a number';
  if (/expected string/i.test(m)) return 'Required';
  if (/too small.*array|>=1 items/i.test(m)) return 'Add at least one';
  return m;
}

export function useFieldError(name: string): string | null {
  const { formState } = useFormContext();
  const e = get(formState.errors, name) as { message?: unknown; root?: { message?: unknown } } | undefined;
  if (!e) return null;
  if (e.message !== undefined) return humanMessage(e.message);
  if (e.root?.message !== undefined) return humanMessage(e.root.message);
  return null;
}

export function FieldError({ name, id }: { name: string; id?: string }) {
  const error = useFieldError(name);
  if (!error) return null;
  return (
    <p className="tt-field-error" id={id} data-testid={`error-${name}`}>
      <span aria-hidden="true">⚠ </span>
      {error}
    </p>
  );
}

type Common = { name: string; label: string; hint?: string; className?: string };

export function TextField({ name, label, hint, className, multiline = false, list }: Common & { multiline?: boolean; list?: string }) {
  const { register } = useFormContext();
  const id = useId();
  const invalid = !!useFieldError(name);
  return (
    <div className={className}>
      <label className="tt-label" htmlFor={id}>{label}</label>
      {multiline ? (
        <textarea id={id} className="tt-input min-h-28" aria-invalid={invalid} aria-describedby={`${id}-e`} {...register(name)} />
      ) : (
        <input id={id} className="tt-input" aria-invalid={invalid} aria-describedby={`${id}-e`} list={list} {...register(name)} />
      )}
      {hint && <p className="text-sm text-muted">{hint}</p>}
      <FieldError name={name} id={`${id}-e`} />
    </div>
  );
}

/** A number input; an empty box is `undefined` so optional numbers can be cleared. */
export function NumberField({ name, label, hint, className, step = 'any', suffix }: Common & { step?: string; suffix?: ReactNode }) {
  const { register } = useFormContext();
  const id = useId();
  const invalid = !!useFieldError(name);
  return (
    <div className={className}>
      <label className="tt-label" htmlFor={id}>{label}</label>
      <div className="flex items-center gap-2">
        <input
          id={id}
          type="number"
          inputMode="decimal"
          step={step}
          className="tt-input"
          aria-invalid={invalid}
          aria-describedby={`${id}-e`}
          {...register(name, { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v)) })}
        />
        {suffix}
      </div>
      {hint && <p className="text-sm text-muted">{hint}</p>}
      <FieldError name={name} id={`${id}-e`} />
    </div>
  );
}

export function SelectField({ name, label, options, className }: Common & { options: ReadonlyArray<{ value: string; label: string }> }) {
  const { register } = useFormContext();
  const id = useId();
  return (
    <div className={className}>
      <label className="tt-label" htmlFor={id}>{label}</label>
      <select id={id} className="tt-input" {...register(name)}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>{o.label}</option>
        ))}
      </select>
      <FieldError name={name} />
    </div>
  );
}

export function CheckboxField({ name, label, className }: Common) {
  const { register } = useFormContext();
  const id = useId();
  return (
    <div className={`flex items-center gap-3 min-h-12 ${className ?? ''}`}>
      <input id={id} type="checkbox" className="h-6 w-6 accent-accent" {...register(name)} />
      <label htmlFor={id} className="font-semibold">{label}</label>
      <FieldError name={name} />
    </div>
  );
}

/** A list of short texts edited one per line (tools, positions, things to look for). */
export function LinesField({ name, label, hint, className }: Common) {
  const { control } = useFormContext();
  const id = useId();
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => <LinesInput id={id} label={label} hint={hint} className={className} value={(field.value as string[] | undefined) ?? []} onChange={field.onChange} onBlur={field.onBlur} error={fieldState.error ? listError(fieldState.error) : null} name={name} />}
    />
  );
}

type MaybeError = { message?: unknown; root?: { message?: unknown } } & Record<string, unknown>;
/** The first message in an array field's error (its own, or one of its items'). */
function listError(e: MaybeError): string {
  if (e.message !== undefined) return humanMessage(e.message);
  if (e.root?.message !== undefined) return humanMessage(e.root.message);
  for (const [k, v] of Object.entries(e)) {
    if (/^\d+$/.test(k) && v && typeof v === 'object' && 'message' in v) return `Line ${Number(k) + 1}: ${humanMessage((v as { message?: unknown }).message)}`;
  }
  return 'Not valid';
}

function LinesInput(props: { id: string; name: string; label: string; hint?: string; className?: string; value: string[]; onChange: (v: string[]) => void; onBlur: () => void; error: string | null }) {
  const [text, setText] = useState(props.value.join('\n'));
  return (
    <div className={props.className}>
      <label className="tt-label" htmlFor={props.id}>{props.label}</label>
      <textarea
        id={props.id}
        className="tt-input min-h-24"
        value={text}
        aria-invalid={!!props.error}
        onBlur={props.onBlur}
        onChange={(e) => {
          setText(e.target.value);
          props.onChange(e.target.value.split('\n').map((l) => l.trim()).filter((l) => l !== ''));
        }}
      />
      <p className="text-sm text-muted">{props.hint ?? 'One per line.'}</p>
      {props.error && (
        <p className="tt-field-error" data-testid={`error-${props.name}`}>
          <span aria-hidden="true">⚠ </span>
          {props.error}
        </p>
      )}
    </div>
  );
}
