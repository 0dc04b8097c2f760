/**
 * Sign-in limits and session cookie flags, through better-auth's own HTTP handler (the one
 * /api/auth/* serves), configured as production is: the limit is on (NODE_ENV=production) and
 * small here (SIGNIN_RATE_LIMIT=3 per minute per client address). The browser tests' server runs
 * with a limit of 1000 so they can sign in freely; this file is where the limit itself is pinned.
 * The https case re-imports the auth module with an https PUBLIC_URL to check the Secure flag.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

process.env.NODE_ENV = 'production';
process.env.SIGNIN_RATE_LIMIT = '3';
const HTTP_URL = 'http://127.0.0.1:4321';
process.env.PUBLIC_URL = HTTP_URL;
process.env.TRUSTED_ORIGINS = HTTP_URL;

const { freshDatabase } = await import('./support/db');
const { createShop } = await import('./support/shops');
const { auth } = await import('../../src/server/auth');
type Shop = Awaited<ReturnType<typeof createShop>>;

let shop: Shop;
beforeAll(async () => {
  await freshDatabase();
  shop = await createShop('Rate limit shop');
}, 60_000);
afterAll(async () => { (await import('../../src/server/db')).closeORM(); });

type Handler = (r: Request) => Promise<Response>;
const signIn = (handler: Handler, base: string, email: string, password: string, ip: string) =>
  handler(new Request(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: base, 'x-forwarded-for': ip }, body: JSON.stringify({ email, password }) }));

describe('sign-in rate limit', () => {
  it('answers 429 after the limit from one address, with a retry hint, while another address still signs in', async () => {
    const email = shop.members.technician.email;
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) statuses.push((await signIn(auth().handler, HTTP_URL, email, 'wrong-password-1', '203.0.113.7')).status);
    expect(statuses).toEqual([401, 401, 401]);
    // The right password does not help once the address is over the limit.
    const limited = await signIn(auth().handler, HTTP_URL, email, 'integration-pass-1', '203.0.113.7');
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get('x-retry-after'))).toBeGreaterThan(0);
    const other = await signIn(auth().handler, HTTP_URL, email, 'integration-pass-1', '203.0.113.8');
    expect(other.status).toBe(200);
  });

  it('counts per address, not per account: a second account from the limited address is refused too', async () => {
    const r = await signIn(auth().handler, HTTP_URL, shop.members.lead.email, 'integration-pass-1', '203.0.113.7');
    expect(r.status).toBe(429);
  });
});

const cookieOf = (res: Response, name: RegExp) => res.headers.getSetCookie().find((c) => name.test(c.split('=')[0]!)) ?? '';

describe('session cookie flags', () => {
  it('on http: HttpOnly, SameSite=Lax, Path=/, not Secure (a browser would drop it on http)', async () => {
    const res = await signIn(auth().handler, HTTP_URL, shop.members.reviewer.email, 'integration-pass-1', '198.51.100.1');
    expect(res.status).toBe(200);
    const c = cookieOf(res, /session_token$/);
    expect(c).not.toBe('');
    expect(c).toMatch(/;\s*HttpOnly/i);
    expect(c).toMatch(/;\s*SameSite=Lax/i);
    expect(c).toMatch(/;\s*Path=\//i);
    expect(c).not.toMatch(/;\s*Secure/i);
  });

  it('on https: the same flags plus Secure, under a __Secure- name', async () => {
    const HTTPS_URL = 'https://shop.torquetrail.test';
    vi.resetModules();
    process.env.PUBLIC_URL = HTTPS_URL;
    process.env.TRUSTED_ORIGINS = HTTPS_URL;
    const fresh = await import('../../src/server/auth');
    const res = await signIn(fresh.auth().handler, HTTPS_URL, shop.members.owner.email, 'integration-pass-1', '198.51.100.2');
    expect(res.status).toBe(200);
    const c = cookieOf(res, /session_token$/);
    expect(c.startsWith('__Secure-')).toBe(true);
    expect(c).toMatch(/;\s*Secure/i);
    expect(c).toMatch(/;\s*HttpOnly/i);
    expect(c).toMatch(/;\s*SameSite=Lax/i);
    process.env.PUBLIC_URL = HTTP_URL;
    process.env.TRUSTED_ORIGINS = HTTP_URL;
  });
  // better-auth turns its own origin check off under a test runner (isTest()), so its 403 for a
  // foreign Origin is pinned against the built server in tests/e2e/security.spec.ts.
});
