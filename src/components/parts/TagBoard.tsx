/**
 * The job's tag board: every tag by part and position, filtered by bin and disposition, with
 * photos; bins and dispositions change right on the card. Prints as a plain list.
 */
import { useMemo, useState } from 'react';
import type { Disposition } from '../../domain/procedure/schema';
import { api } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { DISPOSITIONS, DispositionMark } from './DispositionMark';
import type { TagDto } from './types';

type Props = { job: { id: string; code: string; unitDescription: string }; initial: TagDto[]; canEdit: boolean };

export default function TagBoard({ job, initial, canEdit }: Props) {
  const [tags, setTags] = useState(initial);
  const [bin, setBin] = useState('');
  const [disposition, setDisposition] = useState<Disposition | ''>('');
  const [status, setStatus] = useState<Status>(null);
  const bins = useMemo(() => [...new Set(tags.map((t) => t.bin))].sort(), [tags]);
  const shown = tags.filter((t) => (bin === '' || t.bin === (bin === '\u0000' ? '' : bin)) && (disposition === '' || t.disposition === disposition));
  const groups = useMemo(() => {
    const m = new Map<string, TagDto[]>();
    for (const t of shown) m.set(`${t.partName} · ${t.stepTitle}`, [...(m.get(`${t.partName} · ${t.stepTitle}`) ?? []), t]);
    return [...m.entries()];
  }, [shown]);

  const save = async (t: TagDto, change: { bin?: string; disposition?: Disposition }) => {
    try {
      const r = await api<{ tag: TagDto }>(`/api/tags/${t.id}`, { method: 'PATCH', body: change });
      setTags((ts) => ts.map((x) => (x.id === t.id ? r.tag : x)));
      setStatus({ kind: 'ok', message: `Saved ${r.tag.code}.` });
    } catch (e) {
      setStatus({ kind: 'error', message: `${t.code} was not changed: ${(e as Error).message}` });
    }
  };

  return (
    <div data-hydrated="true" data-testid="tag-board" className="space-y-4">
      <div className="flex flex-wrap items-end gap-3 tt-no-print">
        <label className="min-w-48">
          <span className="tt-label">Bin</span>
          <select className="tt-input" value={bin} onChange={(e) => setBin(e.target.value)} aria-label="Show bin">
            <option value="">Every bin</option>
            {bins.map((b) => <option key={b || 'none'} value={b || '\u0000'}>{b || 'No bin'}</option>)}
          </select>
        </label>
        <label className="min-w-48">
          <span className="tt-label">Disposition</span>
          <select className="tt-input" value={disposition} onChange={(e) => setDisposition(e.target.value as Disposition | '')} aria-label="Show disposition">
            <option value="">Every disposition</option>
            {DISPOSITIONS.map((d) => <option key={d.value} value={d.value}>{d.label}</option>)}
          </select>
        </label>
        <a className="tt-btn tt-btn-primary" href={`/api/jobs/${job.id}/labels.pdf`} data-testid="labels-link">Print QR labels (A4, 3 × 8)</a>
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => window.print()}>Print board</button>
      </div>
      <StatusRegion status={status} />
      <p className="text-muted" aria-live="polite">{shown.length} of {tags.length} tags shown</p>
      {tags.length === 0 && <p className="text-lg">No parts are tagged on this job yet. Tags appear when a tag-part step is marked done.</p>}
      {groups.map(([name, list]) => (
        <section key={name} className="space-y-2 tt-print-avoid-break">
          <h2 className="text-2xl font-bold">{name}</h2>
          <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            {list.map((t) => <TagCard key={t.id} tag={t} canEdit={canEdit} onSave={(c) => save(t, c)} />)}
          </ul>
        </section>
      ))}
    </div>
  );
}

function TagCard({ tag, canEdit, onSave }: { tag: TagDto; canEdit: boolean; onSave: (c: { bin?: string; disposition?: Disposition }) => void }) {
  const [bin, setBin] = useState(tag.bin);
  return (
    <li className="tt-card p-3 space-y-2" data-testid="tag-card" data-tag-code={tag.code} data-position={tag.position}>
      <div className="flex items-start justify-between gap-2">
        <p className="text-2xl font-bold">{tag.position}</p>
        <DispositionMark value={tag.disposition} />
      </div>
      <p className="font-mono text-sm break-all"><a className="underline" href={`/tags/${tag.id}`}>{tag.code}</a></p>
      <p>Bin: <strong data-testid="tag-bin">{tag.bin || '—'}</strong></p>
      {tag.photos.length > 0 && (
        <div className="flex gap-1">
          {tag.photos.slice(0, 3).map((p) => (p.thumbUrl ? <img key={p.id} src={p.thumbUrl} alt={`Photo ${p.filename}`} className="h-14 w-14 rounded object-cover" data-testid="board-thumb" /> : null))}
          {tag.photos.length > 3 && <span className="self-center text-muted">+{tag.photos.length - 3}</span>}
        </div>
      )}
      {canEdit && (
        <div className="space-y-2 tt-no-print">
          <select className="tt-input" aria-label={`Disposition of ${tag.code}`} value={tag.disposition} onChange={(e) => onSave({ disposition: e.target.value as Disposition })}>
            {DISPOSITIONS.map((d) => <option key={d.value} value={d.value}>{d.label}</option>)}
          </select>
          <form className="flex gap-2" onSubmit={(e) => { e.preventDefault(); onSave({ bin: bin.trim() }); }}>
            <input className="tt-input" aria-label={`Bin of ${tag.code}`} value={bin} maxLength={60} onChange={(e) => setBin(e.target.value)} />
            <button type="submit" className="tt-btn tt-btn-quiet" disabled={bin.trim() === tag.bin}>Set bin</button>
          </form>
        </div>
      )}
    </li>
  );
}
