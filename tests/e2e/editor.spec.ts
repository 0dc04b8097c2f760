/**
 * The procedure editor end to end: a lead builds a procedure with every step kind, reorders by
 * mouse and keyboard (and cancels one keyboard move), lays out a 10-fastener map from a preset
 * and orders it, autosaves, releases, starts a new draft, changes a step, compares the two
 * revisions and derives the assembly draft. A technician never reaches the editor.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { APP_URL, hydrated, launch, newContext, signInAs } from './support/browser';
import { rowsLayout } from '../../src/domain/fastener-layouts';
import { centreOutOrder, looseningOrder } from '../../src/domain/fastener-order';
import type { Step } from '../../src/domain/procedure/schema';

type Revision = { id: string; procedureId: string; status: string; version: number; number: number | null; content: { steps: Step[] } };

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const KIND_TITLES: Array<[string, string]> = [
  ['Action', 'New action'],
  ['Fastener sequence', 'New fastener sequence'],
  ['Torque', 'New torque'],
  ['Measure', 'New measurement'],
  ['Tag part', 'Tag removed part'],
  ['Inspect', 'New inspection'],
  ['Caution', 'New caution'],
  ['Hold point', 'New hold point'],
  ['Replace parts', 'Parts to replace'],
];

/** Waits for a condition (the server shares two busy cores with other test runs). */
const poll = <T>(fn: () => Promise<T> | T) => expect.poll(fn, { timeout: 20_000, interval: 100 });

const titles = (page: Page) => page.getByTestId('step-title').allTextContents();
const liveRegion = (page: Page) => page.locator('[id^="DndLiveRegion"]');

async function getRevision(ctx: BrowserContext, id: string): Promise<Revision> {
  const res = await ctx.request.get(`/api/revisions/${id}`);
  expect(res.status()).toBe(200);
  return (await res.json()) as Revision;
}

/** Waits until the editor says "Saved" and the stored draft satisfies `check`. */
async function waitSaved(page: Page, ctx: BrowserContext, id: string, check: (r: Revision) => boolean) {
  await expect
    .poll(async () => {
      if ((await page.getByTestId('save-state').getAttribute('data-state')) !== 'saved') return false;
      return check(await getRevision(ctx, id));
    }, { timeout: 20_000 })
    .toBe(true);
  expect(await page.getByTestId('save-text').textContent()).toBe('Saved');
}

async function selectStep(page: Page, title: string) {
  await page.getByTestId('step-select').filter({ hasText: title }).click();
  await poll(() => page.getByTestId('step-form').getAttribute('aria-label')).toBe(`Step: ${title}`);
}

async function svgOrder(page: Page, ids: string[]) {
  return Promise.all(ids.map((id) => page.getByTestId(`order-${id}`).textContent()));
}

describe('procedure editor', () => {
  it('a lead builds, reorders, saves, releases, redrafts, compares and derives', async () => {
    const ctx = await newContext(browser, { width: 1400, height: 1000 });
    const page = await ctx.newPage();
    await signInAs(page, 'lead');

    // A new teardown procedure (empty draft) through the API, as the procedures page does.
    const created = await page.evaluate(async () => {
      const r = await fetch('/api/procedures', {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ name: `Editor test teardown ${Date.now()}`, kind: 'teardown', engineFamily: 'TT-4D (example)', description: 'Example data — not a maker\'s specification.' }),
      });
      return { status: r.status, body: (await r.json()) as { procedure: { id: string }; draft: { id: string } } };
    });
    expect(created.status).toBe(201);
    const draftId = created.body.draft.id;

    await page.goto(`/revisions/${draftId}/edit`);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    expect(await page.getByTestId('save-text').textContent()).toBe('Saved');

    // Every step kind from the add-step menu; each goes after the selected (newest) one.
    for (const [kind] of KIND_TITLES) {
      await page.getByRole('button', { name: '+ Add step' }).click();
      await page.getByRole('menuitem', { name: kind, exact: true }).click();
    }
    await poll(() => titles(page)).toEqual(KIND_TITLES.map(([, t]) => t));

    // Reorder by mouse: drag "New action" onto "New torque".
    const handle = page.getByRole('button', { name: /^Move step 1: New action$/ });
    const target = page.getByTestId('step-item').filter({ hasText: 'New torque' });
    const from = (await handle.boundingBox())!;
    const to = (await target.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2 + 12, { steps: 4 });
    await page.mouse.move(from.x + from.width / 2, to.y + to.height / 2 + 4, { steps: 12 });
    await poll(() => liveRegion(page).textContent()).toContain('is over position 3 of 9');
    await page.mouse.up();
    await poll(() => titles(page)).toEqual(['New fastener sequence', 'New torque', 'New action', 'New measurement', 'Tag removed part', 'New inspection', 'New caution', 'New hold point', 'Parts to replace']);

    // Reorder by keyboard: Space picks up, ArrowDown moves, Space drops.
    const measureHandle = page.getByRole('button', { name: /^Move step 4: New measurement$/ });
    await measureHandle.focus();
    await page.keyboard.press('Space');
    await poll(() => measureHandle.getAttribute('aria-pressed')).toBe('true');
    await poll(() => liveRegion(page).textContent()).toContain('Picked up step "New measurement", position 4 of 9');
    await page.keyboard.press('ArrowDown');
    await poll(() => liveRegion(page).textContent()).toContain('is over position 5 of 9');
    await page.keyboard.press('Space');
    await poll(() => liveRegion(page).textContent()).toContain('was dropped at position 5 of 9');
    const afterKeyboard = ['New fastener sequence', 'New torque', 'New action', 'Tag removed part', 'New measurement', 'New inspection', 'New caution', 'New hold point', 'Parts to replace'];
    await poll(() => titles(page)).toEqual(afterKeyboard);

    // A keyboard move cancelled with Escape changes nothing.
    await page.getByRole('button', { name: /^Move step 7: New caution$/ }).focus();
    await page.keyboard.press('Space');
    await poll(() => liveRegion(page).textContent()).toContain('Picked up step "New caution"');
    await page.keyboard.press('ArrowUp');
    await poll(() => liveRegion(page).textContent()).toContain('is over position 6 of 9');
    await page.keyboard.press('Escape');
    await poll(() => liveRegion(page).textContent()).toContain('was cancelled');
    expect(await titles(page)).toEqual(afterKeyboard);

    // A field that fails the schema shows its message beside it, and saving waits for it.
    await selectStep(page, 'New measurement');
    const title = page.getByLabel('Title', { exact: true });
    await title.fill('');
    await poll(() => page.getByTestId('error-title').textContent()).toContain('Required');
    await poll(() => page.getByTestId('save-state').getAttribute('data-state')).toBe('blocked');
    expect(await page.getByTestId('save-text').textContent()).toMatch(/^Not saved — /);
    await title.fill('Main bearing bore');
    await page.getByLabel('Instructions').fill('Measure at **both** planes.\n\n*Example data — not a maker\'s specification.*');
    await poll(() => page.getByTestId('body-preview').innerHTML()).toContain('<strong>both</strong>');

    // The fastener map: loosen, a 2 × 5 layout from the preset, ordered by the tools.
    await selectStep(page, 'New fastener sequence');
    await page.getByLabel('Direction').selectOption('loosen');
    await page.getByLabel('Layout', { exact: true }).selectOption('rows');
    await page.getByLabel('N (per row)').fill('5');
    await page.getByRole('button', { name: 'Place layout' }).click();
    await poll(() => page.getByTestId('fastener-svg').locator('g[role="button"]').count()).toBe(10);
    const fasteners = rowsLayout(5, 2);
    const ids = fasteners.map((f) => f.id);
    const expectNumbers = (order: string[]) => ids.map((id) => String(order.indexOf(id) + 1));

    await page.getByRole('button', { name: 'Centre-out', exact: true }).click();
    await poll(() => svgOrder(page, ids)).toEqual(expectNumbers(centreOutOrder(fasteners)));
    await page.getByRole('button', { name: 'Reverse (loosening)' }).click();
    const loosening = looseningOrder(fasteners);
    await poll(() => svgOrder(page, ids)).toEqual(expectNumbers(loosening));
    expect(await page.getByTestId('order-method').textContent()).toBe('Reverse (loosening)');

    // Passes: loosen a quarter turn, then remove; the plan lists them in order.
    await page.getByRole('button', { name: '+ Loosen by angle' }).click();
    await page.getByRole('button', { name: '+ Remove', exact: true }).click();
    await page.getByRole('button', { name: 'Remove pass 1' }).click();
    await poll(() => page.getByTestId('pass-plan').textContent()).toContain('Pass 1 of 2: loosen 90° (¼ turn)');
    expect(await page.getByTestId('pass-plan').textContent()).toContain('Pass 2 of 2: remove');

    await waitSaved(page, ctx, draftId, (r) => {
      const seq = r.content.steps.find((s) => s.kind === 'fastener-sequence');
      return (
        r.content.steps.length === 9 &&
        r.content.steps[4]?.title === 'Main bearing bore' &&
        seq?.kind === 'fastener-sequence' && seq.direction === 'loosen' && seq.passes.length === 2 &&
        JSON.stringify(seq.map.order) === JSON.stringify(loosening)
      );
    });
    const saved = await getRevision(ctx, draftId);
    expect(saved.content.steps.map((s) => s.kind)).toEqual(['fastener-sequence', 'torque', 'action', 'tag-part', 'measure', 'inspect', 'caution', 'hold-point', 'replace']);

    // Release from the editor; it reopens read-only.
    await page.getByRole('button', { name: 'Release this draft…' }).click();
    await page.getByRole('button', { name: 'Release now' }).click();
    await page.waitForURL(/released=1/);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    expect(await page.getByTestId('revision-status').textContent()).toContain('Released');
    expect(await page.getByTestId('read-only-banner').isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: '+ Add step' }).count()).toBe(0);
    const released = await getRevision(ctx, draftId);
    expect(released.status).toBe('released');
    expect(released.number).toBe(1);

    // A new draft from it; change the torque target (shown converted live).
    await page.getByRole('button', { name: 'Start a new draft' }).click();
    await page.waitForURL((u) => /\/revisions\/[^/]+\/edit$/.test(u.pathname) && !u.pathname.includes(draftId));
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    const draft2 = new URL(page.url()).pathname.split('/')[2]!;
    await selectStep(page, 'New torque');
    await page.getByLabel('Torque target').fill('45');
    await poll(() => page.getByTestId('converted-target').textContent()).toBe('≈ 33.2 ft·lbf');
    await waitSaved(page, ctx, draft2, (r) => r.content.steps.some((s) => s.kind === 'torque' && s.target.value === 45));

    // Compare revision 1 with the new draft: the changed field, before → after.
    await page.goto(`/revisions/compare?a=${draftId}&b=${draft2}`);
    const changed = page.getByTestId('step-change').filter({ hasText: 'New torque' });
    expect(await changed.getAttribute('data-change')).toBe('changed');
    expect(await changed.getByTestId('change-word').textContent()).toBe('Changed');
    const row = changed.locator('[data-testid="field-change"][data-path="target.value"]');
    expect(await row.textContent()).toMatch(/1\s*→\s*45/);
    expect(await page.getByTestId('step-change').count()).toBe(1);
    expect(await page.getByLabel('From (older)').inputValue()).toBe(draftId);
    expect(await page.getByLabel('To (newer)').inputValue()).toBe(draft2);

    // Derive the assembly from revision 1: its fastener sequence now tightens, centre-out.
    await page.goto(`/revisions/${draftId}/edit`);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    await page.getByRole('button', { name: 'Derive assembly draft' }).click();
    await page.waitForURL(/derived=1/);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    const assemblyId = new URL(page.url()).pathname.split('/')[2]!;
    const assembly = await getRevision(ctx, assemblyId);
    const firstSeq = assembly.content.steps.find((s) => s.kind === 'fastener-sequence');
    expect(firstSeq?.kind === 'fastener-sequence' && firstSeq.direction).toBe('tighten');
    expect(firstSeq?.kind === 'fastener-sequence' && firstSeq.map.order).toEqual(centreOutOrder(fasteners));
    await selectStep(page, firstSeq!.title);
    expect(await page.getByLabel('Direction').inputValue()).toBe('tighten');
    await poll(() => svgOrder(page, ids)).toEqual(expectNumbers(centreOutOrder(fasteners)));

    // A technician gets the refusal page, and the API refuses the save.
    const techCtx = await newContext(browser);
    const tech = await techCtx.newPage();
    await signInAs(tech, 'technician');
    const res = await tech.goto(`/revisions/${draft2}/edit`);
    expect(res?.status()).toBe(403);
    expect(await tech.getByTestId('editor-refused').isVisible()).toBe(true);
    expect(await tech.getByTestId('procedure-editor').count()).toBe(0);
    const put = await techCtx.request.put(`/api/revisions/${draft2}/content`, { data: { steps: [], version: 2 }, headers: { origin: APP_URL } });
    expect(put.status()).toBe(403);
    expect((await put.json()).error.code).toBe('forbidden');
    await techCtx.close();
    await ctx.close();
  });

  it('desk shortcuts, sections, undo, and a stale save that is never silently overwritten', async () => {
    const ctx = await newContext(browser, { width: 1400, height: 1000 });
    const page = await ctx.newPage();
    await signInAs(page, 'lead');
    const draftId = await page.evaluate(async () => {
      const r = await fetch('/api/procedures', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: `Shortcut test ${Date.now()}`, kind: 'inspection', engineFamily: '', description: '' }) });
      return ((await r.json()) as { draft: { id: string } }).draft.id;
    });
    await page.goto(`/revisions/${draftId}/edit`);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');

    // N opens the kinds; Enter takes the focused one, arrows move through them.
    await page.locator('h1').click();
    await page.keyboard.press('n');
    await poll(() => page.getByRole('menu', { name: 'Kind of step' }).isVisible()).toBe(true);
    await page.keyboard.press('Enter');
    await page.keyboard.press('n');
    await page.getByRole('menuitem', { name: 'Action', exact: true }).waitFor();
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await poll(() => titles(page)).toEqual(['New action', 'New torque']);

    // Ctrl+D duplicates the selected step, Alt+↓ moves it, Delete asks first.
    await page.getByTestId('step-select').filter({ hasText: 'New action' }).click();
    await page.keyboard.press('Control+d');
    await poll(() => titles(page)).toEqual(['New action', 'New action', 'New torque']);
    await page.keyboard.press('Alt+ArrowDown');
    await poll(() => titles(page)).toEqual(['New action', 'New torque', 'New action']);
    expect(await page.getByTestId('step-select').nth(2).getAttribute('aria-current')).toBe('true');
    await page.keyboard.press('Delete');
    await page.getByRole('button', { name: 'Delete step' }).click();
    await poll(() => titles(page)).toEqual(['New action', 'New torque']);
    await page.keyboard.press('Control+z');
    await poll(() => titles(page)).toEqual(['New action', 'New torque', 'New action']);
    await page.getByRole('button', { name: '↶ Undo' }).click();
    await poll(() => titles(page)).toEqual(['New action', 'New action', 'New torque']);

    // A section typed in the form becomes a heading in the list.
    await page.getByTestId('step-select').first().click();
    await page.getByLabel('Section').fill('Cylinder head');
    await poll(() => page.getByTestId('section-heading').allTextContents()).toEqual(['§ Cylinder head', '§ No section']);
    await waitSaved(page, ctx, draftId, (r) => r.content.steps.length === 3 && r.content.steps[0]?.section === 'Cylinder head');

    // Someone else saves the same draft; this page's next save is refused and offers a reload.
    const other = await ctx.newPage();
    await other.goto(`/revisions/${draftId}/edit`);
    await hydrated(other, '[data-testid="procedure-editor"][data-hydrated="true"]');
    await selectStep(other, 'New torque');
    await other.getByLabel('Title', { exact: true }).fill('Flywheel bolts');
    await waitSaved(other, ctx, draftId, (r) => r.content.steps.some((s) => s.title === 'Flywheel bolts'));
    await other.close();

    await selectStep(page, 'New torque');
    await page.getByLabel('Title', { exact: true }).fill('Crank pulley bolt');
    await poll(() => page.getByTestId('save-state').getAttribute('data-state')).toBe('conflict');
    expect(await page.getByTestId('save-text').textContent()).toMatch(/^Not saved — This draft was changed elsewhere/);
    expect((await getRevision(ctx, draftId)).content.steps.some((s) => s.title === 'Flywheel bolts')).toBe(true);
    await page.getByRole('button', { name: 'Reload the latest draft' }).click();
    await poll(() => titles(page)).toEqual(['New action', 'New action', 'Flywheel bolts']);
    expect(await page.getByTestId('save-text').textContent()).toBe('Saved');
    await ctx.close();
  });

  it('fastener map by hand: add by click, number by hand (and a refused partial order), nudge, drag, label, pass targets converted', async () => {
    const ctx = await newContext(browser, { width: 1400, height: 1100 });
    const page = await ctx.newPage();
    await signInAs(page, 'lead');
    const draftId = await page.evaluate(async () => {
      const r = await fetch('/api/procedures', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ name: `Map test ${Date.now()}`, kind: 'assembly', engineFamily: '', description: '' }) });
      return ((await r.json()) as { draft: { id: string } }).draft.id;
    });
    await page.goto(`/revisions/${draftId}/edit`);
    await hydrated(page, '[data-testid="procedure-editor"][data-hydrated="true"]');
    await page.getByRole('button', { name: '+ Add step' }).click();
    await page.getByRole('menuitem', { name: 'Fastener sequence', exact: true }).click();

    const svg = page.getByTestId('fastener-svg');
    // Screen point of a layout point (the viewBox runs from -60 to 1060 on both axes), in view.
    const at = async (x: number, y: number) => {
      await svg.scrollIntoViewIfNeeded();
      const box = (await svg.boundingBox())!;
      return { x: box.x + ((x + 60) / 1120) * box.width, y: box.y + ((y + 60) / 1120) * box.height };
    };
    const xy = async () => (await page.getByTestId('fastener-details').locator('span').first().textContent()) ?? '';
    const ids = ['f1', 'f2', 'f3'];

    await page.getByRole('button', { name: '+ Add fasteners' }).click();
    for (const [x, y] of [[200, 500], [800, 500]] as const) {
      const p = await at(x, y);
      await page.mouse.click(p.x, p.y);
    }
    await poll(() => svg.locator('g[role="button"]').count()).toBe(3);
    await poll(() => svgOrder(page, ids)).toEqual(['1', '2', '3']);

    // By hand: tap 3, 1, 2; the order is taken when every fastener has its number.
    await page.getByRole('button', { name: 'Number by hand' }).click();
    for (const id of ['f3', 'f1', 'f2']) await page.getByTestId(`fastener-${id}`).click();
    await poll(() => svgOrder(page, ids)).toEqual(['2', '3', '1']);
    expect(await page.getByTestId('order-method').textContent()).toBe('By hand');

    // A partial hand order is refused with the missing fasteners named; cancel keeps the old one.
    await page.getByRole('button', { name: 'Number by hand' }).click();
    await page.getByTestId('fastener-f1').click();
    await page.getByRole('button', { name: 'Finish numbering' }).click();
    await poll(() => page.getByTestId('map-error').textContent()).toContain('missing "2", "3"');
    await page.getByRole('button', { name: 'Cancel numbering' }).click();
    await poll(() => svgOrder(page, ids)).toEqual(['2', '3', '1']);

    // Keyboard nudge, mouse drag and a new label.
    await page.getByRole('button', { name: '✥ Select and move' }).click();
    await page.getByTestId('fastener-f2').focus();
    const before = /x (\d+), y (\d+)/.exec(await xy())!;
    await page.keyboard.press('ArrowRight');
    await poll(xy).toBe(`x ${Number(before[1]) + 10}, y ${before[2]}`);
    const start = await at(800, 500);
    const end = await at(800, 200);
    await page.mouse.move(start.x, start.y);
    await page.mouse.down();
    await page.mouse.move(end.x, end.y, { steps: 10 });
    await page.mouse.up();
    await poll(async () => Number(/y (\d+)/.exec(await xy())?.[1] ?? 0)).toBeLessThan(230);
    await page.getByLabel('Label of the selected fastener').fill('A');
    await poll(() => page.getByTestId('fastener-f3').getAttribute('data-label')).toBe('A');

    // Pass targets in the chosen unit and the other common one.
    await page.getByRole('button', { name: '+ Torque', exact: true }).click();
    await poll(() => page.getByTestId('pass-summary-2').textContent()).toBe('10 N·m (≈ 7.4 ft·lbf)');
    await page.getByLabel('Final torque (percentage passes are stages of it)').check();
    await poll(() => page.getByTestId('converted-finalTorque').textContent()).toBe('≈ 36.9 ft·lbf');
    await page.getByRole('button', { name: '+ % of final torque' }).click();
    await poll(() => page.getByTestId('pass-summary-3').textContent()).toBe('50 % → 25 N·m (≈ 18.4 ft·lbf)');
    await poll(() => page.getByTestId('pass-plan').textContent()).toContain('Pass 3 of 3: 50 % → 25 N·m — A → 1 → 2');

    await waitSaved(page, ctx, draftId, (r) => {
      const s0 = r.content.steps[0];
      return s0?.kind === 'fastener-sequence' && s0.map.orderMethod === 'manual' && JSON.stringify(s0.map.order) === '["f3","f1","f2"]' && s0.passes.length === 3 && s0.finalTorque?.value === 50;
    });
    await ctx.close();
  });
});
