/**
 * The Sweeps tab in a real browser — a resistor-tail pair with `analyze vary rt` (one value that
 * does not solve), `analyze temp` and an ac sweep: the table per value, the legend naming the
 * values on the overlaid curves, the figure plotted against rt with its check limit, the cursor
 * and an export; screenshots at 1280×800 and 1920×1080 land in test-results/ to look at.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ROOT } from '../../tools/postgres';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { openWatchedBench, replaceNetlist, waitForPainted, type WatchedPage } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const PAIR = `title  Swept pair
model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p, tauf=0.3n)
param  rt = 4.65k
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(gnd, vee) 10 V
va: vsrc(ina, gnd) 0 ac=1
vb: vsrc(inb, gnd) 0
rc1: res(vcc, outa) 5k
rc2: res(vcc, outb) 5k
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(c=outb, b=inb, e=tail) qn
rt: res(tail, vee) rt
ports in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 10
analyze vary rt over 0 2k 4.65k 10k 20k
analyze temp over -40 27 85 125
measure a0 = db(adm)
measure f3 = corner(adm)
check cmrr_db >= 45
check a0 >= 40
`;

type Watched = WatchedPage;

/** A page on the bench that records uncaught errors and console errors. */
function openBench(): Promise<Watched> {
  return openWatchedBench(browser.context, inject('baseUrl') + '/bench');
}

const shot = (page: Page, name: string) => page.screenshot({ path: join(RESULTS_DIR, name) });

async function download(page: Page, button: Locator): Promise<{ name: string; bytes: Buffer }> {
  const [file] = await Promise.all([page.waitForEvent('download'), button.click()]);
  return { name: file.suggestedFilename(), bytes: readFileSync((await file.path())!) };
}

const AXE_SOURCE = readFileSync(join(ROOT, 'node_modules/axe-core/axe.min.js'), 'utf8');

/**
 * The serious and critical axe findings on the page (accessibility.test.ts audits every tab, but
 * of a netlist without sweeps: this is the filled tab). The CSP forbids script tags: evaluated.
 */
async function axeSerious(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Array<{ id: string; impact: string; nodes: Array<{ html: string }> }> }> } }).axe;
    const { violations } = await axe.run(document, { rules: { 'label-content-name-mismatch': { enabled: true } }, resultTypes: ['violations'] });
    return violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.html.slice(0, 120)).join(' | ')}`);
  });
}

const cellTexts = (rows: Locator) => rows.evaluateAll((trs) => trs.map((tr) => [...tr.children].map((c) => (c.textContent ?? '').replace(/\s+/g, ' ').trim())));

describe('the Sweeps tab', () => {
  it('tabulates the values of rt and the temperatures, overlays their curves and plots a figure against rt', { timeout: 120_000 }, async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    await page.getByRole('tab', { name: 'Sweeps' }).click();
    const panel = page.locator('nw-sweeps-panel');
    const table = panel.getByRole('table', { name: /Figures at each value of rt/ });
    await table.waitFor();
    const rows = await cellTexts(table.locator('tbody tr'));
    expect(rows.map((r) => r[0])).toEqual(['0 Ω', '2.00 kΩ', '4.65 kΩ', '10.0 kΩ', '20.0 kΩ']);
    expect(rows[0][1]).toMatch(/^✗ did not solve The resistance of `rt` must be greater than zero/);
    // At the written 4.65 kΩ: the figures of the worked example of the language (45.1 dB, 50.6 dB).
    expect(rows[2].slice(1, 4)).toEqual([expect.stringMatching(/^45\.\d\d dB$/), expect.stringMatching(/^-5\.\d\d dB$/), expect.stringMatching(/^50\.6\d dB$/)]);
    expect(rows[2][6]).toBe('✓ 2 of 2 pass');
    expect(await panel.locator('.summary').textContent()).toBe('5 values of rt; 1 did not solve.');

    const legend = panel.locator('nw-sweep-overlay .legend');
    expect(await legend.getByRole('button').allTextContents()).toEqual(['rt = 2.00 kΩ', 'rt = 4.65 kΩ', 'rt = 10.0 kΩ', 'rt = 20.0 kΩ'].map((t) => expect.stringContaining(t)));
    expect(await legend.locator('.note').textContent()).toBe('Not plotted (did not solve): rt = 0 Ω.');
    const overlays = panel.locator('nw-sweep-overlay nw-bode-plot');
    expect(await overlays.count()).toBe(2);
    expect(await overlays.first().locator('path.curve').count()).toBe(4);

    // The figure against rt: a0 on a log axis, its limit dashed across, the cursor reading a point.
    const measure = panel.locator('nw-sweep-measure-plot');
    const xy = measure.locator('nw-xy-plot');
    expect(await xy.locator('g.points circle').count()).toBe(4);
    expect(await xy.locator('.rule-label').allTextContents()).toEqual(['check a0 ≥ 40.0 dB']);
    const svgBox = (await xy.locator('svg.plot').boundingBox())!;
    await xy.locator('.surface').focus();
    await page.keyboard.press('End');
    await expect.poll(() => xy.locator('.readout .at').textContent()).toBe('rt = 20.00 kΩ');
    expect(await xy.locator('.readout .row').textContent()).toMatch(/a0\s*3\d\.\d\d dB/);
    await page.mouse.move(svgBox.x + svgBox.width * 0.45, svgBox.y + svgBox.height * 0.4);
    await expect.poll(() => xy.locator('.readout .at').textContent()).toMatch(/^rt = (4\.650|10\.00) kΩ$/);
    const csv = await download(page, measure.getByRole('button', { name: 'CSV: export the curves' }));
    expect(csv.name).toBe('swept-pair-a0-vs-rt.csv');
    expect(csv.bytes.toString('utf8').split('\r\n').slice(0, 2)).toEqual(['rt_ohm,a0_db', expect.stringMatching(/^2000,-?\d/)]);
    const svg = await download(page, panel.locator('nw-sweep-overlay nw-export-bar').first().getByRole('button', { name: 'Export the plot as SVG' }));
    expect(svg.name).toBe('swept-pair-rt-adm.svg');
    expect(svg.bytes.toString('utf8')).toContain('>rt = 4.65 kΩ</text>');

    expect(await axeSerious(page)).toEqual([]);

    for (const [width, height] of [[1280, 800], [1920, 1080]]) {
      await page.setViewportSize({ width, height });
      await panel.locator('nw-sweep-table').scrollIntoViewIfNeeded();
      await page.waitForTimeout(150);
      await shot(page, `sweeps-vary-${width}x${height}.png`);
      await overlays.first().scrollIntoViewIfNeeded();
      await page.waitForTimeout(150);
      await shot(page, `sweeps-vary-curves-${width}x${height}.png`);
    }

    // The temperature sweep, by the toggle.
    await panel.getByRole('radio', { name: 'temperature' }).check();
    const temps = panel.getByRole('table', { name: /Figures at each temperature/ });
    await temps.waitFor();
    expect((await cellTexts(temps.locator('tbody tr'))).map((r) => r[0])).toEqual(['-40 °C', '27 °C', '85 °C', '125 °C']);
    expect(await legend.getByRole('button').allTextContents()).toEqual(['-40 °C', '27 °C', '85 °C', '125 °C'].map((t) => expect.stringContaining(t)));
    expect(await axeSerious(page)).toEqual([]);
    for (const [width, height] of [[1280, 800], [1920, 1080]]) {
      await page.setViewportSize({ width, height });
      await panel.scrollIntoViewIfNeeded();
      await page.waitForTimeout(150);
      await shot(page, `sweeps-temp-${width}x${height}.png`);
    }
    expect(page.problems).toEqual([]);
    await page.close();
  });

  it('explains how to ask for a sweep when the netlist has none', async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR.replace(/^analyze (vary|temp).*\n/gm, ''));
    await waitForPainted(page);
    await page.getByRole('tab', { name: 'Other analyses' }).click();
    const notice = page.locator('nw-sweeps-panel nw-panel-notice');
    await notice.waitFor();
    expect(await notice.textContent()).toContain('analyze temp over -40 27 125');
    expect(await notice.locator('code').textContent()).toMatch(/^analyze vary \w+ over v1 v2 v3$/);
    await shot(page, 'sweeps-none-1280x800.png');
    expect(page.problems).toEqual([]);
    await page.close();
  });
});
