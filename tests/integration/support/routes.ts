/**
 * Calls an Astro API route handler with a real Request and the locals the middleware would
 * set, so tests pin status codes and error bodies without a running server.
 */
import type { APIContext, APIRoute } from 'astro';
import { RequestContext } from '@mikro-orm/core';
import { initORM } from '../../../src/server/db';
import type { TestMember, TestShop } from './shops';

type Call = { method?: string; path?: string; body?: unknown; rawBody?: string; contentType?: string; params?: Record<string, string>; as?: { shop: TestShop; member: TestMember } | null };

export async function callRoute(route: APIRoute, c: Call = {}): Promise<{ status: number; body: any; headers: Headers }> {
  const url = new URL(c.path ?? '/api/test', 'http://127.0.0.1:4321');
  const init: RequestInit = { method: c.method ?? 'GET', headers: {} };
  if (c.rawBody !== undefined || c.body !== undefined) {
    init.body = c.rawBody ?? JSON.stringify(c.body);
    (init.headers as Record<string, string>)['content-type'] = c.contentType ?? 'application/json';
  }
  if (c.as) (init.headers as Record<string, string>).cookie = c.as.member.headers.get('cookie') ?? '';
  const request = new Request(url, init);
  const locals: App.Locals = c.as
    ? { user: { id: c.as.member.userId, name: c.as.member.name, email: c.as.member.email }, session: { id: 'test', activeOrganizationId: c.as.shop.id }, shop: { id: c.as.shop.id, name: c.as.shop.name, slug: '' }, role: c.as.member.role }
    : { user: null, session: null, shop: null, role: null };
  const ctx = { request, url, params: c.params ?? {}, locals, redirect: (to: string, status = 302) => new Response(null, { status, headers: { location: to } }) } as unknown as APIContext;
  const orm = await initORM();
  const res = await RequestContext.create(orm.em, async () => (await route(ctx)) as Response);
  const text = await res.text();
  let body: unknown = text;
  try { body = JSON.parse(text); } catch { /* not JSON */ }
  return { status: res.status, body, headers: res.headers };
}
