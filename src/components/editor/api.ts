/**
 * The editor's small API client: JSON in and out, and one typed error carrying the API's
 * `{ error: { code, message, fields? } }` (plus the whole body, e.g. the current revision on 409).
 */
import type { RevisionDto } from './types';

export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
    readonly body: unknown = null,
  ) {
    super(message);
  }
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Sends a request; anything but 2xx throws an ApiError with a message for a person. */
export async function apiFetch<T>(method: string, url: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'network', 'Could not reach the server. Check the connection and try again.');
  }
  const text = await res.text();
  let data: unknown = null;
  if (text) {
    try {
      data = JSON.parse(text);
    } catch {
      data = null;
    }
  }
  if (res.ok) return data as T;
  const err = isRecord(data) && isRecord(data.error) ? data.error : {};
  const message = typeof err.message === 'string' ? err.message : `The server answered ${res.status}. Nothing was changed; try again.`;
  const code = typeof err.code === 'string' ? err.code : 'http-' + res.status;
  const fields = isRecord(err.fields) ? Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [k, String(v)])) : {};
  throw new ApiError(res.status, code, message, fields, data);
}

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
