/**
 * The procedures desk end to end: technicians see released demo procedures only; a lead filters
 * and sorts the table, starts a new draft from a released revision, releases it with a note,
 * sees revision 2 with its status mark and the compare link, and opens a new procedure.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { APP_URL, hydrated, launch, newContext, signInAs } from './support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
  // The first request to a just-started server compiles its routes; on a busy machine that can
  // outlast a page timeout, so wait for one answer before the tests start their clocks.
  await fetch(`${APP_URL}/sign-in`).then((r) => r.text());
}, 120_000);
afterAll(async () => {
  await browser?.close();
});

const rowKeys = (page: import('playwright-core').Page) => page.locator('[data-testid="procedures-table"] tbody tr').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-procedure-key')));

describe('procedures desk', () => {
  it('a technician sees the released demo procedures, without authoring controls', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, 'technician');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Procedures' }).click();
    await page.waitForURL('**/procedures');
    await hydrated(page);
    // Other browser specs add procedures to the same demo shop; the demo pair is always there,
    // and a technician sees only procedures that have a released revision.
    const keys = await rowKeys(page);
    expect(keys).toEqual(expect.arrayContaining(['assembly-demo-diesel', 'teardown-demo-diesel']));
    const marks = await page.locator('[data-testid="procedures-table"] tbody tr [data-status]').evaluateAll((els) => els.map((e) => e.getAttribute('data-status')));
    expect(marks.length).toBeGreaterThanOrEqual(keys.length);
    expect(marks.filter((m) => m === 'draft')).toEqual([]);
    expect(await page.getByTestId('new-procedure').count()).toBe(0);
    expect(await page.getByTestId('import-procedure').count()).toBe(0);
    const row = page.locator('tr[data-procedure-key="teardown-demo-diesel"]');
    expect(await row.locator('[data-status="released"]').innerText()).toBe('Released · rev 1');
    await row.getByRole('link').first().click();
    await hydrated(page);
    expect(await page.getByTestId('procedure-name').innerText()).toContain('full teardown');
    expect(await page.getByRole('button', { name: /Release|Retire|New draft|Derive/ }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Export JSON' }).count()).toBe(1);
    await ctx.close();
  });

  it('a lead filters and sorts, starts a new draft, releases it as revision 2 and gets a compare link', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, 'lead', '/procedures');
    await hydrated(page);
    await page.getByLabel('Search').fill('assembly-demo');
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="procedures-table"] tbody tr').length === 1);
    expect(await rowKeys(page)).toEqual(['assembly-demo-diesel']);
    expect(new URL(page.url()).searchParams.get('search')).toBe('assembly-demo');
    await page.getByLabel('Search').fill('');
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="procedures-table"] tbody tr').length > 1);
    const names = () => page.locator('[data-testid="procedures-table"] tbody tr td:first-child a').allTextContents();
    const sortButton = page.getByRole('button', { name: /^Procedure/ });
    await sortButton.click();
    await page.waitForFunction(() => document.querySelector('th[aria-sort="ascending"]') !== null);
    const ascending = await names();
    expect(ascending).toEqual([...ascending].sort((a, b) => a.localeCompare(b)));
    await sortButton.click();
    await page.waitForFunction(() => document.querySelector('th[aria-sort="descending"]') !== null);
    expect(await names()).toEqual([...ascending].reverse());

    await page.locator('tr[data-procedure-key="teardown-demo-diesel"]').getByRole('link').first().click();
    await hydrated(page);
    const procedureUrl = page.url();
    await page.getByTestId('new-draft').click();
    await page.waitForURL('**/revisions/*/edit');
    const draftId = new URL(page.url()).pathname.split('/')[2]!;

    await page.goto(procedureUrl);
    await hydrated(page);
    const draftRow = page.locator('tr[data-revision-number="draft"]');
    expect(await draftRow.locator('[data-status="draft"]').innerText()).toBe('Draft');
    expect(await page.getByTestId('open-draft').getAttribute('href')).toBe(`/revisions/${draftId}/edit`);
    await draftRow.getByRole('button', { name: 'Release…' }).click();
    await page.getByLabel('Release note').fill('Second demo release');
    await page.getByRole('button', { name: 'Release', exact: true }).click();
    await page.getByTestId('status').filter({ hasText: 'Revision 2 is released' }).waitFor();
    const rev2 = page.locator('tr[data-revision-number="2"]');
    expect(await rev2.locator('[data-status="released"]').innerText()).toBe('Released');
    expect(await rev2.innerText()).toContain('Second demo release');
    expect(await rev2.innerText()).toContain('Released by Lars Lindqvist');
    const href = await page.getByTestId('compare-link').getAttribute('href');
    const cmp = new URL(href!, 'http://x');
    expect(cmp.pathname).toBe('/revisions/compare');
    expect(cmp.searchParams.get('b')).toBe(draftId);
    expect(cmp.searchParams.get('a')).not.toBe(draftId);
    await ctx.close();
  });

  it('a lead creates a new procedure and lands in its draft; an empty name is refused beside the field', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, 'lead', '/procedures');
    await hydrated(page);
    await page.getByTestId('new-procedure').click();
    await page.getByRole('button', { name: 'Create and open the draft' }).click();
    expect(await page.locator('#np-name-error').innerText()).toBe('Give the procedure a name');
    await page.getByLabel('Name').fill('Oil pump — bench check');
    await page.getByLabel('Kind').selectOption('inspection');
    await page.getByRole('button', { name: 'Create and open the draft' }).click();
    await page.waitForURL('**/revisions/*/edit');
    const res = await ctx.request.get('/api/procedures?search=oil-pump');
    const body = (await res.json()) as { procedures: Array<{ key: string; kind: string; draft: unknown }> };
    expect(body.procedures).toEqual([expect.objectContaining({ key: 'oil-pump-bench-check', kind: 'inspection', draft: expect.anything() })]);
    await ctx.close();
  });
});
