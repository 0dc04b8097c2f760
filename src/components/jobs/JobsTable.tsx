/** The jobs table: sort by any column, page through; filters live in the desk above it. */
import { useState } from 'react';
import { getCoreRowModel, getPaginationRowModel, getSortedRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { JOB_STATUSES } from '../../domain/job-status';
import { SortableTable } from '../ui/SortableTable';
import { JobStatusMark } from './JobStatusMark';
import type { JobSummaryDto } from './types';

const columns: ColumnDef<JobSummaryDto>[] = [
  { accessorKey: 'code', header: 'Job', cell: (c) => <a className="underline font-semibold text-accent whitespace-nowrap" href={`/jobs/${c.row.original.id}`}>{c.row.original.code}</a> },
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
  return <SortableTable table={table} testId="jobs-table" rowAttrs={(r) => ({ 'data-job-code': r.original.code })} noun="jobs" total={jobs.length} />;
}
