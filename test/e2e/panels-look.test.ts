/**
 * The result panels in a real browser: the Bode plot's cursor, zoom and exports, the bias flags,
 * the modes figures and the checks — with screenshots in test-results/ to look at.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const PAIR = `title  Resistor-tail pair
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
measure a0 = db(adm)
measure f3 = corner(adm)
measure fu = unity(adm)
check cmrr_db >= 60
check ic(q1) = 1m ± 5%
`;

const TROUBLE = `title  Headroom trouble
model  qn: npn(is=1e-16, beta=100, va=50)
model  mn: nmos(ucox=200u, vth=0.5, lambda=0.05)
vcc: vsrc(vcc, gnd) 5 V
vbias: vsrc(b1, gnd) 0.75
rc: res(vcc, c1) 20k
q1: npn(c=c1, b=b1, e=gnd) qn
vb2: vsrc(b2, gnd) 0.62
rc2: res(vcc, c2) 1.85M
q2: npn(c=c2, b=b2, e=gnd)
vg: vsrc(g1, gnd) 1.5
rd: res(vcc, d1) 20k
m1: nmos(d=d1, g=g1, s=gnd) mn w=10u l=1u
vg3: vsrc(g3, gnd) 0.9
rd3: res(vcc, d3) 10k
m3: nmos(d=d3, g=g3, s=gnd) mn w=10u l=1u
`;

async function openWith(text: string): Promise<Page> {
  const page = await browser.context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  (page as Page & { errors?: string[] }).errors = errors;
  await page.goto(inject('baseUrl') + '/bench');
  await page.locator('.cm-content').waitFor();
  await waitForPainted(page);
  await replaceNetlist(page, text);
  await waitForPainted(page);
  return page;
}

const shot = (page: Page, name: string) => page.screenshot({ path: join(RESULTS_DIR, name) });

describe('the result panels', () => {
  it('reads the Bode plot with the mouse and the keyboard, zooms a box, resets, and exports', async () => {
    const page = await openWith(PAIR);
    await page.getByRole('tab', { name: 'Response' }).click();
    const plot = page.locator('nw-response-panel nw-bode-plot');
    await plot.locator('path.curve').first().waitFor();
    expect(await plot.locator('.marker-corner .marker-label').textContent()).toMatch(/^−3 dB at [\d.]+ MHz$/);
    expect(await plot.locator('.marker-unity .marker-label').textContent()).toMatch(/^0 dB at [\d.]+ MHz$/);

    const svg = plot.locator('svg.plot');
    const box = (await svg.boundingBox())!;
    // The plot fits the results column of a 1280×800 laptop without sideways scrolling.
    expect(box.width).toBeLessThanOrEqual(760);
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.3);
    await expect.poll(() => plot.locator('.readout .freq').textContent()).toMatch(/^f = [\d.]+ [kM]?Hz$/);
    expect(await plot.locator('g.cursor line').count()).toBe(1);
    await shot(page, 'panels-response-cursor.png');

    // Keyboard: focus the plot and step the cursor to the sweep's end.
    await plot.locator('.surface').focus();
    await page.keyboard.press('End');
    await expect.poll(() => plot.locator('.readout .freq').textContent()).toBe('f = 1 GHz');

    // Drag a box over two decades of the magnitude panel: the axis zooms, reset brings it back.
    const x0 = box.x + box.width * 0.45;
    const x1 = box.x + box.width * 0.7;
    await page.mouse.move(x0, box.y + 30);
    await page.mouse.down();
    await page.mouse.move((x0 + x1) / 2, box.y + 80, { steps: 4 });
    await page.mouse.move(x1, box.y + 120, { steps: 4 });
    await page.mouse.up();
    const reset = page.getByRole('button', { name: 'Reset zoom' });
    await expect.poll(() => reset.isEnabled()).toBe(true);
    const zoomedLabels = await plot.locator('.x-labels text').allTextContents();
    expect(zoomedLabels).not.toContain('10 Hz');
    await shot(page, 'panels-response-zoomed.png');
    await reset.click();
    await expect.poll(() => plot.locator('.x-labels text').first().textContent()).toBe('10 Hz');

    // The wheel zooms around the pointer; a double-click resets.
    await page.mouse.move(box.x + box.width * 0.6, box.y + 60);
    await page.mouse.wheel(0, -300);
    await expect.poll(() => reset.isEnabled()).toBe(true);
    await page.mouse.dblclick(box.x + box.width * 0.6, box.y + 60);
    await expect.poll(() => reset.isEnabled()).toBe(false);

    // Turn on a node curve from the legend.
    await page.getByRole('button', { name: 'Show ac(outa)' }).click();
    await expect.poll(() => plot.locator('path.curve[data-key="ac(outa)"]').count()).toBe(2);
    await shot(page, 'panels-response.png');

    const [csv] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export the plotted curves as CSV' }).click()]);
    expect(csv.suggestedFilename()).toBe('resistor-tail-pair-response.csv');
    const lines = readFileSync((await csv.path())!, 'utf8').trim().split('\r\n');
    expect(lines[0]).toBe('freq_hz,adm_mag_db,adm_phase_deg,acm_mag_db,acm_phase_deg,cmrr_mag_db,cmrr_phase_deg,ac(outa)_mag_db,ac(outa)_phase_deg');
    expect(lines.length).toBe(161 + 1);

    const [svgFile] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export the plot as SVG' }).click()]);
    const svgText = readFileSync((await svgFile.path())!, 'utf8');
    expect(svgText).toContain('<svg');
    expect(svgText).not.toContain('cursor-line');
    // The file carries its own legend and the netlist's title.
    expect(svgText).toContain('>Resistor-tail pair</text>');
    expect(svgText).toContain('>ac(outa)</text>');

    const [png] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Export the plot as PNG' }).click()]);
    const pngBytes = readFileSync((await png.path())!);
    writeFileSync(join(RESULTS_DIR, 'panels-export.png'), pngBytes);
    // PNG signature, then the IHDR width: twice the plot's CSS width.
    expect(pngBytes.subarray(1, 4).toString('latin1')).toBe('PNG');
    expect(pngBytes.readUInt32BE(16)).toBe(Math.round(box.width) * 2);
    expect((page as Page & { errors?: string[] }).errors).toEqual([]);
    await page.close();
  });

  it('shows modes figures with definitions and CMRR over frequency', async () => {
    const page = await openWith(PAIR);
    await page.getByRole('tab', { name: 'Modes' }).click();
    const modes = page.locator('nw-modes-panel');
    await modes.locator('path.curve').waitFor();
    const text = (await modes.textContent())!.replace(/\s+/g, ' ');
    expect(text).toContain('vid = va − vb');
    expect(text).toContain('vod = v(outa) − v(outb)');
    await shot(page, 'panels-modes.png');
    await page.close();
  });

  it('flags bias problems with words and symbols, and lists checks with margins', async () => {
    const page = await openWith(TROUBLE);
    await page.getByRole('tab', { name: 'Bias' }).click();
    const bias = page.locator('nw-bias-panel');
    await bias.locator('.problems').waitFor();
    expect(await bias.locator('.problems').textContent()).toMatch(/q1: saturated/);
    expect(await bias.locator('.problems').textContent()).toMatch(/q2: VCE < 0\.3 V/);
    expect(await bias.locator('.problems').textContent()).toMatch(/m1: triode/);
    await shot(page, 'panels-bias.png');

    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    await page.getByRole('tab', { name: /Checks/ }).click();
    const checks = page.locator('nw-checks-panel');
    await checks.locator('.row').first().waitFor();
    expect(await checks.locator('.summary').textContent()).toMatch(/of 2 pass/);
    await shot(page, 'panels-checks.png');
    await page.close();
  });
});
