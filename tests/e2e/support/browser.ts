/** Headless Chromium through playwright-core, against the server scripts/test.mjs started. */
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { DEMO_MEMBERS, DEMO_PASSWORD } from '../../../src/server/seeders/demo-people';

export const APP_URL = process.env.APP_URL ?? 'http://127.0.0.1:4321';

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** A fresh context (own cookies) sized like a tablet unless told otherwise. */
export async function newContext(browser: Browser, opts: { width?: number; height?: number; touch?: boolean } = {}): Promise<BrowserContext> {
  const ctx = await browser.newContext({ baseURL: APP_URL, viewport: { width: opts.width ?? 1024, height: opts.height ?? 900 }, hasTouch: opts.touch ?? false });
  ctx.setDefaultTimeout(20_000);
  return ctx;
}

export type DemoRole = (typeof DEMO_MEMBERS)[number]['role'];
export const demo = (role: DemoRole) => DEMO_MEMBERS.find((m) => m.role === role)!;

/** Waits until the islands on the page have hydrated (they mark their root with data-hydrated). */
export async function hydrated(page: Page, selector = '[data-hydrated="true"]') {
  await page.locator(selector).first().waitFor({ state: 'attached' });
}

/** Signs in through the form, as a person would, and waits for the home page. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD, next = '/') {
  await page.goto(`/sign-in${next !== '/' ? `?next=${encodeURIComponent(next)}` : ''}`);
  await hydrated(page);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

export async function signInAs(page: Page, role: DemoRole, next = '/') {
  await signIn(page, demo(role).email, DEMO_PASSWORD, next);
}
