/**
 * The Transfer tab in a real browser — a differential pair swept ±100 mV: its curves, the linear
 * input range marked, the cursor reading values, the exports — and the plots sized from their
 * panel, with labels clear of each other and lean SVG files; screenshots of the Transfer,
 * Response and Modes tabs at 1280×800 and 1920×1080 land in test-results/ to look at.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
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
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(gnd, vee) 10 V
va: vsrc(ina, gnd) 0 ac=1
vb: vsrc(inb, gnd) 0
rc1: res(vcc, outa) 5k
rc2: res(vcc, outb) 5k
cl1: cap(outa, gnd) 10p
cl2: cap(outb, gnd) 10p
q1: npn(c=outa, b=ina, e=tail) qn
q2: npn(c=outb, b=inb, e=tail) qn
rt: res(tail, vee) 4.65k
ports in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
analyze transfer va from -100m to 100m step 1m
measure f3 = corner(adm)
measure fu = unity(adm)
`;

type Watched = WatchedPage;

/** A page on the bench that records uncaught errors and console errors (a ResizeObserver loop among them). */
function openBench(query = ''): Promise<Watched> {
  return openWatchedBench(browser.context, inject('baseUrl') + '/bench' + query);
}

const shot = (page: Page, name: string) => page.screenshot({ path: join(RESULTS_DIR, name) });

async function download(page: Page, button: Locator): Promise<{ name: string; bytes: Buffer }> {
  const [file] = await Promise.all([page.waitForEvent('download'), button.click()]);
  return { name: file.suggestedFilename(), bytes: readFileSync((await file.path())!) };
}

/** Boxes of the plot's marker labels and cursor label, as laid out by the browser. */
async function labelBoxes(plot: Locator): Promise<Array<{ text: string; x: number; y: number; width: number; height: number }>> {
  return plot.locator('.marker-label, .cursor-label').evaluateAll((els) => els.map((el) => {
    const r = el.getBoundingClientRect();
    return { text: el.textContent ?? '', x: r.x, y: r.y, width: r.width, height: r.height };
  }));
}

function overlapping(boxes: ReadonlyArray<{ text: string; x: number; y: number; width: number; height: number }>): string[] {
  const out: string[] = [];
  for (const [i, a] of boxes.entries()) {
    for (const b of boxes.slice(i + 1)) {
      if (a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height) out.push(`${a.text} / ${b.text}`);
    }
  }
  return out;
}

describe('the Transfer tab', () => {
  it('plots the swept pair with its linear range marked, reads values with the cursor and exports', async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    await page.getByRole('tab', { name: 'Transfer' }).click();
    const panel = page.locator('nw-transfer-panel');
    const plot = panel.locator('nw-xy-plot');
    await plot.locator('path.curve').first().waitFor();
    expect(await plot.locator('path.curve').evaluateAll((ps) => ps.map((p) => p.getAttribute('data-key'))))
      .toEqual(['vod', 'v(outa)', 'v(outb)', 'i(rc1)', 'i(rc2)']);
    // The range: 2V_T·atanh(√0.1) ≈ 16.9 mV either side for an ideal pair; this one's emitters
    // share a 4.65 kΩ tail, which widens it slightly (see transfer/linear-range.spec.ts).
    const bandLabel = (await plot.locator('.label-range').textContent())!;
    expect(bandLabel).toMatch(/^linear ±1[6-9]\.\d mV \(slope ≥ 90 % of peak\)$/);
    expect(await plot.locator('rect.band').count()).toBe(2);
    expect(await panel.locator('.range').textContent()).toContain('slope at least 90 % of its peak');

    const svg = plot.locator('svg.plot');
    const box = (await svg.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.3);
    await expect.poll(() => plot.locator('.readout .at').textContent()).toMatch(/^va = -?[\d.]+ mV$/);
    expect(await plot.locator('.readout .row').count()).toBe(5);
    expect(await plot.locator('.readout .extra').textContent()).toMatch(/^slope of vod: \d+ % of peak$/);
    expect(await plot.locator('g.cursor line.cursor-line').count()).toBe(1);
    expect(overlapping(await labelBoxes(plot))).toEqual([]);
    await plot.locator('.surface').focus();
    await page.keyboard.press('End');
    await expect.poll(() => plot.locator('.readout .at').textContent()).toBe('va = 100.0 mV');

    const files = panel.locator('nw-export-bar');
    const svgFile = await download(page, files.getByRole('button', { name: 'Export the plot as SVG' }));
    expect(svgFile.name).toBe('swept-pair-transfer.svg');
    const svgText = svgFile.bytes.toString('utf8');
    expect(svgText).toContain('linear ±');
    expect(svgText).not.toMatch(/_ngcontent|ng-reflect|cursor-label"| style="/);
    const png = await download(page, files.getByRole('button', { name: 'Export the plot as PNG' }));
    expect(png.bytes.subarray(1, 4).toString('latin1')).toBe('PNG');
    expect(png.bytes.readUInt32BE(16)).toBe(Math.round(box.width) * 2);
    const csv = await download(page, files.getByRole('button', { name: /export every curve as CSV/ }));
    expect(csv.name).toBe('swept-pair-transfer-all.csv');
    const lines = csv.bytes.toString('utf8').trim().split('\r\n');
    const header = lines[0].split(',');
    expect(header.slice(0, 2)).toEqual(['va_v', 'vod_v']);
    // Every curve, constant ones too.
    for (const key of ['v(vcc)_v', 'v(outa)_v', 'i(rc1)_a', 'i(rt)_a', 'i(cl1)_a']) expect(header).toContain(key);
    expect(lines.length).toBe(201 + 1);
    expect(lines[101].split(',')[0]).toBe('0');
    await shot(page, 'transfer-1280.png');
    expect(page.problems).toEqual([]);
    await page.close();
  });

  it('sizes the plots from their panel at 1920×1080 and keeps the demo Bode plot’s SVG under 30 kB', async () => {
    const page = await openBench('?example=resistor-tail');
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.getByRole('tab', { name: 'Response' }).click();
    const response = page.locator('nw-response-panel');
    const plot = response.locator('nw-bode-plot');
    await plot.locator('path.curve').first().waitFor();
    const body = page.locator('.mat-mdc-tab-body-active .mat-mdc-tab-body-content');
    // The plot grows to the panel's foot: no more than a help line and padding are left below it.
    await expect.poll(async () => {
      const panelBox = (await body.boundingBox())!;
      const svgBox = (await plot.locator('svg.plot').boundingBox())!;
      return panelBox.y + panelBox.height - (svgBox.y + svgBox.height);
    }).toBeLessThan(40);
    expect((await plot.locator('svg.plot').boundingBox())!.height).toBeGreaterThan(450);
    const svgBox = (await plot.locator('svg.plot').boundingBox())!;
    await page.mouse.move(svgBox.x + svgBox.width * 0.7, svgBox.y + svgBox.height * 0.2);
    expect(overlapping(await labelBoxes(plot))).toEqual([]);

    const svgFile = await download(page, response.getByRole('button', { name: 'Export the plot as SVG' }));
    const text = svgFile.bytes.toString('utf8');
    console.log(`demo Bode plot SVG: ${svgFile.bytes.length} bytes at ${Math.round(svgBox.width)}×${Math.round(svgBox.height)} px`);
    expect(svgFile.bytes.length).toBeLessThan(30_000);
    expect(text).not.toMatch(/_ngcontent|_nghost|ng-reflect| style="/);
    expect(text.match(/<style>/g)?.length).toBe(1);
    const all = await download(page, response.getByRole('button', { name: /export every curve as CSV/ }));
    expect(all.bytes.toString('utf8').split('\r\n')[0]).toContain('ac(vcc)_mag_db');
    expect(page.problems).toEqual([]);
    await page.close();
  });

  it('shows the Transfer, Response and Modes tabs at 1280×800 and 1920×1080 for the screenshots', { timeout: 120_000 }, async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    for (const [width, height] of [[1280, 800], [1920, 1080]]) {
      await page.setViewportSize({ width, height });
      for (const tab of ['Transfer', 'Response', 'Modes']) {
        await page.getByRole('tab', { name: tab }).click();
        // The panel's own element, not "the active tab body": while the tabs slide, the body that is
        // leaving is still marked active for a frame and its plot then vanishes under the locator.
        const plot = page.locator(`nw-${tab.toLowerCase()}-panel svg.plot`).first();
        await plot.locator('path.curve').first().waitFor({ state: 'visible' });
        await expect.poll(async () => (await plot.boundingBox())?.height ?? 0).toBeGreaterThan(0);
        const b = (await plot.boundingBox())!;
        // Plots keep a readable height on the laptop, and fill the tall screen.
        expect(b.height).toBeGreaterThanOrEqual(220);
        await page.mouse.move(b.x + b.width * 0.62, b.y + b.height * 0.35);
        await page.waitForTimeout(150);
        expect(overlapping(await labelBoxes(page.locator(`nw-${tab.toLowerCase()}-panel`)))).toEqual([]);
        await shot(page, `transfer-tabs-${tab.toLowerCase()}-${width}x${height}.png`);
      }
    }
    // The CMRR plot exports too.
    const modes = page.locator('nw-modes-panel');
    const cmrr = await download(page, modes.getByRole('button', { name: 'CSV: export the curves' }));
    expect(cmrr.name).toBe('swept-pair-cmrr.csv');
    expect(cmrr.bytes.toString('utf8').split('\r\n')[0]).toBe('freq_hz,cmrr_mag_db,cmrr_phase_deg');
    expect(page.problems).toEqual([]);
    await page.close();
  });

  it('explains how to ask for a transfer curve when the netlist has none', async () => {
    const page = await openBench('?example=resistor-tail');
    // A netlist without `analyze transfer` has no Transfer tab: the how-to waits under "Other analyses".
    expect(await page.getByRole('tab', { name: 'Transfer' }).count()).toBe(0);
    await page.getByRole('tab', { name: 'Other analyses' }).click();
    const notice = page.locator('nw-transfer-panel nw-panel-notice');
    await notice.waitFor();
    expect(await notice.textContent()).toContain('analyze transfer SOURCE from START to STOP step STEP');
    // The demo's inputs sit at 2.5 V of common mode: the suggested sweep is centred there.
    expect(await notice.locator('code').textContent()).toBe('analyze transfer va from 2.4 to 2.6 step 1m');
    await page.close();
  });
});
