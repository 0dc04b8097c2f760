/** One tag: position, bin, disposition and condition with their history; photos of the part. */
import { useState } from 'react';
import type { Disposition } from '../../domain/procedure/schema';
import { api } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { DISPOSITIONS, DispositionMark, dispositionLabel } from './DispositionMark';
import PhotoUploader from './PhotoUploader';
import type { TagDto, TagHistoryDto } from './types';

type Props = { initial: { tag: TagDto; history: TagHistoryDto[] }; canEdit: boolean };
const FIELD_WORDS = { bin: 'Bin', disposition: 'Disposition', conditionNote: 'Condition' } as const;
const SOURCE_WORDS = { created: 'Tagged at the bench', edit: 'Changed', run: 'Retagged on a re-run of the step' } as const;
const show = (field: keyof typeof FIELD_WORDS, v: string) => (v === '' ? '—' : field === 'disposition' ? dispositionLabel(v as Disposition) : v);

export default function TagDetail({ initial, canEdit }: Props) {
  const [data, setData] = useState(initial);
  const [bin, setBin] = useState(initial.tag.bin);
  const [disposition, setDisposition] = useState<Disposition>(initial.tag.disposition);
  const [note, setNote] = useState(initial.tag.conditionNote);
  const [status, setStatus] = useState<Status>(null);
  const { tag, history } = data;
  const dirty = bin.trim() !== tag.bin || disposition !== tag.disposition || note.trim() !== tag.conditionNote;

  const save = async () => {
    try {
      const r = await api<typeof initial>(`/api/tags/${tag.id}`, { method: 'PATCH', body: { bin: bin.trim(), disposition, conditionNote: note.trim() } });
      setData(r);
      setStatus({ kind: 'ok', message: 'Saved.' });
    } catch (e) {
      setStatus({ kind: 'error', message: `Not saved: ${(e as Error).message}` });
    }
  };

  return (
    <div data-hydrated="true" data-testid="tag-detail" className="space-y-6">
      <header>
        <p className="text-muted font-semibold"><a className="underline" href={`/jobs/${tag.jobId}/tags`}>Job {tag.jobCode} · tag board</a></p>
        <h1 className="text-3xl font-bold">{tag.partName} — {tag.position}</h1>
        <p className="font-mono text-lg" data-testid="tag-code">{tag.code}</p>
      </header>
      <dl className="grid grid-cols-[10rem_1fr] gap-2 text-lg">
        <dt className="font-semibold">Disposition</dt><dd><DispositionMark value={tag.disposition} /></dd>
        <dt className="font-semibold">Bin</dt><dd>{tag.bin || '—'}</dd>
        <dt className="font-semibold">Condition</dt><dd>{tag.conditionNote || '—'}</dd>
        <dt className="font-semibold">Removed on</dt><dd><a className="underline" href={`/runs/${tag.runId}`}>{tag.procedureName}</a>, step “{tag.stepTitle}”</dd>
      </dl>
      <StatusRegion status={status} />
      {canEdit && (
        <form className="tt-card p-4 space-y-3 tt-no-print" onSubmit={(e) => { e.preventDefault(); void save(); }}>
          <h2 className="text-xl font-semibold">Change</h2>
          <label className="block"><span className="tt-label">Bin</span><input className="tt-input" value={bin} maxLength={60} onChange={(e) => setBin(e.target.value)} /></label>
          <label className="block"><span className="tt-label">Disposition</span>
            <select className="tt-input" value={disposition} onChange={(e) => setDisposition(e.target.value as Disposition)}>
              {DISPOSITIONS.map((d) => <option key={d.value} value={d.value}>{d.label}</option>)}
            </select>
          </label>
          <label className="block"><span className="tt-label">Condition note</span><textarea className="tt-input min-h-20" value={note} maxLength={2000} onChange={(e) => setNote(e.target.value)} /></label>
          <button type="submit" className="tt-btn tt-btn-primary" disabled={!dirty}>Save changes</button>
        </form>
      )}
      {canEdit ? <PhotoUploader scope={{ kind: 'tag', tagId: tag.id }} initial={tag.photos.filter((p) => p.tagId === tag.id)} title="Photos of this part" /> : null}
      {tag.photos.some((p) => p.tagId !== tag.id) && (
        <section>
          <h2 className="text-xl font-semibold">Photos from the step</h2>
          <ul className="flex flex-wrap gap-2">{tag.photos.filter((p) => p.tagId !== tag.id).map((p) => <li key={p.id}><a href={p.originalUrl}>{p.thumbUrl ? <img src={p.thumbUrl} alt={`Photo ${p.filename}`} className="h-24 w-24 rounded object-cover" /> : 'No preview'}</a></li>)}</ul>
        </section>
      )}
      <section>
        <h2 className="text-xl font-semibold">History</h2>
        <ol className="space-y-2" data-testid="tag-history">
          {history.map((h) => (
            <li key={h.id} className="border-l-4 border-line pl-3">
              <p className="font-semibold">{SOURCE_WORDS[h.source]} by {h.by.name}, <time dateTime={h.at}>{new Date(h.at).toLocaleString()}</time></p>
              <ul>{h.changes.map((c) => <li key={c.field}>{FIELD_WORDS[c.field]}: {show(c.field, c.from)} → {show(c.field, c.to)}</li>)}</ul>
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}
