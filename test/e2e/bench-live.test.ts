/**
 * The bench in a real browser: typing solves in the worker, the panels show the results, errors
 * are marked on their lines with their hints, checks follow edits, files and drafts work.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { cursorLine, editOnLine, focusEditor, lineText, replaceNetlist, waitForPainted } from './bench-support';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A resistor-loaded npn pair, small enough to type. Line numbers matter to the tests below. */
const PAIR = [
  'title  Typed pair',                                  // 1
  'model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p)', // 2
  'vcc: vsrc(vcc, gnd) 10 V',                           // 3
  'va:  vsrc(ina, gnd) 0 ac=1',                         // 4
  'vb:  vsrc(inb, gnd) 0',                              // 5
  'vee: vsrc(vee, gnd) -10 V',                          // 6
  'q1:  npn(c=outa, b=ina, e=tail) qn',                 // 7
  'q2:  npn(c=outb, b=inb, e=tail) qn',                 // 8
  'rca: res(vcc, outa) 5k',                             // 9
  'rcb: res(vcc, outb) 5k',                             // 10
  'rt:  res(tail, vee) 4.65k',                          // 11
  'ports in=(va, vb) out=(outa, outb)',                 // 12
  'analyze ac from 10 Hz to 1 GHz per decade 20',       // 13
  'measure a0 = db(adm)',                               // 14
  'check a0 >= 40',                                     // 15
  '',
].join('\n');

async function openBench(path = '/bench'): Promise<Page> {
  const page = await browser.context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  (page as Page & { errors?: string[] }).errors = errors;
  await page.goto(inject('baseUrl') + path);
  await page.locator('.cm-content').waitFor();
  await waitForPainted(page);
  return page;
}

/** Lets opening animations and transitions finish before a screenshot. */
async function settle(page: Page): Promise<void> {
  await page.evaluate(() => Promise.all(document.getAnimations().map((a) => a.finished.catch(() => undefined))));
}

async function showTab(page: Page, name: RegExp | string): Promise<void> {
  await page.getByRole('tab', { name }).click();
}

describe('the bench, live', () => {
  it('solves a typed netlist in the worker and shows the bias table and a Bode plot', async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-file-bar .title').textContent()).toContain('Typed pair');

    await showTab(page, 'Bias');
    const bjt = page.getByRole('table', { name: 'Bipolar transistors' });
    await bjt.waitFor();
    const rows = await bjt.locator('tr').allTextContents();
    expect(rows.some((r) => r.includes('q1') && /active/i.test(r))).toBe(true);
    expect(rows.some((r) => r.includes('q2'))).toBe(true);
    // Each side carries about (10 V − 0.7 V)/4.65 kΩ / 2 ≈ 1 mA (common practice, from the netlist).
    expect(rows.find((r) => r.includes('q1'))).toMatch(/(9\d\d|1\.0\d) [µm]A/);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-bias.png') });

    await showTab(page, 'Response');
    const curves = page.locator('nw-bode-plot svg.plot path');
    await expect.poll(() => curves.count()).toBeGreaterThan(2);
    const longest = await curves.evaluateAll((ps) => Math.max(...ps.map((p) => (p.getAttribute('d') ?? '').length)));
    expect(longest).toBeGreaterThan(200);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-response.png') });

    await showTab(page, 'Modes');
    await expect.poll(() => page.locator('nw-modes-panel').textContent()).toMatch(/CMRR/i);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-modes.png') });

    await showTab(page, /Checks/);
    await expect.poll(() => page.locator('nw-checks-panel').textContent()).toContain('a0 >= 40');
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-checks.png') });

    // The page itself never scrolls on a 1280×800 laptop.
    const overflow = await page.evaluate(() => document.documentElement.scrollHeight - window.innerHeight);
    expect(overflow).toBeLessThanOrEqual(0);
    expect((page as Page & { errors?: string[] }).errors).toEqual([]);
    await page.close();
  });

  it('marks an error inline on its line, with its hint on hover and in the problems list', async () => {
    const page = await openBench();
    await replaceNetlist(page, PAIR.replace('rt:  res(tail, vee) 4.65k', 'rt:  res(tail, vee) 4.65meg'));
    await waitForPainted(page);
    const line11 = page.locator('.cm-line').nth(10);
    const squiggle = line11.locator('.cm-lintRange-error');
    await squiggle.waitFor();
    expect(await squiggle.textContent()).toContain('meg');
    // No other line is marked.
    expect(await page.locator('.cm-lintRange-error').count()).toBe(1);

    await squiggle.hover();
    const tooltip = page.locator('.cm-tooltip-lint');
    await tooltip.waitFor();
    expect(await tooltip.textContent()).toMatch(/M for mega/);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-error.png') });

    const problem = page.locator('nw-problems-list button').first();
    expect(await problem.textContent()).toMatch(/line 11/);
    expect(await problem.textContent()).toMatch(/M for mega/);
    await focusEditor(page);
    await page.keyboard.press('Control+Home');
    await problem.click();
    await expect.poll(() => cursorLine(page)).toBe(11);

    // The panels keep the last clean result, marked as such, instead of blanking.
    expect(await page.locator('nw-results-summary').textContent()).toMatch(/last result that solved/);
    await page.close();
  });

  it('turns a check from fail to pass when a value is edited, and a check jumps to its line', async () => {
    const page = await openBench('/bench?example=resistor-tail');
    await showTab(page, /Checks/);
    const checks = page.locator('nw-checks-panel');
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/All 5 checks pass/);

    const rcLine = (await page.locator('.cm-line').allTextContents()).findIndex((t) => t.startsWith('param  rc')) + 1;
    expect(rcLine).toBeGreaterThan(0);
    await editOnLine(page, rcLine, '8k', '4k');
    await waitForPainted(page);
    expect(await lineText(page, rcLine)).toContain('rc = 4k');
    // Halving RC halves adm: 42.6 dB − 6 dB fails `a0 >= 40` (Sedra & Smith, Microelectronic Circuits, 7th ed., differential half circuit: adm = −gm·RC, from memory).
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/1 of 5 checks fail/);
    const failing = checks.locator('.row.failing');
    await expect.poll(() => failing.count()).toBe(1);
    expect(await failing.textContent()).toContain('a0 >= 40');

    await editOnLine(page, rcLine, '4k', '9k');
    await waitForPainted(page);
    await expect.poll(() => page.locator('nw-results-summary').textContent()).toMatch(/All 5 checks pass/);
    expect(await checks.locator('.row.failing').count()).toBe(0);

    // Clicking a check puts the editor cursor on its line.
    const row = checks.locator('.row', { hasText: 'cmrr_db >= 30' });
    await row.click();
    const checkLine = (await page.locator('.cm-line').allTextContents()).findIndex((t) => t.startsWith('check   cmrr_db')) + 1;
    await expect.poll(() => cursorLine(page)).toBe(checkLine);
    await page.close();
  });

  it('keeps the netlist as a draft across a reload, opens a file and downloads the netlist', async () => {
    const page = await openBench('/bench?example=mirrored-tail');
    await replaceNetlist(page, PAIR.replace('Typed pair', 'Kept across reload'));
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 5000 }).toBe('Saved in this browser');
    await page.goto(inject('baseUrl') + '/bench');
    await page.locator('.cm-content').waitFor();
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('Kept across reload');

    await page.locator('nw-file-bar input[type=file]').setInputFiles({ name: 'bridge.nwl', mimeType: 'text/plain', buffer: Buffer.from(PAIR.replace('Typed pair', 'From a file')) });
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('From a file');
    await waitForPainted(page);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download the netlist' }).click()]);
    expect(download.suggestedFilename()).toBe('bridge.nwl');
    const saved = readFileSync((await download.path())!, 'utf8');
    expect(saved).toBe(PAIR.replace('Typed pair', 'From a file'));

    await page.getByRole('button', { name: 'Drafts kept in this browser' }).click();
    const dialog = page.getByRole('dialog');
    await expect.poll(() => dialog.textContent()).toContain('Kept across reload');
    expect(await dialog.textContent()).toContain('From a file');
    await settle(page);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-drafts.png') });
    await dialog.getByRole('button', { name: /^Open Kept across reload/ }).click();
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('Kept across reload');
    await page.close();
  });

  it('shows progress with a cancel button for a long solve, and the page stays responsive', async () => {
    const page = await openBench();
    // 18 001 frequency points over a 40-section RC ladder: seconds of work, well past the 300 ms threshold.
    const ladder = Array.from({ length: 40 }, (_, k) => `rl${k}: res(${k === 0 ? 'outa' : `l${k - 1}`}, l${k}) 1k\ncl${k}: cap(l${k}, gnd) 1p`).join('\n');
    await replaceNetlist(page, PAIR.replace('per decade 20', 'per decade 2000').replace('from 10 Hz', 'from 1 Hz') + ladder + '\n');
    const summary = page.locator('nw-results-summary');
    await page.getByRole('button', { name: 'Cancel the solve' }).waitFor({ timeout: 10_000 });
    expect(await summary.textContent()).toContain('Solving…');
    expect(await page.locator('mat-progress-bar').count()).toBe(1);
    // The main thread is free while the worker solves: a frame comes within a few tens of ms.
    const frameMs = await page.evaluate(() => new Promise<number>((r) => { const t = performance.now(); requestAnimationFrame(() => r(performance.now() - t)); }));
    expect(frameMs).toBeLessThan(100);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-solving.png') });
    await page.getByRole('button', { name: 'Cancel the solve' }).click();
    await expect.poll(() => summary.textContent()).toMatch(/Solve cancelled/);
    expect(await page.locator('mat-progress-bar').count()).toBe(0);
    await page.close();
  });

  it('shows the keyboard shortcuts on F1 and completes pin names', async () => {
    const page = await openBench('/bench?example=resistor-tail');
    await focusEditor(page);
    await page.keyboard.press('F1');
    const dialog = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
    await dialog.waitFor();
    expect(await dialog.textContent()).toContain('Solve now');
    await settle(page);
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-help.png') });
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'detached' });

    await page.keyboard.press('Control+End');
    await page.keyboard.type('\nq9: npn(');
    const list = page.locator('.cm-tooltip-autocomplete');
    await list.waitFor();
    expect(await list.locator('li').allTextContents()).toEqual(expect.arrayContaining([expect.stringMatching(/^c=/), expect.stringMatching(/^b=/), expect.stringMatching(/^e=/)]));
    await page.screenshot({ path: join(RESULTS_DIR, 'bench-completion.png') });
    await page.close();
  });
});
