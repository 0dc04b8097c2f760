/** Action, torque, inspect, tag-part and replace steps once started: their fields, then "Mark done". */
import { useState } from 'react';
import type { Disposition, Step, TorqueUnit } from '../../domain/procedure/schema';
import { TORQUE_UNITS } from '../../domain/units';
import type { RunEventDraft } from './use-run-sync';
import { inPreferred } from './targets';
import type { StepPanelProps } from './step-panel';
import { SkipButton } from './StartPanel';

const DISPOSITIONS: Array<{ value: Disposition; label: string }> = [
  { value: 'reuse', label: 'Reuse' },
  { value: 'replace', label: 'Replace' },
  { value: 'machine-shop', label: 'Machine shop' },
  { value: 'scrap', label: 'Scrap' },
];

type Tag = { position: string; disposition: Disposition; bin: string };

export function WorkPanel({ step, sync, units, onSkip }: StepPanelProps & { step: Step; onSkip: () => void }) {
  const [note, setNote] = useState('');
  const [applied, setApplied] = useState('');
  const [unit, setUnit] = useState<TorqueUnit>(step.kind === 'torque' ? step.target.unit : 'N·m');
  const [tags, setTags] = useState<Tag[]>(() => (step.kind === 'tag-part' ? step.positions.map((p) => ({ position: p, disposition: step.defaultDisposition, bin: step.bin })) : []));

  const appliedValue = applied.trim() === '' ? null : Number(applied.replace(',', '.'));
  const appliedOk = appliedValue !== null && Number.isFinite(appliedValue) && appliedValue > 0;
  const event: RunEventDraft = {
    type: 'step.complete',
    stepId: step.id,
    ...(note.trim() ? { note: note.trim() } : {}),
    ...(step.kind === 'torque' && appliedOk ? { applied: { value: appliedValue, unit } } : {}),
    ...(step.kind === 'tag-part' ? { tags: tags.map((t) => ({ position: t.position, disposition: t.disposition, ...(t.bin.trim() ? { bin: t.bin.trim() } : {}) })) } : {}),
  };
  const can = sync.can(event);
  const appliedProblem = step.kind === 'torque' && applied.trim() !== '' && !appliedOk ? 'Enter the torque you applied, a number above zero' : null;

  return (
    <div className="space-y-4">
      {step.kind === 'action' && step.tools.length > 0 && <p><strong>Tools:</strong> {step.tools.join(', ')}</p>}
      {step.kind === 'inspect' && step.lookFor.length > 0 && (
        <div>
          <h3 className="font-semibold">Look for</h3>
          <ul className="list-disc pl-6">{step.lookFor.map((l) => <li key={l}>{l}</li>)}</ul>
        </div>
      )}
      {step.kind === 'replace' && (
        <div>
          <h3 className="font-semibold">Parts to replace</h3>
          <ul className="list-disc pl-6">{step.parts.map((p) => <li key={p.part}>{p.quantity} × {p.part}{p.note ? ` — ${p.note}` : ''}</li>)}</ul>
        </div>
      )}
      {step.kind === 'torque' && (
        <div className="space-y-2">
          <p className="text-2xl">
            Target: <strong>{inPreferred(step.target, units.torque).main}</strong>
            {inPreferred(step.target, units.torque).other && <span className="text-muted"> ({inPreferred(step.target, units.torque).other})</span>}
            {step.angleDegrees ? ` + ${step.angleDegrees}°` : ''}
            {step.fastenerLabel ? ` — ${step.fastenerLabel}` : ''}
          </p>
          <label className="tt-label" htmlFor="applied-torque">Torque applied</label>
          <div className="flex gap-2">
            <input id="applied-torque" className="tt-input text-2xl" inputMode="decimal" value={applied} onChange={(e) => setApplied(e.target.value)} aria-invalid={!!appliedProblem} />
            <select className="tt-input w-40" aria-label="Unit of the applied torque" value={unit} onChange={(e) => setUnit(e.target.value as TorqueUnit)}>
              {TORQUE_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
            </select>
          </div>
          {appliedProblem && <p className="tt-field-error">{appliedProblem}</p>}
        </div>
      )}
      {step.kind === 'tag-part' && (
        <fieldset className="space-y-2">
          <legend className="font-semibold">Tag each {step.partName}</legend>
          {tags.map((t, i) => (
            <div key={t.position} className="grid grid-cols-[8rem_1fr_1fr] gap-2 items-center" data-tag-position={t.position}>
              <span className="font-semibold">{t.position}</span>
              <select className="tt-input" aria-label={`Disposition of ${t.position}`} value={t.disposition} onChange={(e) => setTags(tags.map((x, j) => (j === i ? { ...x, disposition: e.target.value as Disposition } : x)))}>
                {DISPOSITIONS.map((d) => <option key={d.value} value={d.value}>{d.label}</option>)}
              </select>
              <input className="tt-input" aria-label={`Bin for ${t.position}`} placeholder="Bin" value={t.bin} onChange={(e) => setTags(tags.map((x, j) => (j === i ? { ...x, bin: e.target.value } : x)))} />
            </div>
          ))}
        </fieldset>
      )}
      <div>
        <label className="tt-label" htmlFor="step-note">Note (optional)</label>
        <textarea id="step-note" className="tt-input min-h-20" value={note} maxLength={1000} onChange={(e) => setNote(e.target.value)} />
      </div>
      <div className="flex flex-wrap gap-3">
        <button type="button" className="tt-btn tt-btn-primary text-2xl min-h-16 flex-1" data-primary="true" disabled={!can || !!appliedProblem} onClick={() => sync.record(event)} data-testid="mark-done">
          Mark done
        </button>
        <SkipButton step={step} sync={sync} onSkip={onSkip} />
      </div>
    </div>
  );
}
