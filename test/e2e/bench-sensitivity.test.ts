/**
 * `analyze sensitivity` in the bench: the Checks & measures tab ranks what moves each figure,
 * with its sign; a screenshot at 1280×800 lands in test-results/ to look at.
 */
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { RESISTOR_PAIR } from '../../solver/testing/pair-netlist';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { openWatchedBench, replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe('the sensitivity table', () => {
  it('ranks what moves adm in the Checks & measures tab, the tail resistor near the top', async () => {
    const page = await openWatchedBench(browser.context, inject('baseUrl') + '/bench');
    await replaceNetlist(page, `title  Pair sensitivities\n${RESISTOR_PAIR}analyze sensitivity\nmeasure a0 = db(adm)\n`);
    await waitForPainted(page);
    await page.getByRole('tab', { name: /Checks/ }).click();
    const table = page.getByRole('table', { name: 'Sensitivities of adm, largest first' });
    await table.waitFor();
    const first = await table.locator('tbody tr').first().locator('td').allTextContents();
    expect(first[0]).toBe('1');
    // adm = −gm·(RC ‖ ro), gm = IC/VT, IC ≈ (10 V − VBE)/(2·rtail): the tail resistor and the loads
    // move it most (Sedra & Smith, 7th ed., differential pair, from memory).
    const targets = (await table.locator('tbody tr td:nth-child(2)').allTextContents()).slice(0, 4);
    expect(targets).toContain('rtail');
    await page.getByLabel('What moves').selectOption('a0');
    await expect.poll(() => page.getByRole('table', { name: 'Sensitivities of a0, largest first' }).count()).toBe(1);
    await page.getByLabel('What moves').selectOption('adm');
    await page.screenshot({ path: join(RESULTS_DIR, 'sensitivity-1280x800.png') });
    expect(page.problems).toEqual([]);
    await page.close();
  });
});
