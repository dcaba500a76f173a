/**
 * The language reference in the browser: a diagnostic's "Syntax" link (problems list and lint
 * tooltip) opens it at the right section, the search narrows and marks, every anchor the links
 * use exists, and — once opened — it reads with the server stopped. Screenshots at 1280×800 and
 * 1920×1080.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { SYNTAX_SECTIONS } from '../../src/app/reference/syntax-anchors';
import { APP_DIST } from '../../tools/build-app';
import { startTeamStack, type RunningStack } from '../../tools/team-stack';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { freshTestDatabase } from '../support/test-database';
import { replaceNetlist, waitForPainted } from './bench-support';
import { shotBoth } from './team-support';

let browser: Browser;
let server: RunningStack | undefined;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await server?.close().catch(() => undefined);
  await browser?.close();
});

const base = () => inject('baseUrl');

/** A netlist whose only mistake is an `analyze noise` line with nothing after it. */
const NOISE_WITHOUT_ARGUMENTS = `title  Noise asked too soon
vcc: vsrc(vcc, gnd) 5 V
r1:  res(vcc, out) 10k
r2:  res(out, gnd) 10k
analyze noise
`;

/** Ids of the headings the reference shows, in order. */
function headingIds(page: Page): Promise<string[]> {
  return page.locator('article h2, article h3').evaluateAll((hs) => hs.map((h) => h.id));
}

/** Waits for the reference to be rendered. */
async function rendered(page: Page): Promise<void> {
  await page.locator('article h2').first().waitFor({ timeout: 15_000 });
}

describe('the language reference', () => {
  it('opens from a problem\'s Syntax link at the section of the statement', { timeout: 60_000 }, async () => {
    const page = await browser.context.newPage();
    await page.goto(base() + '/bench');
    await page.locator('.cm-content').waitFor();
    await replaceNetlist(page, NOISE_WITHOUT_ARGUMENTS);
    await waitForPainted(page);
    const problem = page.locator('nw-problems-list li').filter({ hasText: 'line 5' });
    await problem.waitFor();
    const link = problem.getByRole('link', { name: /^Syntax/ });
    expect(await link.getAttribute('href')).toBe('/reference#analyze-noise');

    // The lint tooltip over the squiggle carries the same link.
    await page.locator('.cm-lintRange-error').first().hover();
    const tooltipLink = page.locator('.cm-tooltip-lint a.nw-lint-syntax');
    await tooltipLink.waitFor();
    expect(await tooltipLink.getAttribute('href')).toBe('/reference#analyze-noise');
    expect(await tooltipLink.textContent()).toContain('Syntax of analyze noise');
    await page.screenshot({ path: join(RESULTS_DIR, 'reference-link-tooltip.png') });

    // The link opens a new tab, so the bench keeps its text and undo history.
    const [tab] = await Promise.all([browser.context.waitForEvent('page'), link.click()]);
    await rendered(tab);
    expect(new URL(tab.url()).hash).toBe('#analyze-noise');
    // The section on noise when the reference has one; until then the later analyses, which name it.
    const ids = await headingIds(tab);
    const target = ids.includes('analyze-noise') ? 'analyze-noise' : 'later-analyses';
    const heading = tab.locator(`#${target}`);
    await expect.poll(() => heading.evaluate((h) => h.classList.contains('current'))).toBe(true);
    await expect.poll(() => tab.evaluate(() => document.activeElement?.id)).toBe(target);
    const box = (await heading.boundingBox())!;
    expect(box.y).toBeGreaterThanOrEqual(0);
    expect(box.y).toBeLessThan(120);
    expect(await tab.locator('section', { has: heading }).last().textContent()).toContain('analyze noise');
    await shotBoth(tab, 'reference-at-noise');
    await tab.close();
    await page.close();
  });

  it('has every section the Syntax links lead to, or the fallback each names', async () => {
    const page = await browser.context.newPage();
    await page.goto(base() + '/reference');
    await rendered(page);
    const ids = new Set(await headingIds(page));
    const missing = SYNTAX_SECTIONS.filter((e) => !ids.has(e.anchor) && !(e.fallback ?? []).some((a) => ids.has(a))).map((e) => e.anchor);
    expect(missing).toEqual([]);
    await page.close();
  });

  it('narrows to the sections that match a search, marks the hits, and shows all again when cleared', async () => {
    const page = await browser.context.newPage();
    await page.goto(base() + '/reference');
    await rendered(page);
    await page.evaluate(() => document.fonts.ready);
    await shotBoth(page, 'reference');
    const all = await headingIds(page);
    expect(all.length).toBeGreaterThan(20);

    await page.getByLabel('Search the reference').fill('cmrr_db');
    await expect.poll(() => headingIds(page).then((ids) => ids.length)).toBeLessThan(all.length);
    const shown = await page.locator('article section').evaluateAll((ss) => ss.map((s) => s.textContent ?? ''));
    expect(shown.length).toBeGreaterThan(0);
    expect(shown.every((t) => t.toLowerCase().includes('cmrr_db'))).toBe(true);
    expect(await page.locator('article mark').first().textContent()).toBe('cmrr_db');
    expect(await page.locator('.count').textContent()).toMatch(/^\d+ sections? match/);
    // The contents narrow with the text.
    expect(await page.locator('nav.toc a').count()).toBeLessThan(all.length);
    await shotBoth(page, 'reference-search');

    await page.getByLabel('Search the reference').fill('');
    await expect.poll(() => headingIds(page)).toEqual(all);
    expect(await page.locator('article mark').count()).toBe(0);
    await page.close();
  });

  it('keeps the contents in view beside the text on a wide screen', async () => {
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.goto(base() + '/reference#checks');
    await rendered(page);
    await expect.poll(() => page.evaluate(() => window.scrollY)).toBeGreaterThan(500);
    const toc = (await page.locator('aside.side').boundingBox())!;
    expect(toc.y).toBeGreaterThanOrEqual(-1);
    expect(toc.y).toBeLessThan(20);
    await page.close();
  });

  it('reads offline once it has been opened', { timeout: 120_000 }, async () => {
    const db = await freshTestDatabase('nodewright_test_e2e_reference');
    server = await startTeamStack({ databaseUrl: db.url, appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, staticDir: APP_DIST, logLevel: 'warn' });
    const url = server.url;
    const page = await browser.context.newPage();
    await page.goto(url + '/reference');
    await rendered(page);
    // The service worker is active and has prefetched the reference text with the app.
    await page.waitForFunction(async () => !!(await navigator.serviceWorker.getRegistration())?.active, undefined, { timeout: 60_000 });
    await page.waitForFunction(async () => {
      for (const key of await caches.keys()) {
        if (!key.endsWith(':assets:reference:cache')) continue;
        if ((await (await caches.open(key)).keys()).some((r) => r.url.endsWith('/docs/netlist.md'))) return true;
      }
      return false;
    }, undefined, { timeout: 60_000 });
    // …and every file of the app group (shell and lazy chunks), as the bench's offline test waits for.
    const appFiles = await page.evaluate(async () => {
      const manifest = await (await fetch('/ngsw.json')).json();
      return (manifest.assetGroups as { name: string; urls: string[] }[]).find((g) => g.name === 'app')!.urls.length;
    });
    await page.waitForFunction(async (count) => {
      for (const key of await caches.keys()) {
        if (key.endsWith(':assets:app:cache') && (await (await caches.open(key)).keys()).length >= count) return true;
      }
      return false;
    }, appFiles, { timeout: 60_000 });

    await server.close();
    server = undefined;
    expect(await fetch(url + '/api/health').then(() => 'up', () => 'down')).toBe('down');

    const failed: string[] = [];
    page.on('pageerror', (e) => failed.push(e.message));
    // Two full loads with the server stopped: the front page, then the reference at a section.
    await page.goto(url + '/');
    await page.getByRole('link', { name: 'Language reference' }).waitFor();
    await page.goto(url + '/reference#analyze-ac');
    await rendered(page);
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('analyze-ac');
    expect(await page.locator('#analyze-ac').textContent()).toBe('analyze ac');
    expect(failed).toEqual([]);
    await page.screenshot({ path: join(RESULTS_DIR, 'reference-offline.png') });
    await page.close();
  });
});
