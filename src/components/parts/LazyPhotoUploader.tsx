/**
 * The photo uploader, fetched only when it is first shown: Uppy is the heaviest part of the
 * runner and most steps never open "Add photos", so it stays out of the runner's own chunk.
 */
import { lazy, Suspense, type ComponentProps } from 'react';

const PhotoUploader = lazy(() => import('./PhotoUploader'));

export function LazyPhotoUploader(props: ComponentProps<typeof PhotoUploader>) {
  return (
    <Suspense fallback={<p className="text-muted min-h-12 flex items-center gap-2" role="status" data-testid="photo-tool-loading"><span aria-hidden="true">◌</span> Loading the photo tool…</p>}>
      <PhotoUploader {...props} />
    </Suspense>
  );
}
