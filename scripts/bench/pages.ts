/** Page figures from headless Chromium: JavaScript shipped (gzip) and time until an island is interactive. */
import zlib from 'node:zlib';
import { chromium } from 'playwright-core';

export type PageFigures = { jsFiles: number; jsGzipKB: number; reactGzipKB: number; interactiveMs: number; firstByteMs: number };

export async function measurePage(appUrl: string, cookie: string, path: string, readySelector = '[data-hydrated="true"]'): Promise<PageFigures> {
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
  try {
    const ctx = await browser.newContext({ viewport: { width: 1024, height: 900 } });
    await ctx.addCookies(cookie.split('; ').map((c) => { const [name, ...v] = c.split('='); return { name: name!, value: v.join('='), url: appUrl }; }));
    const page = await ctx.newPage();
    // Warm-up load so the figure is not the server's first compile of the route.
    await page.goto(appUrl + path, { timeout: 180_000, waitUntil: 'commit' });
    await page.locator(readySelector).first().waitFor({ state: 'attached', timeout: 180_000 });
    const js = new Map<string, number>();
    const react = new Set<string>(); // files of the React runtime itself (they carry its licence header)
    page.on('response', async (res) => {
      const type = res.headers()['content-type'] ?? '';
      if (!type.includes('javascript')) return;
      try {
        const body = await res.body();
        js.set(res.url(), zlib.gzipSync(body).length);
        if (body.includes('@license React')) react.add(res.url());
      } catch { /* navigation raced */ }
    });
    const cdp = await ctx.newCDPSession(page);
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    const t0 = Date.now();
    const served = await page.goto(appUrl + path, { timeout: 180_000, waitUntil: 'commit' });
    const firstByteMs = Date.now() - t0;
    void served;
    await page.locator(readySelector).first().waitFor({ state: 'attached', timeout: 180_000 });
    const interactiveMs = await page.evaluate(() => performance.now());
    await page.waitForLoadState('networkidle');
    const total = [...js.values()].reduce((a, b) => a + b, 0);
    const reactTotal = [...react].reduce((a, u) => a + (js.get(u) ?? 0), 0);
    return { jsFiles: js.size, jsGzipKB: total / 1024, reactGzipKB: reactTotal / 1024, interactiveMs, firstByteMs };
  } finally {
    await browser.close();
  }
}
