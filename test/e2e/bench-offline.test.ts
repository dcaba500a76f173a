/**
 * Offline: once the bench has been opened, the service worker holds the shell, the lazy chunks
 * (editor, panels, solver worker) and the fonts, so with the server stopped the bench still
 * opens, solves and keeps its drafts. The test runs its own server so it can stop it.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_DIST } from '../../tools/build-app';
import { startTeamStack, type RunningStack } from '../../tools/team-stack';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { freshTestDatabase } from '../support/test-database';
import { editOnLine, replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
let server: RunningStack | undefined;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await server?.close().catch(() => undefined);
  await browser?.close();
});

const NETLIST = `title  Offline pair
model  qn: npn(is=1e-16, beta=100, va=80)
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(vee, gnd) -10 V
va:  vsrc(ina, gnd) 0 ac=1
vb:  vsrc(inb, gnd) 0
q1:  npn(c=outa, b=ina, e=tail) qn
q2:  npn(c=outb, b=inb, e=tail) qn
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
rt:  res(tail, vee) 4.65k
ports in=(va, vb) out=(outa, outb)
measure a0 = db(adm)
check a0 >= 40
`;

describe('the bench offline', () => {
  it('opens, solves and keeps drafts with the server stopped', { timeout: 120_000 }, async () => {
    const db = await freshTestDatabase('nodewright_test_e2e_offline');
    server = await startTeamStack({ databaseUrl: db.url, appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, staticDir: APP_DIST, logLevel: 'warn' });
    const url = server.url;
    const page = await browser.context.newPage();
    await page.goto(url + '/bench');
    await page.locator('.cm-content').waitFor();
    await waitForPainted(page);

    // The service worker is active and has prefetched every file of the app group.
    await page.waitForFunction(async () => !!(await navigator.serviceWorker.getRegistration())?.active, undefined, { timeout: 60_000 });
    const expected = await page.evaluate(async () => {
      const manifest = await (await fetch('/ngsw.json')).json();
      return (manifest.assetGroups as { name: string; urls: string[] }[]).find((g) => g.name === 'app')!.urls;
    });
    expect(expected.some((u) => /\/worker-.*\.js$/.test(u))).toBe(true);
    expect(expected.some((u) => /\.woff2$/.test(u))).toBe(true);
    await page.waitForFunction(async (count) => {
      for (const key of await caches.keys()) {
        if (!key.endsWith(':assets:app:cache')) continue;
        if ((await (await caches.open(key)).keys()).length >= count) return true;
      }
      return false;
    }, expected.length, { timeout: 60_000 });

    await replaceNetlist(page, NETLIST);
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 5000 }).toBe('Saved in this browser');

    // Stop the server: nothing answers on its port any more.
    await server.close();
    server = undefined;
    const down = await fetch(url + '/api/health').then(() => 'up', () => 'down');
    expect(down).toBe('down');

    // Reload: the shell, the chunks and the worker come from the service worker; the draft from IndexedDB.
    const failed: string[] = [];
    page.on('pageerror', (e) => failed.push(e.message));
    await page.reload();
    await page.locator('.cm-content').waitFor();
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('Offline pair');
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/The check passes/);

    // Solving still works: a ten times larger tail resistor cuts the tail current, gm and so adm
    // (adm = −gm·RC, gm = IC/VT; Sedra & Smith, Microelectronic Circuits, 7th ed., differential half circuit, from memory) by about 20 dB: the gain check fails.
    await editOnLine(page, 11, '4.65k', '46.5k');
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/1 of 1 check fails/);
    await page.getByRole('tab', { name: 'Bias' }).click();
    await page.getByRole('table', { name: 'Bipolar transistors' }).waitFor();
    await page.evaluate(() => document.fonts.ready);
    expect(await page.evaluate(() => document.fonts.check('16px "Source Sans 3"'))).toBe(true);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-offline.png') });

    // The edit made offline is kept as well: a fresh tab, still offline, reopens it.
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 5000 }).toBe('Saved in this browser');
    const second = await browser.context.newPage();
    await second.goto(url + '/bench');
    await expect.poll(() => second.locator('.cm-content').textContent(), { timeout: 15_000 }).toContain('rt:  res(tail, vee) 46.5k');
    expect(failed).toEqual([]);
    await second.close();
    await page.close();
  });
});
