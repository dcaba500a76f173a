/**
 * The Noise and Poles tabs in a real browser, on the demo netlists that ask for them: the
 * resistor-tail pair's noise (the rms figures are the CLI's measures, the bridge resistors lead
 * the contributors) and the cascoded pair's poles, asked for (the table's first pole is the CLI's pole(1));
 * axe finds nothing serious; screenshots at 1280×800 and 1920×1080 land in test-results/.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { solveNetlist } from '../../solver';
import { CASCODED_FOLLOWER } from '../../src/app/bench/examples/cascoded-follower';
import { RESISTOR_TAIL } from '../../src/app/bench/examples/resistor-tail';
import { ROOT } from '../../tools/postgres';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { openWatchedBench, replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const AXE_SOURCE = readFileSync(join(ROOT, 'node_modules/axe-core/axe.min.js'), 'utf8');

/** The serious and critical axe findings on the page (the CSP forbids script tags: evaluated). */
async function axeSerious(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Array<{ id: string; impact: string; nodes: Array<{ html: string }> }> }> } }).axe;
    const { violations } = await axe.run(document, { resultTypes: ['violations'] });
    return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.html.slice(0, 120)).join(' | ')}`);
  });
}

async function shots(page: Page, name: string): Promise<void> {
  for (const [width, height] of [[1280, 800], [1920, 1080]]) {
    await page.setViewportSize({ width, height });
    await page.waitForTimeout(200);
    await page.screenshot({ path: join(RESULTS_DIR, `${name}-${width}x${height}.png`) });
  }
  await page.setViewportSize({ width: 1280, height: 800 });
}

/** "11.4 µV" → 1.14e-5: the figure as the panel writes it, in SI base units. */
function volts(text: string): number {
  const m = /^([\d.]+)\s*([pnµm]?)V/.exec(text.trim());
  if (!m) return NaN;
  return Number(m[1]) * { p: 1e-12, n: 1e-9, µ: 1e-6, m: 1e-3, '': 1 }[m[2] as 'p' | 'n' | 'µ' | 'm' | ''];
}

describe('the Noise and Poles tabs', () => {
  it('shows the resistor-tail pair\'s noise as the CLI computes it, the bridge resistors first', { timeout: 120_000 }, async () => {
    const cli = solveNetlist(RESISTOR_TAIL.text.replace(/^measure a0 .*$/m, '$&\nmeasure nout = noise_out_rms()\nmeasure nin = noise_in_rms()'));
    const page = await openWatchedBench(browser.context, inject('baseUrl') + '/bench?example=resistor-tail');
    await page.getByRole('tab', { name: 'Noise' }).click();
    const panel = page.locator('nw-noise-panel');
    const out = panel.locator('[data-figure="out-rms"]');
    await out.waitFor();
    // Three significant figures on screen.
    expect(volts((await out.textContent())!) / cli.measures['nout'] - 1).toBeLessThan(5e-3);
    expect(Math.abs(volts((await panel.locator('[data-figure="in-rms"]').textContent())!) / cli.measures['nin'] - 1)).toBeLessThan(5e-3);
    // The 350 Ω bridge arms dominate: each 45 % of the output noise power (see the CLI's table).
    const firstParts = await panel.locator('table tbody tr').evaluateAll((rows) => rows.slice(0, 2).map((r) => r.textContent ?? ''));
    expect(firstParts.join(' ')).toMatch(/rg[ab].*rg[ab]/s);
    expect(await panel.locator('svg.plot path.curve').count()).toBeGreaterThanOrEqual(2);
    await shots(page, 'noise-tab');
    expect(await axeSerious(page)).toEqual([]);
    expect(page.problems).toEqual([]);
    await page.close();
  });

  it('lists the cascoded pair\'s poles with the CLI\'s dominant pole first, and maps them', { timeout: 120_000 }, async () => {
    // The demo with its poles asked for, and its dominant pole measured.
    const text = CASCODED_FOLLOWER.text.replace(/^analyze vary .*$/m, 'analyze poles').replace(/^measure a0 .*$/m, '$&\nmeasure p1 = pole(1)');
    const cli = solveNetlist(text);
    const page = await openWatchedBench(browser.context, inject('baseUrl') + '/bench?example=cascoded-follower');
    await replaceNetlist(page, text);
    await waitForPainted(page);
    await page.getByRole('tab', { name: 'Poles' }).click();
    const panel = page.locator('nw-poles-panel');
    const table = panel.locator('table');
    await table.waitFor();
    expect(await panel.locator('.summary').textContent()).toMatch(/stable/);
    const firstRow = (await table.locator('tbody tr').filter({ hasText: 'pole 1' }).first().textContent()) ?? '';
    // pole(1) ≈ 14.0 MHz on the demo as written: the table writes it with its unit.
    expect(cli.measures['p1']).toBeGreaterThan(10e6);
    expect(firstRow).toContain(`${(cli.measures['p1'] / 1e6).toFixed(1)}`);
    expect(await panel.locator('svg').first().getAttribute('role')).toBe('img');
    await shots(page, 'poles-tab');
    expect(await axeSerious(page)).toEqual([]);
    expect(page.problems).toEqual([]);
    await page.close();
  });
});
