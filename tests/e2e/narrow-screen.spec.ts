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
beforeAll(async () => { browser = await launch(); });
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
      const { vw, sw } = await page.evaluate(() => ({ vw: document.documentElement.clientWidth, sw: document.documentElement.scrollWidth }));
      seen.push(path);
      if (sw > vw + 1) wide.push(`${path}: ${sw} px wide in a ${vw} px window`);
    }
    expect(seen.length).toBeGreaterThan(8);
    expect(wide).toEqual([]);
    await ctx.close();
  });
});
