/**
 * A phone-sized touch screen (390 × 844 CSS px, a common small phone width): no page a role
 * opens may scroll sideways. Wide tables scroll inside their own box instead; the runner's
 * columns stack. Pages are found the way a member finds them: the nav pages, then every job,
 * run, run history, sign-off page and procedure the member can see.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newContext, ok, signedIn, signInAs, type DemoRole } from './support/browser';

let browser: Browser;

/** Unbroken tokens as a shop might paste them: part numbers, links, e-mail addresses. */
const LONG = {
  part: 'PN-' + 'A7Q2'.repeat(16),
  link: 'https://parts.example.test/catalogue/' + 'section-'.repeat(8) + 'item',
  mail: 'machinist.' + 'x'.repeat(40) + '@example.test',
};

/** A job of its own with long tokens everywhere they show, so the check does not rely on other tests' data. */
async function seedLongTokens() {
  const tech = await signedIn(browser, 'technician');
  await tech.ctx.close();
  const lead = await signedIn(browser, 'lead');
  const api = lead.ctx.request;
  type Id = { id: string };
  const demoJob = (await ok<{ jobs: Array<Id & { code: string }> }>(await api.get('/api/jobs'), 200)).jobs.find((j) => j.code === 'J-0001')!;
  const demoRun = (await ok<{ runs: Id[] }>(await api.get(`/api/jobs/${demoJob.id}`), 200)).runs[0]!.id;
  const { revisionId } = (await ok<{ run: { revisionId: string } }>(await api.get(`/api/runs/${demoRun}`), 200)).run;
  const job = await ok<Id>(await api.post('/api/jobs', { data: { unitDescription: `Invented unit ${LONG.part}`, serial: LONG.part.slice(0, 60), customer: LONG.mail, notes: `See ${LONG.link}`, technicianIds: [tech.userId] } }), 201);
  await ok(await api.post(`/api/jobs/${job.id}/runs`, { data: { revisionId } }), 201);
  await ok(await api.post(`/api/jobs/${job.id}/findings`, { data: { what: `Scoring on ${LONG.part}`, where: LONG.link, severity: 'minor', partsToReplace: [{ part: LONG.part, quantity: 1 }] } }), 201);
  await lead.ctx.close();
}

beforeAll(async () => {
  browser = await launch();
  await seedLongTokens();
});
afterAll(async () => { await browser?.close(); });

async function pagesOf(page: Page): Promise<string[]> {
  const get = async (path: string) => (await page.request.get(path)).json();
  const paths = ['/', '/jobs', '/procedures', '/review', '/tags', '/members', '/settings'];
  for (const j of (await get('/api/jobs')).jobs as Array<{ id: string }>) {
    paths.push(`/jobs/${j.id}`);
    for (const r of ((await get(`/api/jobs/${j.id}`)).runs ?? []) as Array<{ id: string }>) paths.push(`/runs/${r.id}`, `/runs/${r.id}/history`, `/runs/${r.id}/signoff`);
  }
  for (const p of (((await get('/api/procedures')).procedures ?? []) as Array<{ id: string }>).slice(0, 3)) paths.push(`/procedures/${p.id}`);
  return [...new Set(paths)];
}

describe.each<DemoRole>(['technician', 'lead', 'reviewer', 'owner'])('%s on a 390 px touch screen', (role) => {
  it('no page scrolls sideways', async () => {
    const ctx = await newContext(browser, { width: 390, height: 844, touch: true });
    const page = await ctx.newPage();
    await signInAs(page, role);
    const seen: string[] = [];
    const wide: string[] = [];
    for (const path of await pagesOf(page)) {
      const res = await page.goto(path);
      if (!res || res.status() >= 400) continue; // pages this role may not open
      // Islands render their own markup on hydration: measure after Astro has hydrated them all.
      await page.waitForFunction(() => [...document.querySelectorAll('astro-island')].every((i) => !i.hasAttribute('ssr')));
      await page.evaluate(() => document.fonts.ready.then(() => undefined)); // widths in the shipped fonts
      const { vw, sw, culprit } = await page.evaluate(() => {
        const vw = document.documentElement.clientWidth;
        // The innermost element that sticks out (not inside a box that scrolls itself) names the cause.
        const out = [...document.querySelectorAll('body *')].filter((e) => e.getBoundingClientRect().right > vw + 1 && !e.parentElement?.closest('.overflow-x-auto'));
        const inner = out.filter((e) => !out.some((o) => o !== e && e.contains(o))).slice(0, 2);
        return { vw, sw: document.documentElement.scrollWidth, culprit: inner.map((e) => `<${e.tagName.toLowerCase()} class="${e.className}"> "${(e.textContent ?? '').trim().slice(0, 60)}"`).join('; ') };
      });
      seen.push(path);
      if (sw > vw + 1) wide.push(`${path}: ${sw} px wide in a ${vw} px window, from ${culprit}`);
    }
    expect(seen.length).toBeGreaterThan(8);
    expect(wide).toEqual([]);
    await ctx.close();
  });
});
