/**
 * The editor's calls to the revisions API, on the shared client (src/lib/api-client.ts); its
 * ApiError carries the API's `error` object (e.g. the current revision on a 409).
 */
import { api, ApiError } from '../../lib/api-client';
import type { RevisionDto } from './types';

export { ApiError };

/** Sends a request through the islands' one API client; anything but 2xx throws its ApiError. */
export const apiFetch = <T>(method: string, url: string, body?: unknown): Promise<T> => api<T>(url, { method, body });

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The revision carried in a 409 body, under whichever key the server put it. */
export function currentRevisionOf(body: unknown): RevisionDto | null {
  if (!isRecord(body)) return null;
  const candidates = [body.current, body.revision, isRecord(body.error) ? body.error.current : undefined, isRecord(body.error) ? body.error.revision : undefined];
  for (const c of candidates) if (isRecord(c) && typeof c.version === 'number' && isRecord(c.content)) return c as unknown as RevisionDto;
  return null;
}

export const revisionsApi = {
  get: (id: string) => apiFetch<RevisionDto>('GET', `/api/revisions/${encodeURIComponent(id)}`),
  saveContent: (id: string, steps: unknown[], version: number) =>
    apiFetch<RevisionDto>('PUT', `/api/revisions/${encodeURIComponent(id)}/content`, { steps, version }),
  setNote: (id: string, note: string) => apiFetch<RevisionDto>('PATCH', `/api/revisions/${encodeURIComponent(id)}`, { note }),
  release: (id: string, note: string) => apiFetch<RevisionDto>('POST', `/api/revisions/${encodeURIComponent(id)}/release`, { note }),
  startDraft: (procedureId: string, fromRevisionId: string) =>
    apiFetch<RevisionDto>('POST', `/api/procedures/${encodeURIComponent(procedureId)}/drafts`, { fromRevisionId }),
  deriveAssembly: (id: string) =>
    apiFetch<{ procedure: { id: string }; draft: RevisionDto }>('POST', `/api/revisions/${encodeURIComponent(id)}/derive-assembly`),
};
