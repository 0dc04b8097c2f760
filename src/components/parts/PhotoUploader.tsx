/**
 * Photo upload for a run step, tag or finding: Uppy's dashboard with the limits shown before
 * anything is sent, straight to the object store through presigned PUTs (AwsS3 `signRequest`
 * asks our API, which checks type, size and count first), then our API checks what arrived and
 * makes the thumbnail. Refusals explain why; failed uploads can be retried from the dashboard.
 */
import { useEffect, useRef, useState } from 'react';
import Uppy, { type UppyFile } from '@uppy/core';
import AwsS3 from '@uppy/aws-s3';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { MAX_PHOTO_BYTES, MAX_PHOTOS_PER_SCOPE, PHOTO_TYPES, uploadLimitsText } from '../../domain/upload-rules';
import { api, isApiError } from '../../lib/api-client';
import { StatusRegion, type Status } from '../ui/StatusRegion';
import { PhotoStrip } from './PhotoStrip';
import type { AttachmentDto, UploadScope } from './types';

type Props = { scope: UploadScope; initial?: AttachmentDto[]; title?: string; onUploaded?: (a: AttachmentDto) => void };
type Presigned = { key: string; url: string; method: 'PUT'; headers: Record<string, string> };
type Meta = Record<string, never>;
type Body = Record<string, unknown>;

const messageOf = (e: unknown) => (isApiError(e) || e instanceof Error ? e.message : 'The upload failed.');

export default function PhotoUploader({ scope, initial = [], title = 'Photos', onUploaded }: Props) {
  const [photos, setPhotos] = useState<AttachmentDto[]>(initial);
  const [status, setStatus] = useState<Status>(null);
  const [hydrated, setHydrated] = useState(false);
  const photosRef = useRef(photos);
  photosRef.current = photos;
  const scopeRef = useRef(scope);
  scopeRef.current = scope;
  const onUploadedRef = useRef(onUploaded);
  onUploadedRef.current = onUploaded;

  const [uppy] = useState(() => {
    const u = new Uppy<Meta, Body>({
      autoProceed: true,
      restrictions: { allowedFileTypes: [...Object.keys(PHOTO_TYPES), '.heic', '.heif'], maxFileSize: MAX_PHOTO_BYTES, maxNumberOfFiles: Math.max(1, MAX_PHOTOS_PER_SCOPE - initial.length) },
    });
    u.use(AwsS3<Meta, Body>, {
      shouldUseMultipart: false,
      allowedMetaFields: false,
      limit: 4,
      // The key is ours to choose on the server; Uppy's key only finds the file again in signRequest.
      generateObjectKey: (file: UppyFile<Meta, Body>) => file.id,
      signRequest: async (req) => {
        if (req.method !== 'PUT' || 'uploadId' in req) throw new Error('Only single-part photo uploads are supported.');
        const file = u.getFile(req.key);
        const body = { filename: file.name ?? 'photo', contentType: file.type || 'application/octet-stream', size: file.size ?? 0, scope: scopeRef.current };
        const p = await api<Presigned>('/api/uploads/presign', { body });
        u.setFileMeta(file.id, { ttKey: p.key } as never);
        return { url: p.url, key: p.key, headers: p.headers };
      },
    });
    return u;
  });

  useEffect(() => {
    const onSuccess = async (file: UppyFile<Meta, Body> | undefined, res: { body?: Body }) => {
      if (!file) return;
      const key = String(res.body?.['key'] ?? (file.meta as Record<string, unknown>)['ttKey'] ?? '');
      try {
        const a = await api<AttachmentDto>('/api/uploads/complete', { body: { key, filename: file.name ?? 'photo', contentType: file.type, size: file.size ?? 0, scope: scopeRef.current } });
        setPhotos((ps) => [...ps, a]);
        onUploadedRef.current?.(a);
        setStatus({ kind: 'ok', message: `Saved ${file.name}.` });
        uppy.removeFile(file.id);
      } catch (e) {
        setStatus({ kind: 'error', message: `${file.name}: ${messageOf(e)}` });
        uppy.removeFile(file.id);
      }
    };
    const onError = (file: UppyFile<Meta, Body> | undefined, err: { message?: string }) => setStatus({ kind: 'error', message: `${file?.name ?? 'A photo'} was not uploaded: ${err.message ?? 'unknown problem'}. Use “Retry” to try again.` });
    const onRestriction = (file: UppyFile<Meta, Body> | undefined, err: Error) => setStatus({ kind: 'error', message: `${file?.name ?? 'That file'} was not added: ${err.message}` });
    uppy.on('upload-success', onSuccess);
    uppy.on('upload-error', onError);
    uppy.on('restriction-failed', onRestriction);
    setHydrated(true);
    return () => {
      uppy.off('upload-success', onSuccess);
      uppy.off('upload-error', onError);
      uppy.off('restriction-failed', onRestriction);
    };
  }, [uppy]);

  useEffect(() => {
    uppy.setOptions({ restrictions: { ...uppy.opts.restrictions, maxNumberOfFiles: Math.max(1, MAX_PHOTOS_PER_SCOPE - photos.length) } });
  }, [uppy, photos.length]);

  useEffect(() => () => uppy.destroy(), [uppy]);

  return (
    <section className="space-y-3" data-testid="photo-uploader" data-hydrated={hydrated ? 'true' : undefined} aria-label={title}>
      <h3 className="text-xl font-semibold">{title} <span className="text-muted font-normal">({photos.length} of {MAX_PHOTOS_PER_SCOPE})</span></h3>
      <p className="text-muted" data-testid="upload-limits">{uploadLimitsText()}</p>
      <PhotoStrip photos={photos} label={title} />
      <StatusRegion status={status} />
      {photos.length < MAX_PHOTOS_PER_SCOPE ? (
        <div className="tt-no-print">
          <Dashboard uppy={uppy} height={260} width="100%" note={uploadLimitsText()} proudlyDisplayPoweredByUppy={false} showNativePhotoCameraButton hideProgressDetails={false} theme="auto" />
        </div>
      ) : (
        <p className="font-semibold">This already has the most photos kept here ({MAX_PHOTOS_PER_SCOPE}).</p>
      )}
    </section>
  );
}
