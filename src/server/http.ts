/**
 * One error shape for every API route: `{ error: { code, message, fields? } }`, and the
 * `handle()` wrapper that maps whatever a handler throws onto it.
 */
import type { APIContext, APIRoute } from 'astro';
import { NotFoundError } from '@mikro-orm/core';
import * as z from 'zod';
import { DomainError, type DomainErrorCode } from '../domain/errors';

export type ErrorCode = 'bad-request' | 'unauthenticated' | 'forbidden' | 'not-found' | 'conflict' | 'payload-too-large' | 'unsupported-media-type' | 'rate-limited' | 'internal' | DomainErrorCode;

const STATUS: Record<ErrorCode, number> = {
  'bad-request': 400,
  'invalid-input': 400,
  'unknown-unit': 400,
  'unit-mismatch': 400,
  'invalid-order': 400,
  unauthenticated: 401,
  forbidden: 403,
  'not-allowed': 403,
  'not-found': 404,
  conflict: 409,
  'out-of-order': 409,
  'no-fit': 422,
  'payload-too-large': 413,
  'unsupported-media-type': 415,
  'rate-limited': 429,
  internal: 500,
};

export class AppError extends Error {
  override readonly name = 'AppError';
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly extra?: { fields?: Record<string, string>; [k: string]: unknown },
  ) {
    super(message);
  }
  get status(): number {
    return STATUS[this.code];
  }
}

export const notFound = (what = 'That record') => new AppError('not-found', `${what} was not found.`);

export function json(body: unknown, init: number | ResponseInit = 200): Response {
  return jsonText(JSON.stringify(body), init);
}

/**
 * A response from JSON text already serialised. The body goes out as UTF-8 bytes: a string body
 * makes the Fetch implementation scan and re-encode it, which is measurable on large run logs.
 */
export function jsonText(text: string, init: number | ResponseInit = 200): Response {
  const i = typeof init === 'number' ? { status: init } : init;
  return new Response(Buffer.from(text, 'utf8'), { ...i, headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...(i.headers ?? {}) } });
}

export function errorResponse(code: ErrorCode, message: string, extra?: Record<string, unknown>): Response {
  return json({ error: { code, message, ...extra } }, STATUS[code]);
}

/** zod issues keyed by dotted path, for showing beside form fields. */
export function fieldsOf(err: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const i of err.issues) {
    const key = i.path.map(String).join('.') || '_';
    fields[key] ??= i.message;
  }
  return fields;
}

/** Maps anything thrown to our error shape; unknown errors are logged and answered generically. */
export function toErrorResponse(e: unknown, ctx?: { request: Request }): Response {
  if (e instanceof AppError) return errorResponse(e.code, e.message, e.extra);
  if (e instanceof z.ZodError) return errorResponse('bad-request', 'Some fields are not valid.', { fields: fieldsOf(e) });
  if (e instanceof DomainError) return errorResponse(e.code, e.message, e.details ? { details: e.details } : undefined);
  if (e instanceof NotFoundError) return errorResponse('not-found', 'That record was not found.');
  const where = ctx ? `${ctx.request.method} ${new URL(ctx.request.url).pathname}` : '';
  console.error(`[api] unhandled error ${where}`, e);
  return errorResponse('internal', 'Something went wrong on our side. Nothing was saved; try again.');
}

/** Wraps a route handler so every error leaves in our one shape. */
export function handle(fn: (ctx: APIContext) => Promise<Response> | Response): APIRoute {
  return async (ctx) => {
    try {
      return await fn(ctx);
    } catch (e) {
      return toErrorResponse(e, ctx);
    }
  };
}

const MAX_JSON_BYTES = 2 * 1024 * 1024;

/** Reads and validates a JSON body; malformed JSON and wrong content types are 400/415. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  const type = (request.headers.get('content-type') ?? '').toLowerCase();
  if (!type.includes('application/json')) throw new AppError('unsupported-media-type', 'Send the request body as JSON (content-type: application/json).');
  const text = await request.text();
  if (text.length > MAX_JSON_BYTES) throw new AppError('payload-too-large', 'The request body is too large.');
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new AppError('bad-request', 'The request body is not valid JSON.');
  }
  const bad = unstorableText(data);
  if (bad) throw new AppError('bad-request', `Some text cannot be saved: ${bad.why}.`, { fields: { [bad.path || '_']: bad.why } });
  return schema.parse(data);
}

// NUL cannot be stored in PostgreSQL text, and a lone UTF-16 surrogate would silently become
// U+FFFD on the way to the database: both are refused rather than lost or changed.
const NUL = /\u0000/;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** The first string (value or key) in parsed JSON that the database cannot keep as sent. */
export function unstorableText(v: unknown, path = ''): { path: string; why: string } | null {
  if (typeof v === 'string') {
    if (NUL.test(v)) return { path, why: 'it contains a NUL character' };
    if (LONE_SURROGATE.test(v)) return { path, why: 'it contains an unpaired surrogate (broken unicode)' };
    return null;
  }
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) {
      const r = unstorableText(v[i], path ? `${path}.${i}` : String(i));
      if (r) return r;
    }
    return null;
  }
  if (v && typeof v === 'object') {
    for (const [k, x] of Object.entries(v)) {
      const p = path ? `${path}.${k}` : k;
      const rk = unstorableText(k, p);
      if (rk) return rk;
      const r = unstorableText(x, p);
      if (r) return r;
    }
  }
  return null;
}
