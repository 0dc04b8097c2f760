/**
 * Issue 6, done when: a technician photographs the parts of a tag-part step through the
 * uploader, sees the thumbnails, sets bins and dispositions, the label sheet has one QR per
 * tag leading to the tag's page, a finding is recorded from the runner, and the parts list
 * and its CSV show what the work calls for. Setup goes through the API as the lead.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import { hydrated, launch, newContext, ok, signedIn as signedInAs } from './support/browser';
import { expectedModules, readLabels } from '../support/labels-pdf';

const EXAMPLE = "Example data — not a maker's specification.";
const BOLTS = Array.from({ length: 4 }, (_, i) => ({ id: `rb${i + 1}`, label: String(i + 1), x: 100 + i * 200, y: 200 }));
const CAPS = ['Rod 1', 'Rod 2', 'Rod 3'];
const STEPS = [
  { id: 'seq-rod', kind: 'fastener-sequence', title: 'Remove the rod cap bolts', body: EXAMPLE, direction: 'loosen', torqueToYield: true, fastenerPart: 'Rod cap bolt (demo)', map: { fasteners: BOLTS, order: BOLTS.map((b) => b.id), orderMethod: 'manual' }, passes: [{ kind: 'remove' }] },
  { id: 'tag-rods', kind: 'tag-part', title: 'Tag the rod caps', body: EXAMPLE, partName: 'Rod cap', positions: CAPS, bin: 'R-1', defaultDisposition: 'reuse' },
  { id: 'rep-rods', kind: 'replace', title: 'Renew the rod bearings', body: EXAMPLE, parts: [{ part: 'Rod bearing shell (demo)', quantity: 6, note: '' }] },
];

let browser: Browser;
const contexts: BrowserContext[] = [];
beforeAll(async () => { browser = await launch(); });
afterAll(async () => { for (const c of contexts) await c.close().catch(() => {}); await browser?.close(); });

const signedIn = async (role: 'lead' | 'technician') => {
  const member = await signedInAs(browser, role, { height: 1400 });
  contexts.push(member.ctx);
  return member;
};
const poll = <T,>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 20_000, interval: 150 });
/** Thumbnails that have actually loaded (the redirect to the store worked). */
const loadedThumbs = (page: Page, sel: string) => page.locator(sel).evaluateAll((imgs) => imgs.filter((i) => i instanceof HTMLImageElement && i.complete && i.naturalWidth > 0).length);

describe('removed parts', () => {
  it('photos, tags and bins, QR labels, a finding and the parts list', async () => {
    const lead = await signedIn('lead');
    const tech = await signedIn('technician');
    const api = lead.ctx.request;
    const created = await ok<{ draft: { id: string; version: number } }>(await api.post('/api/procedures', { data: { name: `Rod cap teardown ${Date.now()}`, kind: 'teardown', engineFamily: 'TT-4D (demo)', description: EXAMPLE } }), 201);
    await ok(await api.put(`/api/revisions/${created.draft.id}/content`, { data: { steps: STEPS, version: created.draft.version } }), 200);
    await ok(await api.post(`/api/revisions/${created.draft.id}/release`, { data: {} }), 200);
    const job = await ok<{ id: string; code: string }>(await api.post('/api/jobs', { data: { unitDescription: 'Invented 4-cylinder diesel (demo)', customer: 'Parts test', technicianIds: [tech.userId] } }), 201);
    const { run } = await ok<{ run: { id: string } }>(await tech.ctx.request.post(`/api/jobs/${job.id}/runs`, { data: { revisionId: created.draft.id } }), 201);
    // The bolt sequence is not what this test is about: Tess records it through the API.
    let seq = 0;
    for (const event of [{ type: 'step.start', stepId: 'seq-rod' }, ...BOLTS.map((b) => ({ type: 'fastener.confirm', stepId: 'seq-rod', pass: 1, fastenerId: b.id }))]) {
      seq = (await ok<{ lastSeq: number }>(await tech.ctx.request.post(`/api/runs/${run.id}/events`, { data: { event, idempotencyKey: crypto.randomUUID(), expectedSeq: seq } }), 201)).lastSeq;
    }

    // At the bench: the tag-part step, its limits shown before any upload.
    const page = tech.page;
    await page.goto(`/runs/${run.id}`);
    await hydrated(page, '[data-testid="runner"][data-hydrated="true"]');
    await page.locator('[data-testid="current-step"][data-step-id="tag-rods"]').waitFor();
    await page.getByTestId('start-step').click();
    await page.getByTestId('mark-done').waitFor();
    const uploader = page.locator('[data-testid="photo-uploader"][data-hydrated="true"]');
    await uploader.waitFor();
    await expect(uploader.getByTestId('upload-limits').textContent()).resolves.toMatch(/JPEG, PNG, WebP, HEIC.*20 MB.*at most 12/);

    const jpeg = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 180, g: 110, b: 40 } } }).jpeg().toBuffer();
    const png = await sharp({ create: { width: 300, height: 300, channels: 3, background: { r: 40, g: 110, b: 180 } } }).png().toBuffer();
    // A PDF is refused by the dashboard before it is sent, with the reason.
    await uploader.locator('input[type="file"]:not([webkitdirectory])').first().setInputFiles({ name: 'notes.pdf', mimeType: 'application/pdf', buffer: Buffer.from('%PDF-1.4 not a photo') });
    await poll(() => uploader.getByTestId('status').textContent().catch(() => '')).toMatch(/notes\.pdf was not added/);
    await uploader.locator('input[type="file"]:not([webkitdirectory])').first().setInputFiles([
      { name: 'rod-caps-1.jpg', mimeType: 'image/jpeg', buffer: jpeg },
      { name: 'rod-caps-2.png', mimeType: 'image/png', buffer: png },
    ]);
    await poll(() => loadedThumbs(page, '[data-testid="photo-uploader"] img[data-testid="photo-thumb"]')).toBe(2);
    await expect(uploader.locator('h3').textContent()).resolves.toContain('(2 of 12)');

    // Bins and dispositions, then done.
    await page.getByLabel('Disposition of Rod 2').selectOption('replace');
    await page.getByLabel('Bin for Rod 3').fill('R-2');
    await page.getByLabel('Disposition of Rod 3').selectOption('machine-shop');
    await page.getByTestId('mark-done').click();
    await page.locator('[data-testid="current-step"][data-step-id="rep-rods"]').waitFor();

    // A finding from the runner, on the step now in front of Tess.
    await page.getByTestId('record-finding').click();
    const form = page.getByTestId('finding-form');
    await form.getByRole('button', { name: 'Save finding' }).click();
    await expect(form.locator('.tt-field-error').first().textContent()).resolves.toBe('Say what you found');
    await form.getByLabel('What did you find?').fill('Scoring on the crank pin, "deep"');
    await form.getByLabel('Where?').fill('Rod 2 journal');
    await form.getByLabel('Major — fix before assembly').check();
    await form.getByLabel('Send to the machine shop').check();
    await form.getByRole('button', { name: '+ Add a part' }).click();
    await form.getByLabel('Part 1', { exact: true }).fill('Crank pin sleeve, oversize');
    await form.getByLabel('Quantity of part 1', { exact: true }).fill('1');
    await form.getByRole('button', { name: 'Save finding' }).click();
    await page.getByTestId('finding-saved').waitFor();

    // The tag board: three tags, the step's photos, a bin changed on the board.
    await page.goto(`/jobs/${job.id}/tags`);
    await hydrated(page, '[data-testid="tag-board"]');
    const cards = page.getByTestId('tag-card');
    await poll(() => cards.count()).toBe(3);
    const codes = await cards.evaluateAll((els) => els.map((e) => [e.getAttribute('data-position'), e.getAttribute('data-tag-code'), e.querySelector('[data-disposition]')?.textContent]));
    expect(codes).toEqual([
      ['Rod 1', `${job.code}-ROD-CAP-ROD-1`, '◯Reuse'],
      ['Rod 2', `${job.code}-ROD-CAP-ROD-2`, '⟳Replace'],
      ['Rod 3', `${job.code}-ROD-CAP-ROD-3`, '◆Machine shop'],
    ]);
    await poll(() => loadedThumbs(page, 'img[data-testid="board-thumb"]')).toBe(6);
    await page.getByLabel(`Bin of ${job.code}-ROD-CAP-ROD-1`).fill('R-9');
    await page.locator(`[data-tag-code="${job.code}-ROD-CAP-ROD-1"]`).getByRole('button', { name: 'Set bin' }).click();
    await poll(() => page.locator(`[data-tag-code="${job.code}-ROD-CAP-ROD-1"] [data-testid="tag-bin"]`).textContent()).toBe('R-9');
    await page.getByLabel('Show bin').selectOption('R-1');
    await poll(() => cards.count()).toBe(1);

    // The label sheet: one QR per tag, each the address of the tag's page.
    const tags = (await ok<{ tags: Array<{ id: string; code: string }> }>(await tech.ctx.request.get(`/api/jobs/${job.id}/tags`), 200)).tags;
    const pdf = await tech.ctx.request.get(await page.getByTestId('labels-link').getAttribute('href') ?? '');
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    const sheet = await readLabels(new Uint8Array(await pdf.body()));
    expect(sheet.qrs).toHaveLength(3);
    const publicUrl = await page.evaluate(() => location.origin);
    tags.forEach((t, i) => {
      expect(sheet.qrs[i]).toEqual(expectedModules(`${publicUrl}/tags/${t.id}`));
      expect(sheet.texts[0]).toContain(t.code);
    });

    // A scanned label leads to the tag page (sign-in required), with the history of the bin.
    await page.goto(`/tags/${tags[0]!.id}`);
    await hydrated(page, '[data-testid="tag-detail"]');
    await expect(page.getByTestId('tag-code').textContent()).resolves.toBe(tags[0]!.code);
    await expect(page.getByTestId('tag-history').textContent()).resolves.toMatch(/Bin: R-1 → R-9/);
    const anon = await newContext(browser);
    contexts.push(anon);
    const anonPage = await anon.newPage();
    await anonPage.goto(`/tags/${tags[0]!.id}`);
    expect(new URL(anonPage.url()).pathname).toBe('/sign-in');

    // Findings page lists it.
    await page.goto(`/jobs/${job.id}/findings`);
    await expect(page.getByTestId('finding').first().textContent()).resolves.toMatch(/Major.*To the machine shop.*Scoring on the crank pin/);

    // Parts to replace, on the page and in the CSV.
    await page.goto(`/jobs/${job.id}/parts`);
    await hydrated(page, '[data-testid="parts-list"]');
    const rows = await page.getByTestId('parts-row').evaluateAll((els) => els.map((e) => [e.getAttribute('data-part'), e.querySelector('[data-testid="parts-quantity"]')?.textContent]));
    expect(rows).toEqual([
      ['Crank pin sleeve, oversize', '1'],
      ['Rod bearing shell (demo)', '6'],
      ['Rod cap', '1'],
      ['Rod cap bolt (demo)', '4'],
    ]);
    const csv = (await (await tech.ctx.request.get(`/api/jobs/${job.id}/parts.csv`)).text()).replace(/^\uFEFF/, '').split('\r\n');
    expect(csv).toEqual([
      'Part,Quantity,Computed,Reasons',
      '"Crank pin sleeve, oversize",1,1,"Finding: Scoring on the crank pin, ""deep"""',
      'Rod bearing shell (demo),6,6,Replace step — Renew the rod bearings',
      `Rod cap,1,1,Tag ${job.code}-ROD-CAP-ROD-2 (Rod 2) set to replace`,
      'Rod cap bolt (demo),4,4,"Torque-to-yield: 4 fasteners, never reused — Remove the rod cap bolts"',
      '',
    ]);

    // The lead sets a quantity by hand.
    await lead.page.goto(`/jobs/${job.id}/parts`);
    await hydrated(lead.page, '[data-testid="parts-list"]');
    await lead.page.getByLabel('Quantity of Rod bearing shell (demo)').fill('8');
    await lead.page.locator('[data-part="Rod bearing shell (demo)"]').getByRole('button', { name: 'Set' }).click();
    await poll(() => lead.page.locator('[data-part="Rod bearing shell (demo)"]').textContent()).toMatch(/Set by hand \(computed 6\)/);
  });
});
