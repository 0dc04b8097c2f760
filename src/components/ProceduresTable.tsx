/**
 * /procedures: search, status and engine-family filters over a sortable, paged table of the
 * shop's procedures; leads and owners also get "New procedure" and "Import a file".
 */
import { useEffect, useMemo, useState } from 'react';
import { getCoreRowModel, getPaginationRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { matchesState, PROCEDURE_STATES, type ProcedureState } from '../domain/procedure/availability';
import type { ProcedureSummaryDto } from '../server/services/procedure-dto';
import { ImportProcedureForm } from './procedures/ImportProcedureForm';
import { NewProcedureForm } from './procedures/NewProcedureForm';
import { RevisionStatusMark, when } from './procedures/RevisionStatusMark';
import { SortableTable } from './ui/SortableTable';

export type ProcedureFilters = { search: string; status: '' | ProcedureState; engineFamily: string };
type Props = { procedures: ProcedureSummaryDto[]; filters: ProcedureFilters; canAuthor: boolean };

const STATE_LABELS: Record<ProcedureState, string> = { released: 'Has a released revision', draft: 'Has an open draft', retired: 'Every revision retired' };
const KIND_LABELS: Record<string, string> = { teardown: 'Teardown', assembly: 'Assembly', inspection: 'Inspection' };

const columns: ColumnDef<ProcedureSummaryDto>[] = [
  { accessorKey: 'name', header: 'Procedure', cell: (c) => <span><a className="underline font-semibold text-accent" href={`/procedures/${c.row.original.id}`}>{c.row.original.name}</a><span className="block text-muted text-sm">{c.row.original.key}</span></span> },
  { accessorKey: 'kind', header: 'Kind', cell: (c) => KIND_LABELS[c.row.original.kind] ?? c.row.original.kind },
  { accessorKey: 'engineFamily', header: 'Engine family', cell: (c) => c.row.original.engineFamily || <span className="text-muted">—</span> },
  {
    id: 'released',
    accessorFn: (p) => p.latestReleased?.number ?? -1,
    header: 'Released',
    cell: (c) => (c.row.original.latestReleased ? <RevisionStatusMark status="released" number={c.row.original.latestReleased.number} /> : c.row.original.revisionCount > 0 && !c.row.original.draft ? <RevisionStatusMark status="retired" /> : <span className="text-muted">not yet</span>),
  },
  { id: 'draft', accessorFn: (p) => (p.draft ? 1 : 0), header: 'Draft', cell: (c) => (c.row.original.draft ? <RevisionStatusMark status="draft" /> : <span className="text-muted">none</span>) },
  { accessorKey: 'revisionCount', header: 'Revisions' },
  { accessorKey: 'updatedAt', header: 'Changed', cell: (c) => when(c.row.original.updatedAt) },
];

export default function ProceduresTable({ procedures, filters: start, canAuthor }: Props) {
  const [filters, setFilters] = useState<ProcedureFilters>(start);
  const [panel, setPanel] = useState<'none' | 'new' | 'import'>('none');
  const [sorting, setSorting] = useState<SortingState>([]);
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  useEffect(() => {
    if (!hydrated) return;
    const url = new URL(window.location.href);
    url.search = new URLSearchParams(Object.entries(filters).filter(([, v]) => v !== '')).toString();
    window.history.replaceState(null, '', url);
  }, [filters, hydrated]);
  const families = useMemo(() => [...new Set(procedures.map((p) => p.engineFamily).filter(Boolean))].sort(), [procedures]);
  const rows = useMemo(() => {
    const needle = filters.search.trim().toLowerCase();
    return procedures.filter((p) =>
      (!needle || [p.name, p.key, p.engineFamily].some((t) => t.toLowerCase().includes(needle))) &&
      (!filters.engineFamily || p.engineFamily === filters.engineFamily) &&
      matchesState(p, filters.status || null));
  }, [procedures, filters]);
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    autoResetPageIndex: true,
    initialState: { pagination: { pageSize: 25 } },
  });
  const set = (k: keyof ProcedureFilters) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => setFilters({ ...filters, [k]: e.target.value });
  return (
    <div data-hydrated={hydrated ? 'true' : undefined}>
      <div className="flex flex-wrap items-end gap-3 mb-4">
        <h1 className="text-3xl font-bold mr-auto">Procedures</h1>
        {canAuthor && panel === 'none' && (
          <>
            <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setPanel('import')} data-testid="import-procedure">Import a file</button>
            <button type="button" className="tt-btn tt-btn-primary" onClick={() => setPanel('new')} data-testid="new-procedure">+ New procedure</button>
          </>
        )}
      </div>
      {canAuthor && panel === 'new' && <NewProcedureForm engineFamilies={families} onCancel={() => setPanel('none')} />}
      {canAuthor && panel === 'import' && <ImportProcedureForm onCancel={() => setPanel('none')} />}
      <form className="flex flex-wrap gap-4 mb-4 tt-no-print" role="search" aria-label="Filter procedures" onSubmit={(e) => e.preventDefault()}>
        <div className="grow min-w-56">
          <label className="tt-label" htmlFor="pf-search">Search</label>
          <input id="pf-search" type="search" className="tt-input" value={filters.search} onChange={set('search')} placeholder="Name, key or engine family" />
        </div>
        <div>
          <label className="tt-label" htmlFor="pf-status">Status</label>
          <select id="pf-status" className="tt-input" value={filters.status} onChange={set('status')}>
            <option value="">Any status</option>
            {PROCEDURE_STATES.filter((s) => canAuthor || s !== 'draft').map((s) => <option key={s} value={s}>{STATE_LABELS[s]}</option>)}
          </select>
        </div>
        <div>
          <label className="tt-label" htmlFor="pf-family">Engine family</label>
          <select id="pf-family" className="tt-input" value={filters.engineFamily} onChange={set('engineFamily')}>
            <option value="">Every engine family</option>
            {families.map((f) => <option key={f} value={f}>{f}</option>)}
          </select>
        </div>
      </form>
      <p className="sr-only" role="status" aria-live="polite">{rows.length} procedures shown</p>
      {rows.length === 0 ? (
        <p className="tt-card p-5" data-testid="procedures-empty">{procedures.length === 0 ? (canAuthor ? 'No procedures yet. Create one or import a procedure file.' : 'No released procedures yet.') : 'No procedures match these filters.'}</p>
      ) : (
        <SortableTable table={table} testId="procedures-table" rowAttrs={(r) => ({ 'data-procedure-key': r.original.key })} noun="procedures" total={rows.length} />
      )}
    </div>
  );
}
