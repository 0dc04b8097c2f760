/**
 * The form of one step, validated with the same per-kind schema the API uses. Every change
 * that passes the schema goes to the editor at once (and from there to autosave); a change
 * that does not stays in the form with its message beside the field, and saving waits.
 */
import { useEffect, useId, useMemo, useRef } from 'react';
import { FormProvider, useForm, useFormContext, useWatch, type FieldValues, type Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type * as z from 'zod';
import {
  actionStep, cautionStep, fastenerSequenceStep, hazard, holdPointStep, inspectStep, measureStep, replaceStep, tagPartStep, torqueStep,
  type Step, type StepKind,
} from '../../domain/procedure/schema';
import { renderRichTextHtml } from '../../domain/procedure/rich-text';
import { TextField, FieldError } from './fields';
import { HAZARD_LABELS, KIND_LABELS, KIND_MARKS } from './labels';
import { ActionFields, CautionFields, HoldPointFields, InspectFields, ReplaceFields, TagPartFields, TorqueStepFields } from './KindFields';
import { MeasureFields } from './MeasureFields';
import { FastenerSequenceFields } from './FastenerSequenceFields';

export const STEP_SCHEMAS: Record<StepKind, z.ZodType<Step>> = {
  action: actionStep,
  'fastener-sequence': fastenerSequenceStep,
  torque: torqueStep,
  measure: measureStep,
  'tag-part': tagPartStep,
  inspect: inspectStep,
  caution: cautionStep,
  'hold-point': holdPointStep,
  replace: replaceStep,
} as unknown as Record<StepKind, z.ZodType<Step>>;

export interface StepFormProps {
  step: Step;
  sections: string[];
  readOnly: boolean;
  /** Server-side messages for this step, keyed by path inside the step (e.g. `passes.0.percent`). */
  serverErrors: Record<string, string>;
  /** What the form held last time it was open, when that did not pass the schema. */
  initialValues?: unknown;
  onValid: (step: Step) => void;
  onValidity: (stepId: string, problem: string | null, values?: unknown) => void;
}

export function StepForm({ step, sections, readOnly, serverErrors, initialValues, onValid, onValidity }: StepFormProps) {
  const schema = STEP_SCHEMAS[step.kind];
  const resolver = useMemo(() => zodResolver(schema as never) as unknown as Resolver<FieldValues>, [schema]);
  const form = useForm<FieldValues>({ resolver, defaultValues: structuredClone(initialValues ?? step) as FieldValues, mode: 'all' });
  const listId = useId();
  const onValidRef = useRef(onValid);
  onValidRef.current = onValid;
  const onValidityRef = useRef(onValidity);
  onValidityRef.current = onValidity;

  useEffect(() => {
    const sub = form.watch((values) => {
      const r = schema.safeParse(values);
      if (r.success) {
        onValidityRef.current(step.id, null);
        onValidRef.current({ ...r.data, id: step.id });
      } else {
        onValidityRef.current(step.id, `"${String(values.title ?? '') || step.title}" has fields to fix`, structuredClone(values));
        void form.trigger();
      }
    });
    // Values restored from an earlier, unfinished edit show their messages straight away.
    if (initialValues) void form.trigger();
    return () => sub.unsubscribe();
  }, [form, schema, step.id, step.title]);

  useEffect(() => {
    for (const [path, message] of Object.entries(serverErrors)) form.setError(path, { type: 'server', message });
  }, [serverErrors, form]);

  return (
    <FormProvider {...form}>
      <form onSubmit={(e) => e.preventDefault()} noValidate aria-label={`Step: ${step.title}`} data-testid="step-form" data-kind={step.kind}>
        <fieldset disabled={readOnly} className="space-y-4">
          <legend className="text-sm uppercase tracking-wide text-muted">
            <span aria-hidden="true">{KIND_MARKS[step.kind]} </span>
            {KIND_LABELS[step.kind]} step
          </legend>
          <TextField name="title" label="Title" />
          <TextField name="section" label="Section" hint="Type an existing section or a new one; empty for none." list={listId} />
          <datalist id={listId}>
            {sections.filter((s) => s !== '').map((s) => (
              <option key={s} value={s} />
            ))}
          </datalist>
          <HazardsField />
          <BodyField />
          <KindFields kind={step.kind} readOnly={readOnly} />
          <FieldError name="root" />
        </fieldset>
      </form>
    </FormProvider>
  );
}

function KindFields({ kind, readOnly }: { kind: StepKind; readOnly: boolean }) {
  switch (kind) {
    case 'action':
      return <ActionFields />;
    case 'fastener-sequence':
      return <FastenerSequenceFields readOnly={readOnly} />;
    case 'torque':
      return <TorqueStepFields />;
    case 'measure':
      return <MeasureFields />;
    case 'tag-part':
      return <TagPartFields />;
    case 'inspect':
      return <InspectFields />;
    case 'caution':
      return <CautionFields />;
    case 'hold-point':
      return <HoldPointFields />;
    case 'replace':
      return <ReplaceFields />;
  }
}

function HazardsField() {
  return (
    <fieldset>
      <legend className="tt-label">Hazards</legend>
      <div className="flex flex-wrap gap-x-5">
        {hazard.options.map((h) => (
          <HazardCheckbox key={h} value={h} />
        ))}
      </div>
    </fieldset>
  );
}

function HazardCheckbox({ value }: { value: (typeof hazard.options)[number] }) {
  const { register } = useFormContext();
  const id = useId();
  return (
    <label htmlFor={id} className="flex items-center gap-2 min-h-12">
      <input id={id} type="checkbox" value={value} className="h-6 w-6" {...register('hazards')} />
      {HAZARD_LABELS[value]}
    </label>
  );
}

function BodyField() {
  const { control } = useFormContext();
  const body = (useWatch({ control, name: 'body' }) as string | undefined) ?? '';
  const html = useMemo(() => renderRichTextHtml(body), [body]);
  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <TextField name="body" label="Instructions" multiline hint="**bold**, *italic*, `code`, lines starting with - for a list." />
      <div>
        <p className="tt-label" id="preview-label">Preview</p>
        <div className="tt-card p-3 min-h-28 prose-sm" aria-labelledby="preview-label" data-testid="body-preview" dangerouslySetInnerHTML={{ __html: html }} />
      </div>
    </div>
  );
}
