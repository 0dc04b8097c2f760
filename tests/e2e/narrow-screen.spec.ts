/**
 * A phone-sized touch screen (390 × 844 CSS px, a common small phone width): no page a role
 * opens may scroll sideways. Wide tables scroll inside their own box instead; the runner's
 * columns stack. Pages are found the way a member finds them: the nav pages, then every job,
 * run, run history, sign-off page and procedure the member can see.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, newContext, signInAs, type DemoRole } from './support/browser';

let browser: Browser;

/** Unbroken tokens as a shop might paste them: part numbers, links, e-mail addresses. */
const LONG = {
  part: 'PN-' + 'A7Q2'.repeat(16),
  link: 'https://parts.example.test/catalogue/' + 'section-'.repeat(8) + 'item',
  mail: 'machinist.' + 'x'.repeat(40) + '@example.test',
};

/** A job of its own with long tokens everywhere they show, so the check does not rely on other tests' data. */
async function seedLongTokens() {
  const tctx = await newContext(browser);
  const tpage = await tctx.newPage();
  await signInAs(tpage, 'technician');
  const techId = (await (await tctx.request.get('/api/auth/get-session')).json()).user.id as string;
  await tctx.close();
  const ctx = await newContext(browser);
  const page = await ctx.newPage();
  await signInAs(page, 'lead');
  const api = ctx.request;
  const must = async (res: Awaited<ReturnType<typeof api.post>>): Promise<any> => {
    if (!res.ok()) throw new Error(`${res.url()} answered ${res.status()}: ${await res.text()}`);
    return res.json();
  };
  const demoJob = ((await must(await api.get('/api/jobs'))).jobs as Array<{ id: string; code: string }>).find((j) => j.code === 'J-0001')!;
  const demoRun = (await must(await api.get(`/api/jobs/${demoJob.id}`))).runs[0].id as string;
  const revisionId = (await must(await api.get(`/api/runs/${demoRun}`))).run.revisionId as string;
  const job = await must(await api.post('/api/jobs', { data: { unitDescription: `Invented unit ${LONG.part}`, serial: LONG.part.slice(0, 60), customer: LONG.mail, notes: `See ${LONG.link}`, technicianIds: [techId] } }));
  await must(await api.post(`/api/jobs/${job.id}/runs`, { data: { revisionId } }));
  await must(await api.post(`/api/jobs/${job.id}/findings`, { data: { what: `Scoring on ${LONG.part}`, where: LONG.link, severity: 'minor', partsToReplace: [{ part: LONG.part, quantity: 1 }] } }));
  await ctx.close();
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
