/**
 * Every request: one MikroORM identity map, the session and active shop on `locals`, then the
 * sign-in gate (pages redirect, API routes answer 401 in our error shape), then security headers.
 */
import { defineMiddleware, sequence } from 'astro:middleware';
import { RequestContext } from '@mikro-orm/core';
import { initORM } from './server/db';
import { auth } from './server/auth';
import { activeMembership } from './server/membership';
import { errorResponse } from './server/http';
import { config, trustedOrigins } from './server/config';
import { contentSecurityPolicy } from './server/csp';
import { countingSql, withSqlCount } from './server/sql-counter';

const PUBLIC_PREFIXES = ['/sign-in', '/forgot-password', '/reset-password', '/invitation/', '/api/auth/', '/api/health', '/share/', '/api/share/', '/_astro/', '/_image', '/favicon', '/fonts/'];
const isPublic = (path: string) => PUBLIC_PREFIXES.some((p) => path === p || path.startsWith(p)) || path === '/404' || path === '/500';

const withOrmContext = defineMiddleware(async (_ctx, next) => {
  const orm = await initORM();
  return RequestContext.create(orm.em, next);
});

const withSession = defineMiddleware(async (ctx, next) => {
  ctx.locals.user = null;
  ctx.locals.session = null;
  ctx.locals.shop = null;
  ctx.locals.role = null;
  const path = ctx.url.pathname;
  if (path.startsWith('/_astro/') || path.startsWith('/api/auth/')) return next();
  const s = await auth().api.getSession({ headers: ctx.request.headers });
  if (s) {
    ctx.locals.user = { id: s.user.id, name: s.user.name, email: s.user.email };
    ctx.locals.session = { id: s.session.id, activeOrganizationId: (s.session as { activeOrganizationId?: string | null }).activeOrganizationId ?? null };
    const m = await activeMembership(s.user.id, ctx.locals.session.activeOrganizationId);
    if (m) {
      ctx.locals.shop = m.shop;
      ctx.locals.role = m.role;
    }
  }
  return next();
});

const signInGate = defineMiddleware(async (ctx, next) => {
  const path = ctx.url.pathname;
  if (ctx.locals.user || isPublic(path)) return next();
  if (path.startsWith('/api/')) return errorResponse('unauthenticated', 'Sign in first.');
  const back = path + ctx.url.search;
  return ctx.redirect(`/sign-in${back && back !== '/' ? `?next=${encodeURIComponent(back)}` : ''}`, 303);
});

/**
 * State-changing API calls must come from one of our own origins (better-auth checks its own
 * /api/auth/* routes; Astro's checkOrigin covers form posts to pages). A browser always sends
 * Origin on a cross-site POST; a request with no Origin is allowed unless Sec-Fetch-Site says it
 * came from another site (command-line clients send neither).
 */
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const originCheck = defineMiddleware(async (ctx, next) => {
  const path = ctx.url.pathname;
  if (SAFE_METHODS.has(ctx.request.method) || !path.startsWith('/api/') || path.startsWith('/api/auth/')) return next();
  const origin = ctx.request.headers.get('origin');
  const site = ctx.request.headers.get('sec-fetch-site');
  const trusted = origin ? trustedOrigins().includes(origin) : site !== 'cross-site' && site !== 'same-site';
  if (!trusted) return errorResponse('forbidden', 'This request came from another site, so it was refused. Use Torquetrail from its own address.');
  return next();
});

const securityHeaders = defineMiddleware(async (_ctx, next) => {
  const res = await next();
  const h = res.headers;
  if (!h.has('x-content-type-options')) h.set('x-content-type-options', 'nosniff');
  if (!h.has('referrer-policy')) h.set('referrer-policy', 'same-origin');
  if (!h.has('x-frame-options')) h.set('x-frame-options', 'DENY');
  // Pages only: the dev server injects scripts of its own, so it goes without a policy.
  if (!import.meta.env.DEV && (h.get('content-type') ?? '').includes('text/html') && !h.has('content-security-policy')) {
    h.set('content-security-policy', pagePolicy());
  }
  return res;
});

let policy: string | undefined;
/** Our policy, with the object store's origin for photos and presigned uploads. */
function pagePolicy(): string {
  if (policy) return policy;
  let store: string[] = [];
  try { store = [new URL(config().S3_ENDPOINT).origin]; } catch { /* no store configured */ }
  policy = contentSecurityPolicy(store);
  return policy;
}

/** Bench mode only: reports the request's SQL statement count in a response header. */
const sqlCount = defineMiddleware(async (_ctx, next) => {
  if (!countingSql) return next();
  const { result, statements } = await withSqlCount(async () => next());
  const res = new Response(result.body, result);
  res.headers.set('x-sql-statements', String(statements));
  return res;
});

export const onRequest = sequence(sqlCount, securityHeaders, originCheck, withOrmContext, withSession, signInGate);
