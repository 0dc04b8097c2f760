/** Headless Chromium through playwright-core, against the server scripts/test.mjs started. */
import { chromium, type APIResponse, type Browser, type BrowserContext, type Page } from 'playwright-core';
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

/** A member in a context of their own (touch for the technician, as at the bench), with their user id. */
export async function signedIn(browser: Browser, role: DemoRole, size: { width?: number; height?: number } = {}): Promise<{ ctx: BrowserContext; page: Page; userId: string }> {
  const ctx = await newContext(browser, { width: size.width ?? 1024, height: size.height ?? 1300, touch: role === 'technician' });
  const page = await ctx.newPage();
  await signInAs(page, role);
  const session = await (await ctx.request.get('/api/auth/get-session')).json();
  return { ctx, page, userId: session.user.id as string };
}

/** The JSON of an API answer that must have this status; otherwise an error naming what came back. */
export async function ok<T>(res: APIResponse, status: number): Promise<T> {
  if (res.status() !== status) throw new Error(`${res.url()} answered ${res.status()}: ${await res.text()}`);
  return (await res.json()) as T;
}
