/**
 * Issue 5, done when: a technician works a teardown run at the bench — a 10-fastener loosening
 * sequence in 2 passes (part of it offline), an out-of-spec measurement that a lead approves in
 * a second browser, a caution, and a hold point that blocks until a reviewer signs in a third.
 * The run, job and procedure are created through the API as the lead; everything the
 * technician, the lead and the reviewer do happens in the UI.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { hydrated, launch, ok, signedIn as signedInAs } from './support/browser';
import { DEMO_PASSWORD } from '../../src/server/seeders/demo-people';

const EXAMPLE = "Example data — not a maker's specification.";
const FASTENERS = Array.from({ length: 10 }, (_, i) => ({ id: `hb${i + 1}`, label: String(i + 1), x: 100 + (i % 5) * 180, y: i < 5 ? 150 : 400 }));
const STEPS = [
  {
    id: 'seq-head', kind: 'fastener-sequence', title: 'Loosen and remove the head bolts', body: EXAMPLE, direction: 'loosen',
    map: { fasteners: FASTENERS, order: [], orderMethod: 'reverse-centre-out' }, passes: [{ kind: 'loosen', degrees: 90 }, { kind: 'remove' }],
  },
  {
    id: 'm-main', kind: 'measure', title: 'Main bearing clearance, main 1', body: EXAMPLE, unit: 'mm',
    spec: { nominal: 0.05, min: 0.03, max: 0.07, unit: 'mm' }, instrument: { name: 'Bore gauge and micrometer', resolution: 0.001 },
    positions: ['Main 1'], method: { kind: 'clearance' },
  },
  { id: 'c-lift', kind: 'caution', title: 'Crankshaft is heavy', body: "Use a second person or a hoist. Follow the maker's service information.", severity: 'warning', hazards: ['lifting'], mustAcknowledge: true },
  { id: 'h-review', kind: 'hold-point', title: 'Teardown review', body: '', signers: ['reviewer'] },
  { id: 'a-clean', kind: 'action', title: 'Clean the block for the machine shop', body: '' },
];

let browser: Browser;
const contexts: BrowserContext[] = [];
beforeAll(async () => { browser = await launch(); });
afterAll(async () => { for (const c of contexts) await c.close().catch(() => {}); await browser?.close(); });

const signedIn = async (role: 'lead' | 'technician' | 'reviewer') => {
  const member = await signedInAs(browser, role, { height: 1300 });
  contexts.push(member.ctx);
  return member;
};

/** Polls with room for the server round trips and the runner's 3 s catch-up. */
const poll = <T,>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 20_000, interval: 150 });
const text = async (page: Page, testId: string) => (await page.getByTestId(testId).textContent()) ?? '';
const confirmLabel = async (page: Page) => (await page.getByTestId('confirm-fastener').textContent()) ?? '';
/** Waits until the confirm button moves on from the given label (the UI took the confirmation). */
const movedOn = (page: Page, before: string) => poll(() => confirmLabel(page).catch(() => 'gone')).not.toBe(before);

describe('runner', () => {
  it('a technician works a teardown run with an offline stretch, a deviation and a hold point', async () => {
    const lead = await signedIn('lead');
    const tech = await signedIn('technician');
    const reviewer = await signedIn('reviewer');
    const api = lead.ctx.request;

    // The lead prepares a procedure, releases it, opens a job for Tess and starts the run.
    const created = await ok<{ procedure: { id: string }; draft: { id: string; version: number } }>(
      await api.post('/api/procedures', { data: { name: `Head and crank teardown ${Date.now()}`, kind: 'teardown', engineFamily: 'TT-4D (demo)', description: EXAMPLE } }),
      201,
    );
    await ok(await api.put(`/api/revisions/${created.draft.id}/content`, { data: { steps: STEPS, version: created.draft.version } }), 200);
    await ok(await api.post(`/api/revisions/${created.draft.id}/release`, { data: {} }), 200);
    const job = await ok<{ id: string; code: string }>(
      await api.post('/api/jobs', { data: { unitDescription: 'Invented 4-cylinder diesel (demo)', serial: 'TT4D-E2E', customer: 'Runner test', technicianIds: [tech.userId], reviewerId: reviewer.userId } }),
      201,
    );
    const started = await ok<{ run: { id: string } }>(await api.post(`/api/jobs/${job.id}/runs`, { data: { revisionId: created.draft.id } }), 201);
    const runId = started.run.id;

    // Tess finds the job among her jobs and opens the run.
    const page = tech.page;
    await page.goto('/jobs?technician=me');
    await page.locator(`[data-testid="my-jobs"] [data-job-code="${job.code}"]`).getByRole('link', { name: new RegExp(job.code) }).click();
    await page.waitForURL(`**/jobs/${job.id}`);
    await hydrated(page);
    expect(await page.getByTestId('job-status').textContent()).toBe('Teardown');
    // The job page links to its parts pages and label sheet, and per run to its report and history.
    const jobLinks = page.getByTestId('job-links');
    for (const [name, href] of [['Tag board', `/jobs/${job.id}/tags`], ['Findings', `/jobs/${job.id}/findings`], ['Parts to replace', `/jobs/${job.id}/parts`], ['Label sheet (PDF)', `/api/jobs/${job.id}/labels.pdf`]]) {
      expect(await jobLinks.getByRole('link', { name, exact: true }).getAttribute('href'), name).toBe(href);
    }
    const runRow = (p: Page) => p.locator(`[data-testid="job-runs"] [data-run-id="${runId}"]`);
    expect(await runRow(page).getByRole('link', { name: 'Report (PDF)', exact: true }).getAttribute('href')).toBe(`/api/runs/${runId}/report.pdf`);
    expect(await runRow(page).getByRole('link', { name: 'History', exact: true }).getAttribute('href')).toBe(`/runs/${runId}/history`);
    expect(await runRow(page).getByRole('link', { name: 'Sign-off' }).count()).toBe(0);
    await page.locator(`[data-testid="job-runs"] [data-run-id="${runId}"]`).getByRole('link', { name: 'Continue' }).click();
    await page.waitForURL(`**/runs/${runId}`);
    await hydrated(page, '[data-testid="runner"][data-hydrated="true"]');
    expect(await text(page, 'next-expected')).toBe('Next: start the step');
    expect(await page.locator('[data-testid="step-list"] li[data-state="locked"]').count()).toBe(4);

    // Fastener sequence: start, then confirm by tapping the map, by Enter, and by the big button.
    await page.getByTestId('start-step').click();
    await poll(() => text(page, 'next-expected')).toMatch(/^Next: pass 1, fastener \d+$/);
    expect(await text(page, 'pass-target')).toContain('loosen 90° (¼ turn)');
    let before = await confirmLabel(page);
    await page.locator('[data-fastener-state="next"]').click();
    await movedOn(page, before);
    expect(await page.locator('[data-fastener-state="done"]').count()).toBe(1);
    before = await confirmLabel(page);
    await page.keyboard.press('Enter');
    await movedOn(page, before);
    for (let i = 0; i < 5; i++) {
      before = await confirmLabel(page);
      await page.getByTestId('confirm-fastener').click();
      await movedOn(page, before);
    }
    await poll(() => tech.ctx.request.get(`/api/runs/${runId}/events`).then((r) => r.json()).then((b) => b.events.length)).toBe(8);

    // The connection drops: three confirmations wait in the outbox, the banner says so.
    await tech.ctx.setOffline(true);
    await poll(() => page.getByTestId('connection-banner').textContent()).toContain('Offline');
    const offlineLabels: string[] = [];
    for (let i = 0; i < 3; i++) {
      before = await confirmLabel(page);
      offlineLabels.push(before.match(/fastener (\S+) — pass (\d)/)!.slice(1).join('/'));
      await page.getByTestId('confirm-fastener').click();
      await movedOn(page, before);
    }
    await poll(() => page.getByTestId('connection-banner').textContent()).toContain('Offline — 3 events waiting to send');
    // The lead's view still shows the server's state: nothing arrived.
    expect((await (await api.get(`/api/runs/${runId}/events`)).json()).events).toHaveLength(8);

    await tech.ctx.setOffline(false);
    await page.getByTestId('connection-banner').waitFor({ state: 'detached' });
    const log = (await (await api.get(`/api/runs/${runId}/events`)).json()) as { events: Array<{ seq: number; type: string; payload: { pass: number; fastenerId: string }; device: string | null }>; lastSeq: number };
    expect(log.events.map((e) => e.seq)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
    expect(log.events.slice(8).map((e) => e.type)).toEqual(['fastener.confirm', 'fastener.confirm', 'fastener.confirm']);
    const labelOf = new Map(FASTENERS.map((f) => [f.id, f.label]));
    expect(log.events.slice(8).map((e) => `${labelOf.get(e.payload.fastenerId)}/${e.payload.pass}`)).toEqual(offlineLabels);
    expect(log.events[8]!.device).toMatch(/^(Tablet|Phone|Computer) /);

    // Resume anywhere: a reload continues at the exact point.
    const expected = await text(page, 'next-expected');
    await page.reload();
    await hydrated(page, '[data-testid="runner"][data-hydrated="true"]');
    expect(await text(page, 'next-expected')).toBe(expected);

    // Finish both passes (20 actions in all); the last one finishes the step.
    for (let left = 20 - 10; left > 0; left--) {
      before = await confirmLabel(page);
      await page.getByTestId('confirm-fastener').click();
      if (left > 1) await movedOn(page, before);
    }
    await poll(() => page.getByTestId('current-step').getAttribute('data-kind')).toBe('measure');
    expect(await page.locator('[data-step-id="seq-head"][data-state="done"]').count()).toBe(1);

    // Measurement: bore and journal on the pad and the keyboard, live diametral clearance, out of spec.
    await page.getByTestId('start-step').click();
    await page.getByTestId('save-reading').waitFor();
    for (const k of ['6', '0', 'Decimal point', '1']) await page.getByRole('button', { name: k, exact: true }).click();
    expect(await page.getByTestId('reading-draft').inputValue()).toBe('60.1');
    await page.keyboard.press('Enter');
    await poll(() => page.locator('[data-slot="Main 1/bore"]').textContent()).toContain('60.100 mm');
    await page.keyboard.type('59.99');
    await poll(() => page.getByTestId('measure-results').textContent()).toContain('Diametral clearance');
    expect(await page.locator('[data-position="Main 1"]').textContent()).toContain('0.110 mm');
    expect(await page.locator('[data-position="Main 1"] [data-verdict]').getAttribute('data-verdict')).toBe('out');
    await page.keyboard.press('Enter');
    await poll(() => page.locator('[data-slot="Main 1/journal"]').textContent()).toContain('59.990 mm');
    await page.keyboard.press('Enter'); // submit readings
    await page.getByTestId('deviation-form').waitFor();
    await page.getByTestId('request-deviation').click();
    expect(await page.locator('#deviation-error').textContent()).toContain('Give a reason');
    await page.getByLabel('Reason').fill('Bearing shell worn; crank goes to the machine shop for regrind');
    await page.getByTestId('request-deviation').click();
    await poll(() => text(page, 'next-expected')).toBe('Waiting for a lead to approve the deviation');
    expect(await page.getByTestId('approve-deviation').count()).toBe(0);

    // The lead, in a second browser, approves it.
    await lead.page.goto(`/runs/${runId}`);
    await hydrated(lead.page, '[data-testid="runner"][data-hydrated="true"]');
    expect(await lead.page.getByTestId('deviation-waiting').textContent()).toContain('Bearing shell worn');
    await lead.page.getByTestId('approve-deviation').click();
    await poll(() => lead.page.getByTestId('current-step').getAttribute('data-kind')).toBe('caution');

    // Tess's runner picks it up by itself; the caution is acknowledged with A.
    await poll(() => page.getByTestId('current-step').getAttribute('data-kind')).toBe('caution');
    expect(await page.locator('[data-step-id="m-main"][data-state="deviated"]').count()).toBe(1);
    expect(await page.getByTestId('hazard-cautions').textContent()).toContain("maker's service information");
    await page.keyboard.press('a');

    // Hold point: Tess waits; the reviewer signs in a third browser.
    await poll(() => text(page, 'next-expected')).toBe('Waiting for a reviewer to sign the hold point');
    expect(await page.getByTestId('review-hold').count()).toBe(0);
    // The runner sends the reviewer to the sign-off page; the signature needs the meaning and the password.
    await reviewer.page.goto(`/runs/${runId}`);
    await hydrated(reviewer.page, '[data-testid="runner"][data-hydrated="true"]');
    await reviewer.page.getByRole('link', { name: 'Review and sign' }).click();
    await reviewer.page.waitForURL(`**/runs/${runId}/signoff?step=h-review`);
    await hydrated(reviewer.page);
    await reviewer.page.getByLabel('Approved for assembly').check();
    await reviewer.page.getByLabel('Your password').fill(DEMO_PASSWORD);
    await reviewer.page.getByTestId('sign-submit').click();
    await poll(() => reviewer.page.getByTestId('status').textContent()).toMatch(/Signed: Approved for assembly/);
    await poll(() => page.getByTestId('current-step').getAttribute('data-kind')).toBe('action');
    expect(await page.locator('[data-step-id="h-review"][data-state="signed"]').count()).toBe(1);

    await page.getByTestId('start-step').click();
    await page.getByTestId('mark-done').click();
    await page.getByTestId('run-complete').waitFor();
    await poll(() => api.get(`/api/runs/${runId}/events`).then((r) => r.json()).then((b) => b.events.at(-1)?.type)).toBe('step.complete');

    // Once the run is complete the reviewer's job page links to its sign-off; the linked PDFs open.
    await reviewer.page.goto(`/jobs/${job.id}`);
    await hydrated(reviewer.page);
    expect(await runRow(reviewer.page).getByRole('link', { name: 'Sign-off', exact: true }).getAttribute('href')).toBe(`/runs/${runId}/signoff`);
    for (const href of [`/api/runs/${runId}/report.pdf`, `/api/jobs/${job.id}/labels.pdf`]) {
      const pdf = await reviewer.ctx.request.get(href);
      expect(pdf.status(), href).toBe(200);
      expect(pdf.headers()['content-type']).toContain('application/pdf');
    }

    // History: every event in order, under the revision the run was pinned to.
    await page.goto(`/runs/${runId}/history`);
    expect(await page.getByTestId('history-revision').textContent()).toContain('revision 1');
    const rows = page.locator('[data-testid="history-table"] tbody tr');
    const final = (await (await api.get(`/api/runs/${runId}/events`)).json()).events as Array<{ type: string; payload: { meaning?: string }; device: string | null }>;
    expect(await rows.count()).toBe(final.length);
    expect(await rows.nth(final.length - 1).getAttribute('data-type')).toBe('step.complete');
    expect(final.filter((e) => e.type === 'fastener.confirm')).toHaveLength(20);
    expect(final.find((e) => e.type === 'hold.sign')).toMatchObject({ payload: { meaning: 'Approved for assembly' }, device: 'sign-off' });
  });
});
