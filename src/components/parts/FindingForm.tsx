/** "Record a finding": what, where, severity, machine shop, parts to replace; then its photos. */
import { useState } from 'react';
import { useForm, useFieldArray } from 'react-hook-form';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { LazyPhotoUploader } from './LazyPhotoUploader';
import type { FindingDto } from './types';

type Props = { jobId: string; runId?: string; stepId?: string; onSaved?: (f: FindingDto) => void; onClose?: () => void };
type Form = { what: string; where: string; severity: 'note' | 'minor' | 'major' | 'critical'; sendToMachineShop: boolean; parts: Array<{ part: string; quantity: string }> };

export const SEVERITIES = [
  { value: 'note', label: 'Note — for the record' },
  { value: 'minor', label: 'Minor — fix when convenient' },
  { value: 'major', label: 'Major — fix before assembly' },
  { value: 'critical', label: 'Critical — stop and tell the lead' },
] as const;

export default function FindingForm({ jobId, runId, stepId, onSaved, onClose }: Props) {
  const [status, setStatus] = useState<Status>(null);
  const [saved, setSaved] = useState<FindingDto | null>(null);
  const { register, handleSubmit, control, setError, formState: { errors, isSubmitting } } = useForm<Form>({ defaultValues: { what: '', where: '', severity: 'minor', sendToMachineShop: false, parts: [] } });
  const parts = useFieldArray({ control, name: 'parts' });

  const submit = handleSubmit(async (v) => {
    setStatus(null);
    try {
      const f = await api<FindingDto>(`/api/jobs/${jobId}/findings`, {
        body: { what: v.what, where: v.where, severity: v.severity, sendToMachineShop: v.sendToMachineShop, partsToReplace: v.parts.map((p) => ({ part: p.part, quantity: Number(p.quantity) })), ...(runId ? { runId } : {}), ...(stepId ? { stepId } : {}) },
      });
      setSaved(f);
      onSaved?.(f);
      setStatus({ kind: 'ok', message: 'Finding recorded. Add photos of it below.' });
    } catch (e) {
      if (isApiError(e)) {
        for (const [k, msg] of Object.entries(e.fields)) {
          const m = /^partsToReplace\.(\d+)\.(part|quantity)$/.exec(k);
          if (m) setError(`parts.${Number(m[1])}.${m[2] as 'part' | 'quantity'}`, { message: msg });
          else if (k === 'what' || k === 'where' || k === 'severity') setError(k, { message: msg });
        }
      }
      setStatus({ kind: 'error', message: `Not recorded: ${(e as Error).message}` });
    }
  });

  if (saved)
    return (
      <section className="tt-card p-4 space-y-3" data-testid="finding-saved">
        <StatusRegion status={status} />
        <p className="text-lg"><strong>{saved.what}</strong>{saved.where ? ` — ${saved.where}` : ''}</p>
        <LazyPhotoUploader scope={{ kind: 'finding', findingId: saved.id }} title="Photos of the finding" />
        {onClose && <button type="button" className="tt-btn tt-btn-quiet" onClick={onClose}>Done</button>}
      </section>
    );

  return (
    <form className="tt-card p-4 space-y-3" onSubmit={submit} noValidate data-testid="finding-form" aria-label="Record a finding">
      <h3 className="text-xl font-semibold">Record a finding</h3>
      <label className="block"><span className="tt-label">What did you find?</span>
        <input className="tt-input" {...register('what', { required: 'Say what you found', maxLength: { value: 300, message: 'At most 300 characters' } })} aria-invalid={!!errors.what} />
        {errors.what && <span className="tt-field-error">{errors.what.message}</span>}
      </label>
      <label className="block"><span className="tt-label">Where?</span>
        <input className="tt-input" placeholder="e.g. cylinder 3, thrust side" {...register('where', { maxLength: { value: 200, message: 'At most 200 characters' } })} />
        {errors.where && <span className="tt-field-error">{errors.where.message}</span>}
      </label>
      <fieldset>
        <legend className="tt-label">Severity</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {SEVERITIES.map((s) => (
            <label key={s.value} className="flex min-h-12 items-center gap-2 rounded-md border-2 border-line px-3">
              <input type="radio" value={s.value} {...register('severity')} className="h-5 w-5" /> {s.label}
            </label>
          ))}
        </div>
      </fieldset>
      <label className="flex min-h-12 items-center gap-2"><input type="checkbox" className="h-6 w-6" {...register('sendToMachineShop')} /> Send to the machine shop</label>
      <fieldset className="space-y-2">
        <legend className="tt-label">Parts to replace</legend>
        {parts.fields.map((f, i) => (
          <div key={f.id} className="grid grid-cols-[1fr_7rem_auto] gap-2 items-start">
            <div>
              <input className="tt-input" aria-label={`Part ${i + 1}`} {...register(`parts.${i}.part`, { required: 'Name the part' })} />
              {errors.parts?.[i]?.part && <span className="tt-field-error">{errors.parts[i]?.part?.message}</span>}
            </div>
            <div>
              <input className="tt-input" inputMode="numeric" aria-label={`Quantity of part ${i + 1}`} {...register(`parts.${i}.quantity`, { required: 'Give a quantity', pattern: { value: /^[1-9][0-9]{0,2}$/, message: '1 to 999' } })} />
              {errors.parts?.[i]?.quantity && <span className="tt-field-error">{errors.parts[i]?.quantity?.message}</span>}
            </div>
            <button type="button" className="tt-btn tt-btn-quiet" onClick={() => parts.remove(i)} aria-label={`Remove part ${i + 1}`}>Remove</button>
          </div>
        ))}
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => parts.append({ part: '', quantity: '1' })}>+ Add a part</button>
      </fieldset>
      <StatusRegion status={status} />
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="tt-btn tt-btn-primary" disabled={isSubmitting}>Save finding</button>
        {onClose && <button type="button" className="tt-btn tt-btn-quiet" onClick={onClose}>Cancel</button>}
      </div>
    </form>
  );
}
