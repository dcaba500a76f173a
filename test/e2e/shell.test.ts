import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('the served app shell', () => {
  it('loads the bench with the product name, in Source Sans 3 shipped with the app', async () => {
    const page = await browser.context.newPage();
    const failed: string[] = [];
    page.on('requestfailed', (r) => failed.push(r.url()));
    page.on('pageerror', (e) => failed.push(e.message));
    // `/` is the front page now (test/e2e/front-page.test.ts); the bench has its own address.
    await page.goto(inject('baseUrl') + '/bench');
    await expect.poll(() => page.title()).toBe('Bench · Nodewright');
    await expect.poll(() => page.locator('.top-bar .name').textContent()).toBe('Nodewright');
    await page.evaluate(() => document.fonts.ready);
    const family = await page.evaluate(() => getComputedStyle(document.querySelector('h1')!).fontFamily);
    expect(family.split(',')[0].replaceAll('"', '').trim()).toBe('Source Sans 3');
    // The font really loaded from our own server (no fallback, no remote request).
    expect(await page.evaluate(() => document.fonts.check('16px "Source Sans 3"'))).toBe(true);
    const fontFaces = await page.evaluate(() => [...document.fonts].filter((f) => f.family.includes('Source Sans 3') && f.status === 'loaded').length);
    expect(fontFaces).toBeGreaterThan(0);
    expect(failed).toEqual([]);
    await page.screenshot({ path: join(RESULTS_DIR, 'shell-bench.png'), fullPage: true });
    await page.close();
  });

  it('navigates to the library and back through the top bar, lazily loaded', async () => {
    const page = await browser.context.newPage();
    await page.goto(inject('baseUrl') + '/bench');
    await page.getByRole('link', { name: 'Library' }).click();
    await page.waitForURL(/\/library$/);
    await expect.poll(() => page.locator('h1').textContent()).toBe('Block library');
    await page.getByRole('link', { name: 'Bench', exact: true }).click();
    await expect.poll(() => page.locator('h1').textContent()).toBe('Bench');
    await page.close();
  });

  it('answers an unknown address with the app\'s own not-found page', async () => {
    const page = await browser.context.newPage();
    const res = await page.goto(inject('baseUrl') + '/no/such/page');
    expect(res?.status()).toBe(200);
    await expect.poll(() => page.locator('h1').textContent()).toBe('Nothing here');
    await page.close();
  });
});
