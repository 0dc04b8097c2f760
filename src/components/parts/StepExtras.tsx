/**
 * What the runner offers beside the current step: its photos (always on tag-part steps and
 * steps that ask for a photo, otherwise on request) and "Record a finding".
 */
import { useEffect, useState } from 'react';
import type { Step } from '../../domain/procedure/schema';
import { roleCan } from '../../lib/access';
import { api } from '../../lib/api-client';
import { LazyFindingForm } from './LazyFindingForm';
import { LazyPhotoUploader } from './LazyPhotoUploader';
import type { AttachmentDto } from './types';

type Props = { runId: string; jobId: string; step: Step; role: string };

const wantsPhotos = (s: Step) => s.kind === 'tag-part' || ((s.kind === 'action') && s.photoRequired);

export function StepExtras({ runId, jobId, step, role }: Props) {
  const canRecord = roleCan(role, { run: ['record'] });
  const [photos, setPhotos] = useState<AttachmentDto[] | null>(null);
  const [showPhotos, setShowPhotos] = useState(wantsPhotos(step));
  const [finding, setFinding] = useState(false);
  const [loadError, setLoadError] = useState<string | null>(null);

  useEffect(() => {
    let live = true;
    setPhotos(null);
    api<{ attachments: AttachmentDto[] }>(`/api/attachments?runId=${encodeURIComponent(runId)}&stepId=${encodeURIComponent(step.id)}`)
      .then((r) => live && setPhotos(r.attachments))
      .catch((e: Error) => live && setLoadError(e.message));
    return () => { live = false; };
  }, [runId, step.id]);

  if (!canRecord) return null;
  return (
    <section className="tt-card p-4 space-y-3 tt-no-print" data-testid="step-extras" aria-label="Photos and findings">
      {loadError && <p className="tt-status rounded-md px-4 py-3" data-kind="error">The step's photos could not be loaded: {loadError}</p>}
      {showPhotos ? (
        photos && <LazyPhotoUploader key={step.id} scope={{ kind: 'run-step', runId, stepId: step.id }} initial={photos} title={step.kind === 'tag-part' ? `Photos of the ${step.partName.toLowerCase()}` : 'Photos of this step'} />
      ) : (
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setShowPhotos(true)}>Add photos</button>
      )}
      {finding ? (
        <LazyFindingForm jobId={jobId} runId={runId} stepId={step.id} onClose={() => setFinding(false)} />
      ) : (
        <button type="button" className="tt-btn tt-btn-quiet" onClick={() => setFinding(true)} data-testid="record-finding">Record a finding</button>
      )}
    </section>
  );
}
