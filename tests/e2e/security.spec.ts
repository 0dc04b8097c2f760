/**
 * Web security against the built server: origin checks on every state-changing API route found
 * on disk, the sign-in gate on every private one, session cookie flags on http, security
 * headers, a Content-Security-Policy that the main pages pass in Chromium (no violation
 * reported, islands still hydrate), and no HTML injection through names, step text and notes.
 * The https cookie flags and the sign-in rate limit are pinned in
 * tests/integration/rate-limit.int.test.ts (this server runs with a limit of 1000).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { APP_URL, demo, hydrated, launch, newContext, signInAs } from './support/browser';
import { DEMO_PASSWORD } from '../../src/server/seeders/demo-people';
import { discoverRoutes, fillPattern, isPublicPattern, STATE_CHANGING } from '../integration/support/routes-index';

const EVIL = 'https://evil.example';
const routes = discoverRoutes();
const fakeParams = { id: '00000000-0000-4000-8000-000000000001', linkId: '00000000-0000-4000-8000-000000000002', token: 'no-such-token', all: 'sign-in/email' };

async function signInCookie(email: string): Promise<{ cookie: string; setCookie: string[] }> {
  const res = await fetch(`${APP_URL}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: APP_URL }, body: JSON.stringify({ email, password: DEMO_PASSWORD }) });
  expect(res.status).toBe(200);
  const setCookie = res.headers.getSetCookie();
  return { cookie: setCookie.map((c) => c.split(';')[0]).join('; '), setCookie };
}
async function api(cookie: string, method: string, path: string, body?: unknown, headers: Record<string, string> = {}) {
  const res = await fetch(`${APP_URL}${path}`, { method, redirect: 'manual', headers: { cookie, origin: APP_URL, ...(body !== undefined ? { 'content-type': 'application/json' } : {}), ...headers }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await res.text();
  let json: any = text;
  try { json = JSON.parse(text); } catch { /* not JSON */ }
  return { status: res.status, body: json, headers: res.headers };
}
const ok = async (cookie: string, method: string, path: string, body?: unknown) => {
  const r = await api(cookie, method, path, body);
  if (r.status >= 300) throw new Error(`${method} ${path} → ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
  return r.body;
};

let lead = '';
beforeAll(async () => { lead = (await signInCookie(demo('lead').email)).cookie; });

describe('origin checks on state-changing requests', () => {
  const targets = routes.flatMap((r) => r.methods.flatMap((m) => (m === 'ALL' ? ['POST'] : STATE_CHANGING.has(m) ? [m] : [])).map((m) => ({ m, r })));

  it('finds the state-changing routes on disk', () => { expect(targets.length).toBeGreaterThan(20); });

  it('refuses a foreign Origin on every one (403), with our error shape outside /api/auth/*', async () => {
    for (const { m, r } of targets) {
      const path = fillPattern(r.pattern, fakeParams);
      const res = await api(lead, m, path, {}, { origin: EVIL });
      expect(res.status, `${m} ${path}`).toBe(403);
      if (!r.pattern.startsWith('/api/auth/')) {
        expect(res.body?.error?.code, `${m} ${path}`).toBe('forbidden');
        expect(res.body?.error?.message, `${m} ${path}`).toMatch(/another site/);
      }
    }
  });

  it('refuses a cross-site request without Origin (Sec-Fetch-Site) and the literal "null" origin', async () => {
    const a = await api(lead, 'POST', '/api/jobs', { unitDescription: 'Cross-site unit' }, { origin: '', 'sec-fetch-site': 'cross-site' });
    expect(a.status).toBe(403);
    const b = await api(lead, 'POST', '/api/jobs', { unitDescription: 'Null-origin unit' }, { origin: 'null' });
    expect(b.status).toBe(403);
    const jobs = await ok(lead, 'GET', '/api/jobs');
    expect(jobs.jobs.some((j: { unitDescription: string }) => /Cross-site unit|Null-origin unit/.test(j.unitDescription))).toBe(false);
  });

  it('lets our own origin through (the request reaches the route: 400 for an empty body, not 403)', async () => {
    const r = await api(lead, 'POST', '/api/jobs', {});
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toBeDefined();
  });

  it('Astro refuses a cross-site form post to a page', async () => {
    const res = await fetch(`${APP_URL}/sign-out`, { method: 'POST', headers: { origin: EVIL, 'content-type': 'application/x-www-form-urlencoded', cookie: lead }, body: 'a=1', redirect: 'manual' });
    expect(res.status).toBe(403);
  });
});

describe('sign-in gate', () => {
  it('every private API route answers 401 in our shape when signed out, through the real middleware', async () => {
    let checked = 0;
    for (const r of routes) {
      if (isPublicPattern(r.pattern)) continue;
      for (const m of r.methods) {
        const path = fillPattern(r.pattern, fakeParams);
        const res = await api('', m === 'ALL' ? 'GET' : m, path, m === 'GET' ? undefined : {});
        expect(res.status, `${m} ${path}`).toBe(401);
        expect(res.body?.error?.code, `${m} ${path}`).toBe('unauthenticated');
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(30);
  });
});

describe('cookies and headers', () => {
  it('the session cookie is HttpOnly, SameSite=Lax, Path=/ and (on http) not Secure', async () => {
    const { setCookie } = await signInCookie(demo('technician').email);
    const session = setCookie.find((c) => /session_token=/.test(c));
    expect(session).toBeDefined();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
    expect(APP_URL.startsWith('http://')).toBe(true);
    expect(session).not.toMatch(/;\s*Secure/i);
  });

  it('pages carry a CSP without unsafe-inline or unsafe-eval for scripts, and the usual headers', async () => {
    for (const [path, cookie] of [['/sign-in', ''], ['/', lead], ['/jobs', lead]] as const) {
      const res = await fetch(`${APP_URL}${path}`, { headers: { cookie }, redirect: 'manual' });
      expect(res.status, path).toBe(200);
      const csp = res.headers.get('content-security-policy') ?? '';
      const script = csp.split(';').map((d) => d.trim()).find((d) => d.startsWith('script-src')) ?? '';
      expect(script, path).toMatch(/^script-src 'self'/);
      expect(script, path).not.toMatch(/unsafe-inline|unsafe-eval|\*/);
      expect(csp, path).toMatch(/object-src 'none'/);
      expect(csp, path).toMatch(/frame-ancestors 'none'/);
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
    }
  });
});

// ——— In Chromium: CSP violations and HTML injection ———

const XSS = {
  img: '<img src=x onerror="window.__xss=(window.__xss||0)+1">',
  script: '<script>window.__xss=(window.__xss||0)+1</script>',
  svg: '"><svg onload="window.__xss=(window.__xss||0)+1">',
};
const ALL_XSS = `${XSS.img} ${XSS.script} ${XSS.svg}`;

let browser: Browser;
let ids: { procedureId: string; revisionId: string; draftId: string; jobId: string; runId: string };

beforeAll(async () => {
  browser = await launch();
  const techId = (await ok((await signInCookie(demo('technician').email)).cookie, 'GET', '/api/auth/get-session')).user.id;
  const created = await ok(lead, 'POST', '/api/procedures', { name: `Injection check ${XSS.img}`, kind: 'teardown', engineFamily: `Family ${XSS.svg}`, description: `About ${XSS.script}` });
  const steps = [
    { id: 's-a', kind: 'action', title: `Wipe ${XSS.img}`, body: `Body ${ALL_XSS}` },
    { id: 's-c', kind: 'caution', title: `Careful ${XSS.script}`, body: ALL_XSS, severity: 'warning', hazards: ['lifting'], mustAcknowledge: true },
    { id: 's-h', kind: 'hold-point', title: `Review ${XSS.svg}`, body: ALL_XSS, signers: ['reviewer'] },
  ];
  const draft = await ok(lead, 'PUT', `/api/revisions/${created.draft.id}/content`, { steps, version: created.draft.version });
  await ok(lead, 'POST', `/api/revisions/${draft.id}/release`, { note: `Released ${XSS.img}` });
  const next = await ok(lead, 'POST', `/api/procedures/${created.procedure.id}/drafts`, { fromRevisionId: draft.id });
  const job = await ok(lead, 'POST', '/api/jobs', { unitDescription: `Unit ${XSS.img}`, serial: XSS.svg, customer: `Customer ${XSS.script}`, notes: `Notes ${ALL_XSS}`, technicianIds: [techId] });
  const run = await ok(lead, 'POST', `/api/jobs/${job.id}/runs`, { revisionId: draft.id });
  await ok(lead, 'POST', `/api/runs/${run.run.id}/events`, { event: { type: 'step.start', stepId: 's-a' }, idempotencyKey: crypto.randomUUID(), expectedSeq: 0 });
  await ok(lead, 'POST', `/api/runs/${run.run.id}/events`, { event: { type: 'step.complete', stepId: 's-a', note: `Done ${ALL_XSS}` }, idempotencyKey: crypto.randomUUID(), expectedSeq: 1 });
  await api(lead, 'POST', `/api/jobs/${job.id}/findings`, { what: `Crack ${XSS.img}`, where: XSS.svg, severity: 'minor' });
  ids = { procedureId: created.procedure.id, revisionId: draft.id, draftId: next.id, jobId: job.id, runId: run.run.id };
});
afterAll(async () => { await browser?.close(); });

/** Records CSP violations and dialogs; the page's own listener sees violations the console may not. */
async function watch(page: Page) {
  const found: string[] = [];
  page.on('console', (m) => { if (/Content Security Policy|Refused to (execute|load|apply)/i.test(m.text())) found.push(`console: ${m.text().slice(0, 300)}`); });
  page.on('dialog', async (d) => { found.push(`dialog: ${d.message()}`); await d.dismiss(); });
  await page.addInitScript(() => {
    (window as unknown as { __csp: string[] }).__csp = [];
    document.addEventListener('securitypolicyviolation', (e) => (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}:${e.lineNumber}`));
  });
  return found;
}
async function settle(page: Page, path: string, island = true) {
  const res = await page.goto(path);
  expect(res?.status(), path).toBeLessThan(400);
  if (island) await hydrated(page);
  await page.waitForLoadState('networkidle');
}
async function violations(page: Page, found: string[]) {
  return [...found, ...(await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp))];
}
/** No element the payloads would create, no script carrying them, and the flag never set. */
async function noInjection(page: Page, path: string) {
  const r = await page.evaluate(() => ({
    imgs: document.querySelectorAll('img[src="x"]').length,
    svgs: [...document.querySelectorAll('svg[onload]')].length,
    handlers: [...document.querySelectorAll('*')].filter((el) => [...el.attributes].some((a) => a.name.startsWith('on') && a.value.includes('__xss'))).length,
    scripts: [...document.querySelectorAll('script')].filter((s) => (s.textContent ?? '').includes('__xss')).length,
    flag: (window as unknown as { __xss?: number }).__xss ?? 0,
    text: document.body.innerText,
  }));
  expect({ path, imgs: r.imgs, svgs: r.svgs, handlers: r.handlers, scripts: r.scripts, flag: r.flag }).toEqual({ path, imgs: 0, svgs: 0, handlers: 0, scripts: 0, flag: 0 });
  return r.text;
}

describe('Content-Security-Policy in Chromium', () => {
  it('sign-in, home, procedures, procedure, editor, jobs, job, runner: no violation, islands hydrate', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    const found = await watch(page);
    await settle(page, '/sign-in');
    expect(await violations(page, found), '/sign-in').toEqual([]);
    await signInAs(page, 'lead');
    for (const path of ['/', '/procedures', `/procedures/${ids.procedureId}`, `/revisions/${ids.draftId}/edit`, '/jobs', `/jobs/${ids.jobId}`, `/runs/${ids.runId}`]) {
      await settle(page, path, path !== '/');
      expect(await violations(page, found), path).toEqual([]);
    }
    await ctx.close();
  });
});

describe('HTML injection through names, step text and notes', () => {
  it('shows the payloads as text and never as elements, on every page that renders them', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    const found = await watch(page);
    await signInAs(page, 'lead');
    const pages: Array<[string, RegExp]> = [
      ['/procedures', /Injection check <img src=x/],
      [`/procedures/${ids.procedureId}`, /Injection check <img src=x/],
      [`/revisions/${ids.draftId}/edit`, /./],
      [`/revisions/compare?a=${ids.revisionId}&b=${ids.draftId}`, /./],
      ['/jobs', /Unit <img src=x/],
      [`/jobs/${ids.jobId}`, /Unit <img src=x/],
      [`/jobs/${ids.jobId}/findings`, /Crack <img src=x/],
      [`/runs/${ids.runId}`, /Wipe <img src=x/],
      [`/runs/${ids.runId}/history`, /./],
    ];
    for (const [path, shown] of pages) {
      const res = await page.goto(path);
      expect(res?.status(), path).toBeLessThan(400);
      await page.waitForLoadState('networkidle');
      const text = await noInjection(page, path);
      expect(text, path).toMatch(shown);
    }
    expect(found.filter((f) => f.startsWith('dialog'))).toEqual([]);
    await ctx.close();
  });
});
