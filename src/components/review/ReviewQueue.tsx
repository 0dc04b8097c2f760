/** The reviewer's desk: what waits for a signature or a decision, as a table that sorts and filters, with shortcuts. */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { ReviewItem } from '../../server/services/review.service';

type Props = { items: ReviewItem[] };
type SortKey = 'since' | 'jobCode' | 'kind' | 'procedureName';

const KIND: Record<ReviewItem['kind'], { word: string; icon: string; cls: string }> = {
  'hold-point': { word: 'Hold point', icon: '⏸', cls: 'bg-hold-soft text-ink border-hold' },
  run: { word: 'Run to sign off', icon: '✎', cls: 'bg-accent-soft text-ink border-accent' },
  deviation: { word: 'Deviation', icon: '⚠', cls: 'bg-warn-soft text-ink border-warn' },
};

export function KindMark({ kind }: { kind: ReviewItem['kind'] }) {
  const k = KIND[kind];
  return <span className={`inline-flex items-center gap-1 rounded border-l-4 px-2 py-0.5 font-semibold ${k.cls}`}><span aria-hidden="true">{k.icon}</span>{k.word}</span>;
}

export default function ReviewQueue({ items }: Props) {
  const [hydrated, setHydrated] = useState(false);
  const [filter, setFilter] = useState('');
  const [kind, setKind] = useState<'all' | ReviewItem['kind']>('all');
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'since', dir: 1 });
  const [active, setActive] = useState(0);
  const filterRef = useRef<HTMLInputElement>(null);
  useEffect(() => setHydrated(true), []);

  const rows = useMemo(() => {
    const q = filter.trim().toLowerCase();
    return items
      .filter((i) => kind === 'all' || i.kind === kind)
      .filter((i) => !q || [i.jobCode, i.unitDescription, i.procedureName, i.stepTitle, i.detail].some((t) => t.toLowerCase().includes(q)))
      .sort((x, y) => (x[sort.key] < y[sort.key] ? -1 : x[sort.key] > y[sort.key] ? 1 : 0) * sort.dir);
  }, [items, filter, kind, sort]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const typing = e.target instanceof HTMLInputElement || e.target instanceof HTMLSelectElement || e.target instanceof HTMLTextAreaElement;
      if (e.key === '/' && !typing) {
        e.preventDefault();
        filterRef.current?.focus();
      } else if (!typing && (e.key === 'j' || e.key === 'ArrowDown')) {
        e.preventDefault();
        setActive((a) => Math.min(a + 1, rows.length - 1));
      } else if (!typing && (e.key === 'k' || e.key === 'ArrowUp')) {
        e.preventDefault();
        setActive((a) => Math.max(a - 1, 0));
      } else if (!typing && e.key === 'Enter' && rows[active]) {
        window.location.assign(rows[active]!.href);
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [rows, active]);

  const header = (key: SortKey, label: string) => (
    <th scope="col" aria-sort={sort.key === key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'} className="text-left p-2">
      <button type="button" className="font-semibold underline-offset-2 hover:underline min-h-12" onClick={() => setSort((s) => ({ key, dir: s.key === key ? (s.dir === 1 ? -1 : 1) : 1 }))}>
        {label} {sort.key === key ? (sort.dir === 1 ? '▲' : '▼') : ''}
      </button>
    </th>
  );

  return (
    <div className="space-y-4" data-hydrated={hydrated ? 'true' : undefined}>
      <div className="flex flex-wrap items-end gap-3 tt-no-print">
        <div className="grow max-w-md">
          <label className="tt-label" htmlFor="review-filter">Filter</label>
          <input id="review-filter" ref={filterRef} className="tt-input" placeholder="Job, unit, procedure, step" value={filter} onChange={(e) => { setFilter(e.target.value); setActive(0); }} />
        </div>
        <div>
          <label className="tt-label" htmlFor="review-kind">Show</label>
          <select id="review-kind" className="tt-input" value={kind} onChange={(e) => { setKind(e.target.value as typeof kind); setActive(0); }}>
            <option value="all">Everything</option>
            <option value="hold-point">Hold points</option>
            <option value="run">Runs to sign off</option>
            <option value="deviation">Deviations</option>
          </select>
        </div>
        <p className="text-muted text-sm">Keys: <kbd>/</kbd> filter · <kbd>j</kbd>/<kbd>k</kbd> move · <kbd>Enter</kbd> open</p>
      </div>
      {rows.length === 0 ? (
        <p className="tt-card p-5 text-muted" data-testid="review-empty">✓ Nothing waits for you{items.length ? ' with this filter' : ''}.</p>
      ) : (
        // A narrow screen scrolls the table, not the page (relative: keeps the hidden header label inside).
        <div className="tt-card overflow-x-auto relative">
        <table className="w-full text-base" data-testid="review-table">
          <thead className="bg-sunken">
            <tr>{header('kind', 'Waiting')}{header('jobCode', 'Job')}{header('procedureName', 'Procedure')}<th scope="col" className="text-left p-2">Step</th>{header('since', 'Since')}<th scope="col" className="p-2"><span className="sr-only">Open</span></th></tr>
          </thead>
          <tbody>
            {rows.map((i, n) => (
              <tr key={`${i.kind}-${i.runId}-${i.stepId}`} className={`border-t border-line ${n === active ? 'outline outline-2 outline-accent' : ''}`} data-testid="review-row" data-kind={i.kind}>
                <td className="p-2"><KindMark kind={i.kind} /></td>
                <td className="p-2"><a className="underline" href={`/jobs/${i.jobId}`}>{i.jobCode}</a><div className="text-muted text-sm">{i.unitDescription} · {i.jobStatus}</div></td>
                <td className="p-2">{i.procedureName} <span className="text-muted">rev {i.revisionNumber}</span></td>
                <td className="p-2">{i.stepNumber ? `${i.stepNumber}. ` : ''}{i.stepTitle}<div className="text-muted text-sm">{i.detail}</div></td>
                <td className="p-2 whitespace-nowrap">{i.since.slice(0, 16).replace('T', ' ')}</td>
                <td className="p-2"><a className="tt-btn tt-btn-primary" href={i.href}>{i.kind === 'deviation' ? 'Decide' : 'Review and sign'}</a></td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
      )}
    </div>
  );
}
