/**
 * The reviewer signs a hold point and a run; the lead sends the teardown report to a machine
 * shop; the message is read from the catcher, its PDF parsed, and its link opened without sign-in.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { APP_URL, hydrated, launch, newContext, signInAs } from './support/browser';
import { attachment, linkIn, waitForMail } from './support/inbox';
import { DEMO_PASSWORD } from '../../src/server/seeders/demo-people';

let browser: Browser;
beforeAll(async () => { browser = await launch(); });
afterAll(async () => { await browser?.close(); });

const key = `review-e2e-${randomUUID().slice(0, 6)}`;
const procedureFile = {
  schemaVersion: 1,
  procedure: { key, name: `Browser bottom end ${key}`, kind: 'teardown', engineFamily: 'Invented test engine', description: "Example data — not a maker's specification" },
  revision: {
    note: 'Browser test',
    steps: [
      { id: 's-bearing', kind: 'measure', title: 'Main bearing clearance', unit: 'mm', spec: { nominal: 0.05, min: 0.03, max: 0.07, unit: 'mm' }, instrument: { name: 'Bore gauge', resolution: 0.001 }, positions: ['M1'], method: { kind: 'clearance' } },
      { id: 's-tag', kind: 'tag-part', title: 'Tag the main caps', partName: 'Main bearing cap', positions: ['M1'], bin: 'B-9' },
      { id: 's-hold', kind: 'hold-point', title: 'Bottom end review' },
      { id: 's-last', kind: 'action', title: 'Cover the block' },
    ],
  },
};

async function apiCall(page: Page, method: 'GET' | 'POST', path: string, body?: unknown) {
  const res = method === 'GET' ? await page.request.get(path) : await page.request.post(path, { data: body ?? {}, headers: { origin: APP_URL } });
  const json = await res.json().catch(() => null);
  if (!res.ok()) throw new Error(`${method} ${path} → ${res.status()} ${JSON.stringify(json)}`);
  return json;
}

async function postEvents(page: Page, runId: string, events: Array<Record<string, unknown>>) {
  let { lastSeq } = await apiCall(page, 'GET', `/api/runs/${runId}/events`);
  for (const event of events) ({ lastSeq } = await apiCall(page, 'POST', `/api/runs/${runId}/events`, { event, idempotencyKey: randomUUID(), expectedSeq: lastSeq }));
}

async function pdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({ data: bytes }).promise;
  let text = '';
  for (let i = 1; i <= doc.numPages; i++) text += `${(await (await doc.getPage(i)).getTextContent()).items.map((it) => ('str' in it ? it.str : '')).join(' ')}\n`;
  return text.replace(/\s+/g, ' ');
}

describe('review and sign-off', () => {
  it('reviewer signs a hold point and the run; the lead sends the teardown report; the link opens without sign-in', async () => {
    // Set-up through the API as the lead: a released procedure, a job, a run worked up to the hold point.
    const leadCtx = await newContext(browser);
    const lead = await leadCtx.newPage();
    await signInAs(lead, 'lead');
    const imported = await apiCall(lead, 'POST', '/api/procedures/import', procedureFile);
    await apiCall(lead, 'POST', `/api/revisions/${imported.draft.id}/release`, {});
    const job = await apiCall(lead, 'POST', '/api/jobs', { unitDescription: `Invented test diesel ${key}`, serial: 'TT4D-E2E' });
    const started = await apiCall(lead, 'POST', `/api/jobs/${job.id}/runs`, { revisionId: imported.draft.id });
    const runId: string = started.run.id;
    await postEvents(lead, runId, [
      { type: 'step.start', stepId: 's-bearing' },
      { type: 'reading.enter', stepId: 's-bearing', key: 'M1/bore', value: 60.046 },
      { type: 'reading.enter', stepId: 's-bearing', key: 'M1/journal', value: 60.0 },
      { type: 'measure.submit', stepId: 's-bearing' },
      { type: 'step.start', stepId: 's-tag' },
      { type: 'step.complete', stepId: 's-tag', tags: [{ position: 'M1', disposition: 'machine-shop', bin: 'B-9' }] },
    ]);

    // The reviewer finds the hold point in the queue (with a count in the navigation) and signs it.
    const revCtx = await newContext(browser);
    const rev = await revCtx.newPage();
    await signInAs(rev, 'reviewer', '/review');
    await hydrated(rev);
    await expect.poll(async () => rev.getByTestId('review-badge').textContent()).toMatch(/\d+ waiting/);
    const holdRow = rev.getByTestId('review-row').filter({ hasText: job.code }).filter({ hasText: 'Hold point' });
    await holdRow.getByRole('link', { name: 'Review and sign' }).click();
    await rev.waitForURL(/\/signoff\?step=s-hold/);
    await hydrated(rev);
    await expect.poll(() => rev.getByTestId('covered-readings').textContent()).toContain('M1');
    // A wrong password is refused in the status region, nothing is signed.
    await rev.getByLabel('Approved for assembly').check();
    await rev.getByLabel('Your password').fill('not-the-password');
    await rev.getByTestId('sign-submit').click();
    await expect.poll(() => rev.getByTestId('status').textContent()).toMatch(/password is not right/);
    await rev.getByLabel('Your password').fill(DEMO_PASSWORD);
    await rev.getByTestId('sign-submit').click();
    await expect.poll(() => rev.getByTestId('status').textContent()).toMatch(/Signed: Approved for assembly/);
    await expect.poll(() => rev.getByTestId('signature').count()).toBe(1);
    expect(await rev.getByTestId('sig-match').textContent()).toContain('Record unchanged');

    // The lead finishes the run; the reviewer signs the whole run.
    await postEvents(lead, runId, [{ type: 'step.start', stepId: 's-last' }, { type: 'step.complete', stepId: 's-last' }]);
    await rev.goto(`/runs/${runId}/signoff`);
    await hydrated(rev);
    await rev.getByLabel('Approved for release to customer').check();
    await rev.getByLabel('Your password').fill(DEMO_PASSWORD);
    await rev.getByTestId('sign-submit').click();
    await expect.poll(() => rev.getByTestId('status').textContent()).toMatch(/Signed: Approved for release to customer/);

    // The lead sends the teardown report from the job page to a machine shop address.
    const to = `quotes.${key}@machine-shop.test`;
    await lead.goto(`/jobs/${job.id}`);
    await hydrated(lead, '[data-testid="job-reports"][data-hydrated="true"]');
    await lead.getByLabel('Send to (e-mail)').fill(to);
    await lead.getByLabel('Message').fill('Please check the main bores.');
    await lead.getByTestId('send-report').click();
    await expect.poll(() => lead.getByTestId('sent-message').first().getAttribute('data-status'), { timeout: 30_000 }).toBe('sent');

    const mail = await waitForMail(to, /Teardown report/);
    expect(mail.text).toContain('Please check the main bores.');
    const pdfAtt = mail.attachments?.find((x) => x.contentType === 'application/pdf');
    expect(pdfAtt).toBeTruthy();
    const text = await pdfText(new Uint8Array(await attachment(mail, pdfAtt!.generatedFileName)));
    for (const s of ['Teardown report', job.code, 'Main bearing clearance', 'M1', 'Main bearing cap', 'machine-shop', 'Approved for assembly', 'Approved for release to customer', 'Example data']) expect(text).toContain(s);

    // The link opens in a fresh context without sign-in, and shows only this report.
    const url = linkIn(mail, `${APP_URL}/share/`);
    const anon = await newContext(browser);
    const guest = await anon.newPage();
    await guest.goto(url);
    await guest.getByTestId('share-report').waitFor();
    expect(await guest.getByTestId('share-report').textContent()).toContain('Main bearing clearance');
    expect(await guest.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    const pdf = await guest.request.get(`${url.replace('/share/', '/api/share/')}/report.pdf`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    const other = await guest.goto(`/jobs/${job.id}`);
    expect(new URL(guest.url()).pathname).toBe('/sign-in');
    expect(other?.ok()).toBe(true);
    const missing = await guest.goto(`${APP_URL}/share/${'x'.repeat(43)}`);
    expect(missing?.status()).toBe(404);

    // The shop sees the views.
    const links = await apiCall(lead, 'GET', `/api/jobs/${job.id}/share-links`);
    expect(links.links[0].views.length).toBeGreaterThanOrEqual(2);
    await Promise.all([leadCtx.close(), revCtx.close(), anon.close()]);
  });
});
