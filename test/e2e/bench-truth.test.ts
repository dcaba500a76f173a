/**
 * The bench never shows a stale green: the panels show the current text's results whenever its
 * circuit solves (a broken request line drops that request only), fall back on the last result
 * that solved only when the circuit itself does not, and then — as after a cancel — mark every
 * figure as from an earlier version, with no pass in green. And nothing typed is lost to a reload.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { solveNetlist } from '../../solver';
import type { BjtOp } from '../../solver/result';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { appendLine, editOnLine, lineStartingWith, pasteNetlist, replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A resistor-loaded npn pair whose `vq1 > 3` check turns from pass to fail when RC grows. */
const PAIR = [
  'title  Truth pair',
  'model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p)',
  'vcc: vsrc(vcc, gnd) 10 V',
  'va:  vsrc(ina, gnd) 0 ac=1',
  'vb:  vsrc(inb, gnd) 0',
  'vee: vsrc(vee, gnd) -10 V',
  'q1:  npn(c=outa, b=ina, e=tail) qn',
  'q2:  npn(c=outb, b=inb, e=tail) qn',
  'rca: res(vcc, outa) 5k',
  'rcb: res(vcc, outb) 5k',
  'rt:  res(tail, vee) 4.65k',
  'ports in=(va, vb) out=(outa, outb)',
  'analyze ac from 10 Hz to 1 GHz per decade 20',
  'measure a0 = db(adm)',
  'measure vq1 = vce(q1)',
  'check a0 >= 40',
  'check vq1 > 3',
  '',
].join('\n');

const STALE_NOTE = 'These figures are from an earlier version of the netlist';

async function openBench(path: string): Promise<Page> {
  const page = await browser.context.newPage();
  await page.goto(inject('baseUrl') + path);
  await page.locator('.cm-content').waitFor();
  await waitForPainted(page);
  return page;
}

/** A bench showing PAIR solved, with both its checks passing. */
async function openPair(): Promise<Page> {
  const page = await openBench('/bench');
  await replaceNetlist(page, PAIR);
  await waitForPainted(page);
  await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/All 2 checks pass/);
  return page;
}

/** The text of the bipolar table's row for a device. */
async function bjtRow(page: Page, name: string): Promise<string> {
  const rows = await page.getByRole('table', { name: 'Bipolar transistors' }).locator('tbody tr').allTextContents();
  const row = rows.find((r) => r.trim().startsWith(name));
  if (!row) throw new Error(`no row for ${name}: ${rows.join(' | ')}`);
  return row.replace(/\s+/g, ' ');
}

/** Green pass chips anywhere in the results (summary verdict or tags in any open panel). */
async function greenPasses(page: Page): Promise<number> {
  return page.locator('nw-results-panels .verdict.pass, nw-results-panels .tag.pass').count();
}

describe('the bench shows the current text\'s results', () => {
  it('shows the new VCE and the new pass/fail when a value changes while a measure line is broken', async () => {
    const page = await openPair();
    const summary = page.locator('nw-results-summary');

    // A half-written measure first, then 5k → 9k on the collector load of q1.
    await appendLine(page, 'measure broken = vce(q9)');
    await waitForPainted(page);
    await editOnLine(page, await lineStartingWith(page, 'rca:'), '5k', '9k');
    await waitForPainted(page);

    // The solver on this very text: the circuit solves, the measure line alone is refused.
    const text = await page.evaluate(() => [...document.querySelectorAll('.cm-line')].map((l) => l.textContent).join('\n'));
    const expected = solveNetlist(text);
    expect(expected.errors.map((e) => e.line)).toEqual([text.split('\n').indexOf('measure broken = vce(q9)') + 1]);
    const q1 = expected.op!.devices['q1'] as BjtOp;
    // VCE = VCC − IC·RC − V(tail): about 10 − 9k·1 mA + 0.7 ≈ 1.7 V, against ≈ 5.7 V at 5k (common practice).
    expect(q1.vce).toBeGreaterThan(1);
    expect(q1.vce).toBeLessThan(3);

    await expect.poll(() => bjtRow(page, 'q1')).toContain(`${q1.vce.toPrecision(3)} V`);
    await expect.poll(() => summary.textContent()).toMatch(/1 of 2 checks fail/);
    expect(await page.locator('.stale-note').count()).toBe(0);
    expect(await page.locator('.panels.stale').count()).toBe(0);
    expect(await page.locator('nw-problems-list').textContent()).toMatch(/q9/);

    await page.getByRole('tab', { name: /Checks/ }).click();
    const failing = page.locator('nw-checks-panel .row.failing');
    await expect.poll(() => failing.count()).toBe(1);
    expect(await failing.textContent()).toContain('vq1 > 3');
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-truth-request-error.png') });
    await page.close();
  });

  it('says q1 and q2 are saturated when the tail resistor is typed in milliohms', async () => {
    const page = await openBench('/bench?example=resistor-tail');
    const summary = page.locator('nw-results-summary');
    await expect.poll(() => summary.textContent()).toMatch(/All 5 checks pass/);
    await expect.poll(() => page.locator('nw-bias-panel').textContent()).toMatch(/All \d+ devices in their intended regions/);

    await editOnLine(page, await lineStartingWith(page, 'param  rt'), '1.8k', '4.65m');
    await waitForPainted(page);

    const bias = page.locator('nw-bias-panel');
    await expect.poll(() => bias.textContent()).toMatch(/q1: saturated/);
    expect(await bias.textContent()).toMatch(/q2: saturated/);
    expect(await bias.textContent()).not.toMatch(/intended regions/);
    expect(await bjtRow(page, 'q1')).toMatch(/saturated/);
    // The problems list and the panel agree, and no green is left from the 1.8k result.
    expect(await page.locator('nw-problems-list').textContent()).toMatch(/q1 is saturated/);
    expect(await summary.textContent()).not.toMatch(/checks pass/);
    expect(await greenPasses(page)).toBe(0);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-truth-saturated.png') });
    await page.close();
  });
});

describe('figures from an earlier version are marked', () => {
  it('marks the panels stale when a long solve is cancelled, with no green chip', async () => {
    const page = await openPair();
    const summary = page.locator('nw-results-summary');
    expect(await greenPasses(page)).toBeGreaterThan(0);

    // 18 001 frequency points over a 40-section RC ladder: seconds of work, well past the 300 ms threshold.
    const ladder = Array.from({ length: 40 }, (_, k) => `rl${k}: res(${k === 0 ? 'outa' : `l${k - 1}`}, l${k}) 1k\ncl${k}: cap(l${k}, gnd) 1p`).join('\n');
    await pasteNetlist(page, PAIR.replace('per decade 20', 'per decade 2000').replace('from 10 Hz', 'from 1 Hz') + ladder + '\n');
    const cancel = page.getByRole('button', { name: 'Cancel the solve' });
    await cancel.waitFor({ timeout: 10_000 });
    await cancel.click();
    await expect.poll(() => summary.textContent()).toMatch(/Solve cancelled/);

    const panels = page.locator('nw-results-panels .panels');
    expect(await panels.getAttribute('class')).toMatch(/\bstale\b/);
    const note = page.locator('nw-results-panels .stale-note');
    expect(await note.textContent()).toContain(STALE_NOTE);
    expect(await panels.getAttribute('aria-describedby')).toBe(await note.getAttribute('id'));
    expect(await summary.textContent()).toMatch(/2 of 2 checks passed in an earlier version/);
    expect(await greenPasses(page)).toBe(0);
    expect(await page.locator('nw-bias-panel .all-good .tag.stale').count()).toBe(1);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-truth-cancelled.png') });

    await page.getByRole('tab', { name: /Checks/ }).click();
    await page.locator('nw-checks-panel .row').first().waitFor();
    expect(await page.locator('nw-checks-panel .tag.stale').count()).toBe(3); // the summary and both rows
    expect(await greenPasses(page)).toBe(0);
    await page.close();
  });

  it('falls back on the last result that solved, marked, when the circuit has an error', async () => {
    const page = await openPair();
    await editOnLine(page, await lineStartingWith(page, 'rt:'), '4.65k', '4.65meg');
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/last result that solved/);
    expect(await page.locator('nw-results-panels .stale-note').textContent()).toContain(STALE_NOTE);
    expect(await greenPasses(page)).toBe(0);
    await page.close();
  });
});

describe('nothing typed is lost', () => {
  it('keeps text typed just before a reload', async () => {
    const page = await openBench('/bench');
    await replaceNetlist(page, PAIR.replace('Truth pair', 'Typed, then reloaded at once'));
    await page.reload();
    await page.locator('.cm-content').waitFor();
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('Typed, then reloaded at once');
    expect(await page.locator('.cm-content').textContent()).toContain('check vq1 > 3');
    await page.close();
  });
});
