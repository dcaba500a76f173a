/**
 * `use` in the bench: the seed block library ships with the app, so a netlist that uses a vetted
 * block solves in the browser (and offline, once the service worker has cached the library).
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser, type Browser } from '../support/browser';
import { replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const WILSON = [
  'title  Wilson mirror from the library',
  'use mirrors/wilson_npn@3',
  'vcc: vsrc(vcc, gnd) 5 V',
  'rref: res(vcc, ref) 4.3k',
  'm1: wilson_npn(in=ref, out=o, rail=gnd)',
  'rl: res(vcc, o) 1k',
  'check ic(m1.qc) = 0.8m ± 10%',
  '',
].join('\n');

describe('library blocks in the bench', () => {
  it('solves a netlist that uses a seed-library block, with dotted device names', async () => {
    const page = await browser.context.newPage();
    await page.goto(inject('baseUrl') + '/bench');
    await page.locator('.cm-content').waitFor();
    await replaceNetlist(page, WILSON);
    await waitForPainted(page);
    await expect.poll(() => page.locator('.cm-lintRange-error').count()).toBe(0);
    await page.getByRole('tab', { name: 'Bias' }).click();
    // The table may still hold the demo's devices for a moment (the block file is fetched first).
    const table = page.getByRole('table', { name: 'Bipolar transistors' });
    await expect.poll(async () => (await table.locator('tr').allTextContents()).filter((r) => /m1\.q[abc]/.test(r)).length, { timeout: 15_000 }).toBe(3);
    const rows = await table.locator('tr').allTextContents();
    // IREF = (5 V − 2·VBE)/4.3 kΩ ≈ 0.81 mA with VBE ≈ 0.77 V at this current (is = 1e-16 A), and a
    // Wilson mirror passes it on within 2/(β² + 2β + 2) (Sedra & Smith, 7th ed., Wilson mirror).
    const ic = Number(/active\s*(\d+) µA/.exec(rows.find((r) => r.includes('m1.qc')) ?? '')?.[1]);
    expect(ic).toBeGreaterThan(780);
    expect(ic).toBeLessThan(830);
    // The block's pins and params from the keyboard: F2 with the cursor on the instance's kind
    // (now that the block has been fetched and solved).
    await page.locator('.cm-line', { hasText: 'm1: wilson_npn' }).click();
    await page.keyboard.press('Home');
    for (let k = 0; k < 7; k++) await page.keyboard.press('ArrowRight');
    await page.keyboard.press('F2');
    const help = page.locator('.cm-tooltip.nw-block-doc, .cm-tooltip .nw-block-doc');
    await help.waitFor({ timeout: 10_000 });
    expect(await help.textContent()).toContain('rail');
    await page.keyboard.press('Escape');
    await expect.poll(() => help.count()).toBe(0);
    await page.close();
  });

  it('names the published versions when a netlist asks for one that does not exist', async () => {
    const page = await browser.context.newPage();
    await page.goto(inject('baseUrl') + '/bench');
    await page.locator('.cm-content').waitFor();
    await replaceNetlist(page, WILSON.replace('@3', '@9'));
    await waitForPainted(page);
    const problems = page.locator('nw-problems-list');
    await expect.poll(() => problems.textContent()).toContain('no version 9 of `mirrors/wilson_npn`');
    expect(await problems.textContent()).toContain('@3');
    await page.close();
  });
});
