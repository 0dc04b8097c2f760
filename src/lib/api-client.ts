/**
 * The islands' one way to call our JSON API: same-origin fetch, JSON in and out, and every
 * non-2xx answer thrown as an ApiError carrying the server's `{ error: { code, message, … } }`.
 */

/** An API answer that was not a success, or a request that never reached the server. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    /** HTTP status; 0 when the request did not reach the server (offline, DNS, aborted). */
    readonly status: number,
    readonly code: string,
    message: string,
    /** The `error` object of the body as the server sent it (may hold fields, lastSeq, events …). */
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
  /** Field messages keyed by path, when the server rejected a form. */
  get fields(): Record<string, string> {
    const f = this.body['fields'];
    return f && typeof f === 'object' ? (f as Record<string, string>) : {};
  }
  /** True when the request never got an answer: worth queueing and retrying. */
  get isNetwork(): boolean {
    return this.status === 0;
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

type Options = { method?: string; body?: unknown; signal?: AbortSignal; headers?: Record<string, string> };

/** Calls our API and returns the parsed JSON body; throws ApiError for anything but a 2xx. */
export async function api<T>(path: string, opts: Options = {}): Promise<T> {
  const init: RequestInit = { method: opts.method ?? (opts.body === undefined ? 'GET' : 'POST'), credentials: 'same-origin', headers: { accept: 'application/json', ...(opts.headers ?? {}) } };
  if (opts.signal) init.signal = opts.signal;
  if (opts.body !== undefined) {
    init.body = JSON.stringify(opts.body);
    (init.headers as Record<string, string>)['content-type'] = 'application/json';
  }
  let res: Response;
  try {
    res = await fetch(path, init);
  } catch (e) {
    if (e instanceof DOMException && e.name === 'AbortError') throw e;
    throw new ApiError(0, 'network', 'No connection to the server. Check the network and try again.');
  }
  const text = await res.text();
  let data: unknown = null;
  if (text) {
    try {
      data = JSON.parse(text);
    } catch {
      if (res.ok) throw new ApiError(res.status, 'bad-response', 'The server sent an answer we could not read.');
    }
  }
  if (!res.ok) {
    const err = (data && typeof data === 'object' && 'error' in data ? (data as { error: Record<string, unknown> }).error : {}) ?? {};
    const code = typeof err['code'] === 'string' ? err['code'] : `http-${res.status}`;
    const message = typeof err['message'] === 'string' ? err['message'] : fallbackMessage(res.status);
    throw new ApiError(res.status, code, message, err);
  }
  return data as T;
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Your session has ended. Sign in again.';
  if (status === 403) return 'Your role may not do this.';
  if (status === 404) return 'That record was not found.';
  if (status >= 500) return 'Something went wrong on the server. Nothing was lost; try again.';
  return `The server refused the request (${status}).`;
}
