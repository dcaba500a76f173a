/**
 * The front page in the browser: `/` says what the product is for and shows the cautions, and one
 * click on an example opens it solved in the bench. Screenshots at 1280×800 and 1920×1080.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { EXAMPLES } from '../../src/app/bench/examples';
import { launchBrowser, type Browser } from '../support/browser';
import { waitForPainted } from './bench-support';
import { shotBoth } from './team-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('the front page', () => {
  it('stays at / and says what the product is for, with the cautions', async () => {
    const page = await browser.context.newPage();
    const failed: string[] = [];
    page.on('pageerror', (e) => failed.push(e.message));
    await page.goto(inject('baseUrl') + '/');
    await page.locator('h1').waitFor();
    expect(new URL(page.url()).pathname).toBe('/');
    await expect.poll(() => page.title()).toMatch(/^Nodewright/);
    expect(await page.locator('h1').textContent()).toContain('analog circuits');
    expect(await page.locator('.lead').textContent()).toMatch(/solves a text netlist while you type/);
    expect(await page.getByRole('note').textContent()).toContain('sign-off simulation');
    expect(await page.locator('a.example').count()).toBe(EXAMPLES.length);
    await page.evaluate(() => document.fonts.ready);
    await shotBoth(page, 'front-page');
    expect(failed).toEqual([]);
    await page.close();
  });

  it('opens an example in the bench, solved, with one click', { timeout: 60_000 }, async () => {
    const page = await browser.context.newPage();
    await page.goto(inject('baseUrl') + '/');
    const example = EXAMPLES[1];
    await page.getByRole('link', { name: new RegExp(example.label) }).click();
    await page.waitForURL((url) => url.pathname === '/bench' && url.searchParams.get('example') === example.id);
    await page.locator('.cm-content').waitFor();
    const title = /^title\s+(.*)$/m.exec(example.text)![1];
    await expect.poll(() => page.locator('.cm-content').textContent(), { timeout: 15_000 }).toContain(title);
    await waitForPainted(page);
    // Every demo's checks pass as written (src/app/bench/examples).
    await expect.poll(() => page.locator('nw-results-summary').textContent(), { timeout: 15_000 }).toMatch(/(All \d+ checks pass|The check passes)\b/);
    await page.close();
  });

  it('leads on to the bench for someone who already knows it', async () => {
    const page = await browser.context.newPage();
    await page.goto(inject('baseUrl') + '/');
    await page.getByRole('link', { name: 'Continue to the bench' }).click();
    await page.waitForURL((url) => url.pathname === '/bench');
    await page.locator('.cm-content').waitFor();
    await page.close();
  });
});
