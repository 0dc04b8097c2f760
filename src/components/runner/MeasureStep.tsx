/**
 * A measure step: one entry pad per reading slot, the unit, and the live verdict and derived value
 * (diametral clearance, taper, shim) from evaluateMeasure — the same function that decides on the server.
 */
import { useState } from 'react';
import type { StepOf } from '../../domain/procedure/schema';
import { evaluateMeasure, type MeasureResult } from '../../domain/measure-plan';
import { measureDetail, type RunSnapshot } from '../../domain/run';
import { isDomainError } from '../../domain/errors';
import { formatQuantity, formatQuantityExact } from '../../domain/units';
import { EntryPad } from './EntryPad';
import { ReadingMark } from './ReadingMark';
import type { StepPanelProps } from './step-panel';

const DERIVED: Record<StepOf<'measure'>['method']['kind'], string> = {
  direct: 'Reading',
  clearance: 'Diametral clearance',
  journal: 'Worst diameter',
  'valve-shim': 'Valve clearance',
};

/** The evaluation with the draft included, or the reason the draft cannot be a reading. */
function preview(step: StepOf<'measure'>, readings: Record<string, number>, key: string | null, draft: string): { result: MeasureResult | null; problem: string | null } {
  const value = draft.trim() === '' || draft === '-' ? null : Number(draft);
  if (value !== null && !Number.isFinite(value)) return { result: null, problem: 'Type a number' };
  const all = key && value !== null ? { ...readings, [key]: value } : readings;
  if (Object.keys(all).length === 0) return { result: null, problem: null };
  try {
    return { result: evaluateMeasure(step, all), problem: null };
  } catch (e) {
    if (isDomainError(e)) return { result: null, problem: e.message };
    throw e;
  }
}

export function MeasureStep({ step, snapshot, sync, editable }: StepPanelProps & { step: StepOf<'measure'>; snapshot: RunSnapshot; editable: boolean }) {
  const detail = measureDetail(snapshot, step.id);
  const [chosen, setChosen] = useState<string | null>(null);
  const [draft, setDraft] = useState('');
  if (!detail) return null;
  const { slots, readings } = detail;
  const firstOpen = slots.find((s) => readings[s.key] === undefined)?.key ?? null;
  const selectedKey = chosen ?? firstOpen;
  const selected = slots.find((s) => s.key === selectedKey) ?? null;
  const { result, problem } = preview(step, readings, selected?.key ?? null, editable ? draft : '');
  const fmt = (v: number) => formatQuantity({ value: v, unit: step.unit }, { resolution: step.instrument.resolution });
  const draftValue = draft.trim() === '' ? null : Number(draft);
  const canSave = editable && selected !== null && draftValue !== null && !problem && sync.can({ type: 'reading.enter', stepId: step.id, key: selected.key, value: draftValue });
  const canSubmit = editable && sync.can({ type: 'measure.submit', stepId: step.id });
  const saveIsPrimary = editable && (draft !== '' || !canSubmit);

  const save = () => {
    if (!selected || draftValue === null) return;
    if (sync.record({ type: 'reading.enter', stepId: step.id, key: selected.key, value: draftValue })) {
      setDraft('');
      setChosen(null);
    }
  };
  const spec = step.spec;
  return (
    <div className="space-y-4">
      <p className="text-lg">
        Spec: <strong>{formatQuantityExact({ value: spec.nominal, unit: spec.unit })}</strong> (min {formatQuantityExact({ value: spec.min, unit: spec.unit })}, max{' '}
        {formatQuantityExact({ value: spec.max, unit: spec.unit })}){step.method.kind === 'clearance' ? ' — diametral clearance = bore − journal' : ''}
        {step.method.kind === 'journal' ? ` — taper max ${formatQuantityExact({ value: step.method.maxTaper, unit: step.unit })}, out-of-round max ${formatQuantityExact({ value: step.method.maxOutOfRound, unit: step.unit })}` : ''}
        <br />
        <span className="text-muted">
          Instrument: {step.instrument.name}, reads to {formatQuantityExact({ value: step.instrument.resolution, unit: step.unit })}. Unit: {step.unit}.
        </span>
      </p>
      <div className="grid gap-4 md:grid-cols-2">
        <div>
          <h3 className="font-semibold mb-2">Readings</h3>
          <ul className="space-y-1" data-testid="reading-slots">
            {slots.map((s) => {
              const v = readings[s.key];
              const here = s.key === selected?.key;
              return (
                <li key={s.key}>
                  <button
                    type="button"
                    disabled={!editable}
                    onClick={() => {
                      setChosen(s.key);
                      setDraft('');
                    }}
                    aria-pressed={here}
                    className={`w-full flex items-center justify-between gap-3 rounded-md border-2 px-3 min-h-12 text-left ${here ? 'border-accent bg-accent-soft' : 'border-line'}`}
                    data-slot={s.key}
                  >
                    <span className="font-semibold">{s.label}</span>
                    <span className="tabular-nums">{v !== undefined ? fmt(v) : here && draft ? `${draft} ${step.unit} (not saved)` : '— not read'}</span>
                  </button>
                </li>
              );
            })}
          </ul>
        </div>
        {editable && selected && (
          <div>
            <EntryPad draft={draft} onChange={setDraft} label={selected.label} unit={step.unit} />
            {problem && <p className="tt-field-error text-lg" role="alert">{problem}</p>}
            <button type="button" className={`tt-btn ${saveIsPrimary ? 'tt-btn-primary' : 'tt-btn-quiet'} w-full text-2xl min-h-16 mt-3`} data-primary={saveIsPrimary ? 'true' : undefined} disabled={!canSave} onClick={save} data-testid="save-reading">
              Save reading for {selected.label}
            </button>
          </div>
        )}
      </div>
      {result && (
        <div className="overflow-x-auto relative"><table className="w-full text-left" data-testid="measure-results">
          <caption className="text-left font-semibold mb-1">Live check ({result.summary})</caption>
          <thead>
            <tr className="border-b border-line">
              <th className="py-1 pr-3">Position</th>
              <th className="py-1 pr-3">{DERIVED[step.method.kind]}</th>
              <th className="py-1 pr-3">Verdict</th>
              <th className="py-1">Detail</th>
            </tr>
          </thead>
          <tbody>
            {result.positions.map((p) => (
              <tr key={p.position} className="border-b border-line align-top" data-position={p.position}>
                <td className="py-1 pr-3 font-semibold">{p.position}</td>
                <td className="py-1 pr-3 tabular-nums">{p.value !== null ? fmt(p.value) : '—'}</td>
                <td className="py-1 pr-3"><ReadingMark inSpec={p.inSpec} side={p.side} /></td>
                <td className="py-1 text-muted">{p.detail}</td>
              </tr>
            ))}
          </tbody>
        </table></div>
      )}
      {editable && (
        <button type="button" className={`tt-btn ${!saveIsPrimary ? 'tt-btn-primary' : 'tt-btn-quiet'} w-full text-2xl min-h-16`} data-primary={!saveIsPrimary ? 'true' : undefined} disabled={!canSubmit} onClick={() => sync.record({ type: 'measure.submit', stepId: step.id })} data-testid="submit-readings">
          Submit readings
        </button>
      )}
    </div>
  );
}
