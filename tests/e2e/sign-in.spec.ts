/** Each demo role signs in and lands on its home; bad passwords and signed-out visits are handled. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launch, newContext, signInAs, demo, hydrated } from './support/browser';

let browser: Browser;
beforeAll(async () => { browser = await launch(); });
afterAll(async () => { await browser?.close(); });

describe('sign-in', () => {
  it.each([
    ['owner', 'Owner home'],
    ['lead', 'Shop lead home'],
    ['technician', 'Technician home'],
    ['reviewer', 'Reviewer home'],
  ] as const)('%s lands on their home', async (role, heading) => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, role);
    await expect.poll(() => page.getByTestId('home-heading').textContent()).toBe(heading);
    expect(await page.getByTestId('who').textContent()).toContain(demo(role).name);
    await ctx.close();
  });

  it('a wrong password shows an error and stays on sign-in', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await page.goto('/sign-in');
    await hydrated(page);
    await page.getByLabel('E-mail').fill(demo('lead').email);
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByTestId('status').textContent()).toContain('do not match');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await ctx.close();
  });

  it('a signed-out visit redirects to sign-in and returns after it', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await page.goto('/shop/members');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/shop/members');
    const api = await ctx.request.get('/api/shop/settings');
    expect(api.status()).toBe(401);
    expect((await api.json()).error.code).toBe('unauthenticated');
    await ctx.close();
  });

  it('signing out ends the session', async () => {
    const ctx = await newContext(browser);
    const page = await ctx.newPage();
    await signInAs(page, 'technician');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    expect(await page.getByTestId('status').textContent()).toContain('signed out');
    await page.goto('/');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await ctx.close();
  });
});
