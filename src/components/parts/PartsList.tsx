/** The job's parts to replace: quantities editable by the lead, reasons per part, CSV and print. */
import { useState } from 'react';
import { api } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import type { PartsListDto, PartsRow } from './types';

type Props = { initial: PartsListDto; canEdit: boolean };

const SOURCE_WORDS = { 'replace-step': 'Replace step', 'torque-to-yield': 'Torque-to-yield', finding: 'Finding', tag: 'Tag' } as const;

export default function PartsList({ initial, canEdit }: Props) {
  const [list, setList] = useState(initial);
  const [status, setStatus] = useState<Status>(null);
  const save = async (row: PartsRow, quantity: number | null) => {
    try {
      setList(await api<PartsListDto>(`/api/jobs/${list.job.id}/parts`, { method: 'PUT', body: { part: row.part, quantity } }));
      setStatus({ kind: 'ok', message: quantity === null ? `${row.part}: back to the computed quantity.` : `${row.part}: quantity set to ${quantity}.` });
    } catch (e) {
      setStatus({ kind: 'error', message: `${row.part} was not changed: ${(e as Error).message}` });
    }
  };
  return (
    <div data-hydrated="true" data-testid="parts-list" className="space-y-4">
      <div className="flex flex-wrap gap-2 tt-no-print">
        <a className="tt-btn tt-btn-primary" href={`/api/jobs/${list.job.id}/parts.csv`} download data-testid="parts-csv">Download CSV</a>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => window.print()}>Print order sheet</button>
      </div>
      <StatusRegion status={status} />
      {list.rows.length === 0 ? (
        <p className="text-lg">Nothing to replace yet. Parts come from replace steps, torque-to-yield fasteners, findings and tags set to “Replace”.</p>
      ) : (
        <div className="overflow-x-auto relative"><table className="w-full border-collapse text-left">
          <thead><tr className="border-b-2 border-line"><th className="py-2 pr-3">Part</th><th className="py-2 pr-3 w-56">Quantity</th><th className="py-2">Why</th></tr></thead>
          <tbody>{list.rows.map((r) => <Row key={r.key} row={r} canEdit={canEdit} onSave={(q) => save(r, q)} />)}</tbody>
        </table></div>
      )}
    </div>
  );
}

function Row({ row, canEdit, onSave }: { row: PartsRow; canEdit: boolean; onSave: (q: number | null) => void }) {
  const [value, setValue] = useState(String(row.quantity));
  const n = Number(value);
  const valid = /^\d{1,4}$/.test(value.trim());
  return (
    <tr className="border-b border-line align-top" data-testid="parts-row" data-part={row.part}>
      <td className="py-2 pr-3 text-lg font-semibold">{row.part}</td>
      <td className="py-2 pr-3">
        {canEdit ? (
          <form className="flex gap-2 tt-no-print" onSubmit={(e) => { e.preventDefault(); if (valid) onSave(n); }}>
            <input className="tt-input w-24 text-xl tabular-nums" inputMode="numeric" aria-label={`Quantity of ${row.part}`} value={value} onChange={(e) => setValue(e.target.value)} aria-invalid={!valid} />
            <button type="submit" className="tt-btn tt-btn-quiet" disabled={!valid || n === row.quantity}>Set</button>
          </form>
        ) : null}
        <span className={canEdit ? 'hidden print:inline text-xl' : 'text-xl tabular-nums'} data-testid="parts-quantity">{row.quantity}</span>
        {!valid && <p className="tt-field-error">A whole number, 0 to 9999</p>}
        {row.overridden && (
          <p className="text-muted">✎ Set by hand (computed {row.computed}){canEdit && <> · <button type="button" className="underline min-h-12" onClick={() => { setValue(String(row.computed)); onSave(null); }}>use computed</button></>}</p>
        )}
      </td>
      <td className="py-2">
        <ul>{row.sources.map((s, i) => <li key={i}><strong>{SOURCE_WORDS[s.kind]}</strong> ({s.quantity}): {s.reason}{s.stepTitle ? ` — ${s.stepTitle}` : ''}</li>)}</ul>
      </td>
    </tr>
  );
}
