/** Thumbnails of photos, each opening the original; HEIC photos without preview say so. */
import type { AttachmentDto } from './types';

export function PhotoStrip({ photos, label = 'Photos' }: { photos: readonly AttachmentDto[]; label?: string }) {
  if (photos.length === 0) return <p className="text-muted" data-testid="no-photos">No photos yet.</p>;
  return (
    <ul className="flex flex-wrap gap-2" aria-label={label} data-testid="photo-strip">
      {photos.map((p) => (
        <li key={p.id}>
          <a href={p.originalUrl} target="_blank" rel="noopener" className="block rounded-md border border-line overflow-hidden bg-sunken" title={p.filename}>
            {p.thumbUrl ? (
              <img src={p.thumbUrl} alt={`Photo ${p.filename}`} loading="lazy" className="h-24 w-24 object-cover" data-testid="photo-thumb" />
            ) : (
              <span className="flex h-24 w-24 items-center justify-center p-1 text-center text-sm" data-testid="photo-thumb">No preview (HEIC) — open</span>
            )}
          </a>
        </li>
      ))}
    </ul>
  );
}
