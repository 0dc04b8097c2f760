/**
 * The desk table every list uses (procedures, jobs): sortable column headers that say their
 * order to screen readers, rows with their own data attributes, and paging below.
 */
import { flexRender, type Row, type Table } from '@tanstack/react-table';

type Props<T> = {
  table: Table<T>;
  testId: string;
  /** Data attributes per row (e.g. `{ 'data-job-code': 'J-0007' }`), for tests and styling. */
  rowAttrs: (row: Row<T>) => Record<string, string>;
  /** What a row is, plural, for the paging line ("12 jobs"). */
  noun: string;
  total: number;
};

export function SortableTable<T>({ table, testId, rowAttrs, noun, total }: Props<T>) {
  const { pageIndex } = table.getState().pagination;
  return (
    <div className="tt-card overflow-x-auto relative">
      <table className="w-full text-left" data-testid={testId}>
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
            <tr key={r.id} className="border-t border-line align-top" {...rowAttrs(r)}>
              {r.getVisibleCells().map((c) => <td key={c.id} className="px-3 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      {table.getPageCount() > 1 && (
        <div className="flex items-center justify-between gap-3 p-3 border-t border-line">
          <button type="button" className="tt-btn tt-btn-quiet" disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>← Previous</button>
          <span>Page {pageIndex + 1} of {table.getPageCount()} · {total} {noun}</span>
          <button type="button" className="tt-btn tt-btn-quiet" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>Next →</button>
        </div>
      )}
    </div>
  );
}
