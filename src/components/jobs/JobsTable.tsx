/** The jobs table: sort by any column, page through; filters live in the desk above it. */
import { useState } from 'react';
import { flexRender, getCoreRowModel, getPaginationRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { JOB_STATUSES } from '../../domain/job-status';
import { JobStatusMark } from './JobStatusMark';
import type { JobSummaryDto } from './types';

const columns: ColumnDef<JobSummaryDto>[] = [
  { accessorKey: 'code', header: 'Job', cell: (c) => <a className="underline font-semibold text-accent" href={`/jobs/${c.row.original.id}`}>{c.row.original.code}</a> },
  { accessorKey: 'unitDescription', header: 'Unit', cell: (c) => <span>{c.row.original.unitDescription}{c.row.original.serial && <span className="block text-muted text-sm">S/N {c.row.original.serial}</span>}</span> },
  { accessorKey: 'customer', header: 'Customer' },
  { accessorKey: 'status', header: 'Status', sortingFn: (a, b) => JOB_STATUSES.indexOf(a.original.status) - JOB_STATUSES.indexOf(b.original.status), cell: (c) => <JobStatusMark status={c.row.original.status} /> },
  { id: 'technicians', accessorFn: (j) => j.technicians.map((t) => t.name).join(', '), header: 'Technicians', cell: (c) => c.getValue<string>() || <span className="text-muted">none yet</span> },
  { accessorKey: 'runs', header: 'Runs' },
  { accessorKey: 'ageDays', header: 'Age', cell: (c) => `${c.row.original.ageDays} d` },
  { accessorKey: 'updatedAt', header: 'Changed', cell: (c) => new Date(c.row.original.updatedAt).toISOString().slice(0, 10) },
];

export function JobsTable({ jobs }: { jobs: JobSummaryDto[] }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const table = useReactTable({
    data: jobs,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 20 } },
  });
  if (jobs.length === 0) return <p className="tt-card p-5" data-testid="jobs-empty">No jobs match these filters.</p>;
  const { pageIndex } = table.getState().pagination;
  return (
    <div className="tt-card overflow-x-auto">
      <table className="w-full text-left" data-testid="jobs-table">
        <thead className="bg-sunken">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} className="px-2 py-1" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}>
                    <button type="button" className="min-h-12 font-semibold inline-flex items-center gap-1" onClick={h.column.getToggleSortingHandler()}>
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className="border-t border-line align-top" data-job-code={r.original.code}>
              {r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      {table.getPageCount() > 1 && (
        <div className="flex items-center justify-between gap-3 p-3 border-t border-line">
          <button type="button" className="tt-btn tt-btn-quiet" disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>← Previous</button>
          <span>Page {pageIndex + 1} of {table.getPageCount()} · {jobs.length} jobs</span>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>Next →</button>
        </div>
      )}
    </div>
  );
}
