/**
 * Keystroke-to-results-painted latency of the bench, in headless chromium.
 *
 *   npx tsx tools/bench-latency.ts [--edits 20] [--keep-build] [--dist DIR] [--large 20] [--append LINE]
 *
 * Builds the app when stale, serves it statically on a loopback port (the bench needs no API),
 * opens each Strainlab example and makes single-keystroke value edits, each after a pause (the
 * way a designer tweaks a resistor): latency is from the `nw-edit` performance mark (set by the
 * editor at the edit) to the first `nw-painted` mark after it (set by the bench page once the
 * results of that edit are rendered, one animation frame later). It also times bursts of three
 * keystrokes 40 ms apart, measured from the last one. While it types, a PerformanceObserver
 * records the main thread's long tasks (over 50 ms): the longest one shows whether the page stays
 * responsive while results render. Prints p50 and p95 per example and over all, and the longest
 * task. `--large N` adds a generated netlist of N resistor-tail pairs (tables of a few hundred
 * rows), to see that a large result renders without long tasks; `--append LINE` adds a line (say
 * `analyze poles`) to each example first, to see what an analysis costs while typing. `--dist` measures another build (say, one of an earlier commit) instead of this one, for a
 * before/after on the same machine at the same time. A measurement, not a test: nothing fails.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import express from 'express';
import { chromium, type Page } from 'playwright-core';
import { EXAMPLES } from '../src/app/bench/examples/index';
import { APP_DIST, buildApp } from './build-app';
import { ROOT } from './postgres';

const args = process.argv.slice(2);
const option = (name: string): string | undefined => (args.includes(name) ? args[args.indexOf(name) + 1] : undefined);
const EDITS = Number(option('--edits')) > 0 ? Number(option('--edits')) : 20;
const DIST = option('--dist') ?? APP_DIST;
const LARGE = Number(option('--large')) || 0;
/** A line added to the end of each example before typing (`--append 'analyze poles'`): what an analysis costs live. */
const APPEND = option('--append');

/** N resistor-tail pairs on shared supplies and inputs: a netlist with many rows in every table. */
function manyPairs(n: number): string {
  const lines = ['title  Many pairs', 'param  rc = 8k', 'model  qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)',
    'vcc: vsrc(vcc, gnd) 10 V', 'vee: vsrc(vee, gnd) -10 V', 'va: vsrc(ina, gnd) 0 ac=1', 'vb: vsrc(inb, gnd) 0'];
  for (let k = 0; k < n; k++) {
    lines.push(`q${k}a: npn(c=o${k}a, b=ina, e=t${k}) qn`, `q${k}b: npn(c=o${k}b, b=inb, e=t${k}) qn`,
      `rc${k}a: res(vcc, o${k}a) rc`, `rc${k}b: res(vcc, o${k}b) rc`, `rt${k}: res(t${k}, vee) 9.3k`);
  }
  lines.push('ports in=(va, vb) out=(o0a, o0b)', 'analyze ac from 10 Hz to 1 GHz per decade 10', 'measure a0 = db(adm)', '');
  return lines.join('\n');
}
const BURSTS = 10;
const PAUSE_MS = 700;

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[rank - 1];
}

async function serveDist(): Promise<{ url: string; close: () => Promise<void> }> {
  const app = express();
  app.use(express.static(DIST, { index: false }));
  app.get('/{*splat}', (_req, res) => res.sendFile(join(DIST, 'index.html')));
  const server = await new Promise<ReturnType<typeof app.listen>>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise((r) => server.close(() => r())) };
}

/** Waits for the first painted mark after the newest edit and returns edit → painted in ms. */
async function latencyOfLastEdit(page: Page): Promise<number> {
  const handle = await page.waitForFunction(() => {
    const edits = performance.getEntriesByName('nw-edit');
    if (edits.length === 0) return undefined;
    const last = edits[edits.length - 1].startTime;
    const painted = performance.getEntriesByName('nw-painted').find((p) => p.startTime > last);
    return painted ? painted.startTime - last : undefined;
  }, undefined, { timeout: 20_000, polling: 'raf' });
  return (await handle.jsonValue()) as number;
}

/** Records long tasks from page start; `resetLongTasks` forgets those seen so far. */
const OBSERVE_LONG_TASKS = `
  window.__nwLongTasks = [];
  new PerformanceObserver((list) => { for (const e of list.getEntries()) window.__nwLongTasks.push(e.duration); })
    .observe({ type: 'longtask', buffered: true });
`;

async function resetLongTasks(page: Page): Promise<void> {
  await page.evaluate(() => { (window as unknown as { __nwLongTasks: number[] }).__nwLongTasks.length = 0; });
}

async function longTasks(page: Page): Promise<number[]> {
  return page.evaluate(() => [...(window as unknown as { __nwLongTasks: number[] }).__nwLongTasks]);
}

async function cursorTo(page: Page, line: number, col: number): Promise<void> {
  await page.keyboard.press('Control+Home');
  for (let k = 1; k < line; k++) await page.keyboard.press('ArrowDown');
  await page.keyboard.press('Home');
  for (let k = 1; k < col; k++) await page.keyboard.press('ArrowRight');
}

interface Sample { single: number[]; burst: number[]; tasks: number[] }

/** Opens a demo by id, or pastes a netlist's text into the bench. */
async function measureExample(page: Page, url: string, netlist: { id: string } | { text: string }): Promise<Sample> {
  await page.goto('id' in netlist ? `${url}/bench?example=${netlist.id}` : `${url}/bench`);
  await page.locator('.cm-content').waitFor();
  await page.waitForFunction(() => performance.getEntriesByName('nw-painted').length > 0, undefined, { timeout: 30_000 });
  // The service worker's first install fetches and caches the whole app: not while measuring.
  await page.evaluate(() => Promise.race([navigator.serviceWorker?.ready, new Promise((r) => setTimeout(r, 35_000))]));
  // Long tasks are counted from each keystroke until the pause after its results is over, so the
  // moves of the cursor to the next edit (the harness, not a designer typing) do not count.
  const tasks: number[] = [];
  if ('text' in netlist) {
    // A pasted netlist's first results count too: every table is built from nothing.
    await page.locator('.cm-content').click({ position: { x: 8, y: 8 } });
    await page.keyboard.press('Control+A');
    await resetLongTasks(page);
    await page.keyboard.insertText(netlist.text);
    await latencyOfLastEdit(page);
    await page.waitForTimeout(PAUSE_MS);
    tasks.push(...(await longTasks(page)));
  }
  if (APPEND) {
    await page.locator('.cm-content').click({ position: { x: 8, y: 8 } });
    await page.keyboard.press('Control+End');
    await page.keyboard.insertText(`\n${APPEND}\n`);
    await latencyOfLastEdit(page);
    await page.waitForTimeout(PAUSE_MS);
  }
  const id = 'id' in netlist ? netlist.id : 'generated netlist';
  const lines = await page.locator('.cm-line').allTextContents();
  const lineIndex = lines.findIndex((t) => /^param\s+\w+\s*=\s*\d/.test(t));
  if (lineIndex < 0) throw new Error(`${id}: no param line with a number`);
  const col = lines[lineIndex].search(/\d/) + 1;
  const original = lines[lineIndex][col - 1];
  const other = original === '9' ? '8' : String(Number(original) + 1);
  await page.locator('.cm-content').click({ position: { x: 8, y: 8 } });

  const single: number[] = [];
  for (let k = 0; k < EDITS + 3; k++) {
    await page.waitForTimeout(PAUSE_MS);
    if (k > 3) tasks.push(...(await longTasks(page))); // the first edits warm the JIT and the panels' first renders
    await cursorTo(page, lineIndex + 1, col);
    await page.keyboard.press('Shift+ArrowRight');
    await resetLongTasks(page);
    await page.keyboard.type(k % 2 === 0 ? other : original);
    const ms = await latencyOfLastEdit(page);
    if (k >= 3) single.push(ms);
  }

  // Bursts: three characters typed into the title, 40 ms apart.
  const burst: number[] = [];
  for (let k = 0; k < BURSTS; k++) {
    await page.waitForTimeout(PAUSE_MS);
    tasks.push(...(await longTasks(page)));
    await cursorTo(page, 1, 1);
    await page.keyboard.press('End');
    await resetLongTasks(page);
    if (k % 2 === 0) await page.keyboard.type(' v2', { delay: 40 });
    else for (let j = 0; j < 3; j++) await page.keyboard.press('Backspace', { delay: 40 });
    burst.push(await latencyOfLastEdit(page));
  }
  await page.waitForTimeout(PAUSE_MS);
  tasks.push(...(await longTasks(page)));
  return { single, burst, tasks };
}

async function main(): Promise<void> {
  if (!args.includes('--keep-build') && !option('--dist')) buildApp({ quiet: true });
  const server = await serveDist();
  const tmp = join(ROOT, '.tmp');
  mkdirSync(tmp, { recursive: true });
  const profile = mkdtempSync(join(tmp, 'latency-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.NODEWRIGHT_CHROMIUM ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  });
  const all: number[] = [];
  const allBurst: number[] = [];
  const allTasks: number[] = [];
  const rows: string[] = [];
  const row = (name: string, single: number[], burst: number[], tasks: number[]): string =>
    `${name.padEnd(20)} ${String(single.length).padStart(5)}  ${percentile(single, 50).toFixed(0).padStart(5)}  ${percentile(single, 95).toFixed(0).padStart(5)}` +
    `   ${percentile(burst, 50).toFixed(0).padStart(9)}  ${percentile(burst, 95).toFixed(0).padStart(9)}` +
    `   ${String(tasks.length).padStart(10)}  ${(tasks.length ? Math.max(...tasks) : 0).toFixed(0).padStart(7)}`;
  try {
    const page = await context.newPage();
    await page.addInitScript(OBSERVE_LONG_TASKS);
    for (const example of EXAMPLES) {
      const { single, burst, tasks } = await measureExample(page, server.url, { id: example.id });
      all.push(...single);
      allBurst.push(...burst);
      allTasks.push(...tasks);
      rows.push(row(example.id, single, burst, tasks));
    }
    rows.push(row('all', all, allBurst, allTasks));
    if (LARGE > 0) {
      const { single, burst, tasks } = await measureExample(page, server.url, { text: manyPairs(LARGE) });
      rows.push(row(`${LARGE} pairs (generated)`, single, burst, tasks));
    }
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
    await server.close();
  }
  console.log('Keystroke → results painted, headless chromium, ms (single edit after a pause; burst of 3 keys 40 ms apart, from the last);');
  console.log('long tasks: main-thread tasks over 50 ms while typing (count, longest ms)');
  console.log(`${'example'.padEnd(20)} edits    p50    p95   burst p50  burst p95   long tasks  longest`);
  for (const r of rows) console.log(r);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
