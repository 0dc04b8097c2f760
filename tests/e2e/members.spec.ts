/**
 * Shop membership end to end: the owner invites a new address, the invited person creates an
 * account from the e-mailed link and joins, the owner changes their role and later removes them,
 * a password reset goes round trip through the mail catcher, and non-owners get no management.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { APP_URL, hydrated, launch, newContext, signIn, signInAs } from './support/browser';
import { linkIn, waitForMail } from './support/inbox';
import { DEMO_SHOP, DEMO_MEMBERS } from '../../src/server/seeders/demo-people';

let browser: Browser;
let owner: BrowserContext;
let ownerPage: Page;
let newcomer: BrowserContext;
let newcomerPage: Page;

const tag = randomUUID().slice(0, 8);
const person = { name: `Nika Newcomer ${tag}`, email: `nika.${tag}@e2e.torquetrail.test`, password: 'first-bench-pass-1', newPassword: 'second-bench-pass-2' };
const ownerName = DEMO_MEMBERS.find((m) => m.role === 'owner')!.name;

const statusText = (page: Page) => page.getByTestId('status').textContent();
const row = (page: Page, email: string) => page.locator(`[data-testid="member-row"][data-email="${email}"]`);

async function openMembers(page: Page) {
  await page.goto('/shop/members');
  await hydrated(page);
}

async function invite(page: Page, email: string, roleLabel: string) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Role', { exact: true }).selectOption({ label: roleLabel });
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect.poll(() => statusText(page)).toContain(`Invitation sent to ${email}`);
}

beforeAll(async () => {
  browser = await launch();
  owner = await newContext(browser);
  ownerPage = await owner.newPage();
  await signInAs(ownerPage, 'owner');
});
afterAll(async () => {
  await newcomer?.close();
  await owner?.close();
  await browser?.close();
});

describe('shop members', () => {
  it('the owner invites a reviewer, who creates an account from the e-mail and joins', async () => {
    await openMembers(ownerPage);
    await invite(ownerPage, person.email, 'Reviewer');
    const waiting = ownerPage.locator(`[data-testid="invitation-row"][data-email="${person.email}"]`);
    await waiting.waitFor();
    expect(await waiting.textContent()).toContain('Reviewer');

    const mail = await waitForMail(person.email, /^Join .+ on Torquetrail$/);
    expect(mail.subject).toBe(`Join ${DEMO_SHOP.name} on Torquetrail`);
    const link = linkIn(mail, `${APP_URL}/invitation/`);

    newcomer = await newContext(browser);
    newcomerPage = await newcomer.newPage();
    const res = await newcomerPage.goto(link);
    expect(res?.status()).toBe(200);
    await hydrated(newcomerPage);
    expect(await newcomerPage.getByTestId('invitation-shop').textContent()).toBe(DEMO_SHOP.name);
    expect(await newcomerPage.getByTestId('invitation-role').textContent()).toBe('Reviewer');
    expect(await newcomerPage.locator('main').textContent()).toContain(ownerName);
    expect(await newcomerPage.getByLabel('E-mail').inputValue()).toBe(person.email);

    // A short password is refused beside the field before anything is sent.
    await newcomerPage.getByLabel('Your name').fill(person.name);
    await newcomerPage.getByLabel('Password').fill('short');
    await newcomerPage.getByRole('button', { name: `Create account and join ${DEMO_SHOP.name}` }).click();
    await expect.poll(() => newcomerPage.locator('.tt-field-error').first().textContent()).toContain('at least 10 characters');

    await newcomerPage.getByLabel('Password').fill(person.password);
    await newcomerPage.getByRole('button', { name: `Create account and join ${DEMO_SHOP.name}` }).click();
    await newcomerPage.waitForURL((u) => u.pathname === '/');
    await expect.poll(() => newcomerPage.getByTestId('home-heading').textContent()).toBe('Reviewer home');
    expect(await newcomerPage.getByTestId('shop-name').textContent()).toBe(DEMO_SHOP.name);

    // The link is spent now: it answers 404 with a page that says so.
    const again = await newcomer.newPage();
    const spent = await again.goto(link);
    expect(spent?.status()).toBe(404);
    expect(await again.getByTestId('invitation-gone').textContent()).toContain('already used');
    await again.close();
  });

  it('the owner sees the new member and makes them a technician; their next page says so', async () => {
    await openMembers(ownerPage);
    const r = row(ownerPage, person.email);
    await r.waitFor();
    expect(await r.textContent()).toContain(person.name);
    const select = ownerPage.getByLabel(`Role of ${person.name}`);
    expect(await select.inputValue()).toBe('reviewer');
    await select.selectOption('technician');
    await expect.poll(() => statusText(ownerPage)).toContain(`${person.name} is now Technician`);

    await newcomerPage.reload();
    await expect.poll(() => newcomerPage.getByTestId('home-heading').textContent()).toBe('Technician home');
  });

  it('the only owner cannot demote themselves; the message says why and the role stays', async () => {
    await openMembers(ownerPage);
    const select = ownerPage.getByLabel(`Role of ${ownerName}`);
    await select.selectOption('lead');
    await expect.poll(() => statusText(ownerPage)).toContain('no owner left');
    expect(await ownerPage.getByTestId('status').getAttribute('data-kind')).toBe('error');
    expect(await select.inputValue()).toBe('owner');
    await ownerPage.reload();
    await hydrated(ownerPage);
    expect(await ownerPage.getByLabel(`Role of ${ownerName}`).inputValue()).toBe('owner');
  });

  it('a cancelled invitation stops working, and an unknown one answers 404', async () => {
    const other = `cancelled.${tag}@e2e.torquetrail.test`;
    await openMembers(ownerPage);
    await invite(ownerPage, other, 'Shop lead');
    const link = linkIn(await waitForMail(other, /^Join /), `${APP_URL}/invitation/`);
    const waiting = ownerPage.locator(`[data-testid="invitation-row"][data-email="${other}"]`);
    await waiting.getByRole('button', { name: /Cancel invitation/ }).click();
    await expect.poll(() => statusText(ownerPage)).toContain('was cancelled');
    await waiting.waitFor({ state: 'detached' });

    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    const res = await page.goto(link);
    expect(res?.status()).toBe(404);
    expect(await page.getByTestId('invitation-gone').textContent()).toContain('cancelled');
    const unknown = await page.goto('/invitation/no-such-invitation');
    expect(unknown?.status()).toBe(404);
    expect(await page.getByTestId('invitation-gone').textContent()).toContain('No such invitation');
    await ctx.close();
  });

  it('the new member resets their password by e-mail and signs in with the new one', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.waitForURL((u) => u.pathname === '/forgot-password');
    await hydrated(page);
    await page.getByLabel('E-mail').fill(person.email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await expect.poll(() => statusText(page)).toContain('If that address has an account, a message is on its way');

    const mail = await waitForMail(person.email, /Reset your Torquetrail password/);
    await page.goto(linkIn(mail, `${APP_URL}/api/auth/reset-password/`));
    await page.waitForURL((u) => u.pathname === '/reset-password' && u.searchParams.has('token'));
    await hydrated(page);
    await page.getByLabel('New password', { exact: true }).fill(person.newPassword);
    await page.getByLabel('New password again').fill('not-the-same-password');
    await page.getByRole('button', { name: 'Set new password' }).click();
    await expect.poll(() => page.locator('.tt-field-error').first().textContent()).toContain('not the same');
    await page.getByLabel('New password again').fill(person.newPassword);
    await page.getByRole('button', { name: 'Set new password' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in' && u.searchParams.has('reset'));
    await hydrated(page);
    expect(await statusText(page)).toContain('Password changed');

    // The old password no longer works; the new one does.
    await page.getByLabel('E-mail').fill(person.email);
    await page.getByLabel('Password').fill(person.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => statusText(page)).toContain('do not match');
    await signIn(page, person.email, person.newPassword);
    await expect.poll(() => page.getByTestId('home-heading').textContent()).toBe('Technician home');

    // The same link cannot be used twice.
    const reused = await ctx.newPage();
    await reused.goto(linkIn(mail, `${APP_URL}/api/auth/reset-password/`));
    expect(await reused.getByTestId('reset-bad-link').textContent()).toContain('does not work');
    await ctx.close();
  });

  it('an address without an account gets the same answer from forgot-password', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await page.goto('/forgot-password');
    await hydrated(page);
    const nobody = `nobody.${tag}@e2e.torquetrail.test`;
    await page.getByLabel('E-mail').fill(nobody);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await expect.poll(() => statusText(page)).toContain('If that address has an account, a message is on its way');
    await ctx.close();
  });

  it('the owner removes the member after confirming in the page; Keep leaves them in', async () => {
    await openMembers(ownerPage);
    const r = row(ownerPage, person.email);
    await r.getByRole('button', { name: /^Remove/ }).click();
    await r.getByRole('button', { name: 'Keep' }).click();
    expect(await r.getByRole('button', { name: 'Yes, remove' }).count()).toBe(0);
    await r.getByRole('button', { name: /^Remove/ }).click();
    await r.getByRole('button', { name: 'Yes, remove' }).click();
    await expect.poll(() => statusText(ownerPage)).toContain(`${person.name} was removed from ${DEMO_SHOP.name}`);
    await r.waitFor({ state: 'detached' });

    await newcomerPage.reload();
    await expect.poll(() => newcomerPage.locator('main h1').textContent()).toContain('not in a shop');
  });

  it('a technician visiting the members page gets no management', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, 'technician');
    const res = await page.goto('/shop/members');
    expect(res?.status()).toBe(403);
    expect(await page.getByTestId('members-refused').textContent()).toContain("Only the shop's owner manages members");
    expect(await page.getByTestId('members-table').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Members' }).count()).toBe(0);
    await ctx.close();
  });
});
