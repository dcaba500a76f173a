/**
 * Keystroke-to-results-painted latency of the bench, in headless chromium.
 *
 *   npx tsx tools/bench-latency.ts [--edits 20] [--keep-build]
 *
 * Builds the app when stale, serves it statically on a loopback port (the bench needs no API),
 * opens each Strainlab example and makes single-keystroke value edits, each after a pause (the
 * way a designer tweaks a resistor): latency is from the `nw-edit` performance mark (set by the
 * editor at the edit) to the first `nw-painted` mark after it (set by the bench page once the
 * results of that edit are rendered, one animation frame later). It also times bursts of three
 * keystrokes 40 ms apart, measured from the last one, where the debounce applies in full.
 * Prints p50 and p95 per example and over all. A measurement, not a test: nothing fails.
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
const EDITS = Number(args[args.indexOf('--edits') + 1]) > 0 && args.includes('--edits') ? Number(args[args.indexOf('--edits') + 1]) : 20;
const BURSTS = 10;
const PAUSE_MS = 700;

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[rank - 1];
}

async function serveDist(): Promise<{ url: string; close: () => Promise<void> }> {
  const app = express();
  app.use(express.static(APP_DIST, { index: false }));
  app.get('/{*splat}', (_req, res) => res.sendFile(join(APP_DIST, 'index.html')));
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

async function cursorTo(page: Page, line: number, col: number): Promise<void> {
  await page.keyboard.press('Control+Home');
  for (let k = 1; k < line; k++) await page.keyboard.press('ArrowDown');
  await page.keyboard.press('Home');
  for (let k = 1; k < col; k++) await page.keyboard.press('ArrowRight');
}

async function measureExample(page: Page, url: string, id: string): Promise<{ single: number[]; burst: number[] }> {
  await page.goto(`${url}/bench?example=${id}`);
  await page.locator('.cm-content').waitFor();
  await page.waitForFunction(() => performance.getEntriesByName('nw-painted').length > 0, undefined, { timeout: 30_000 });
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
    await cursorTo(page, lineIndex + 1, col);
    await page.keyboard.press('Shift+ArrowRight');
    await page.keyboard.type(k % 2 === 0 ? other : original);
    const ms = await latencyOfLastEdit(page);
    if (k >= 3) single.push(ms); // the first edits warm the JIT and the panels' first renders
  }

  // Bursts: three characters typed into the title, 40 ms apart.
  const burst: number[] = [];
  for (let k = 0; k < BURSTS; k++) {
    await page.waitForTimeout(PAUSE_MS);
    await cursorTo(page, 1, 1);
    await page.keyboard.press('End');
    if (k % 2 === 0) await page.keyboard.type(' v2', { delay: 40 });
    else for (let j = 0; j < 3; j++) await page.keyboard.press('Backspace', { delay: 40 });
    burst.push(await latencyOfLastEdit(page));
  }
  return { single, burst };
}

async function main(): Promise<void> {
  if (!args.includes('--keep-build')) buildApp({ quiet: true });
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
  const rows: string[] = [];
  try {
    const page = await context.newPage();
    for (const example of EXAMPLES) {
      const { single, burst } = await measureExample(page, server.url, example.id);
      all.push(...single);
      allBurst.push(...burst);
      rows.push(`${example.id.padEnd(20)} ${String(single.length).padStart(5)}  ${percentile(single, 50).toFixed(0).padStart(5)}  ${percentile(single, 95).toFixed(0).padStart(5)}   ${percentile(burst, 50).toFixed(0).padStart(9)}  ${percentile(burst, 95).toFixed(0).padStart(9)}`);
    }
  } finally {
    await context.close();
    rmSync(profile, { recursive: true, force: true });
    await server.close();
  }
  console.log('Keystroke → results painted, headless chromium, ms (single edit after a pause; burst of 3 keys 40 ms apart, from the last)');
  console.log(`${'example'.padEnd(20)} edits    p50    p95   burst p50  burst p95`);
  for (const r of rows) console.log(r);
  console.log(`${'all'.padEnd(20)} ${String(all.length).padStart(5)}  ${percentile(all, 50).toFixed(0).padStart(5)}  ${percentile(all, 95).toFixed(0).padStart(5)}   ${percentile(allBurst, 50).toFixed(0).padStart(9)}  ${percentile(allBurst, 95).toFixed(0).padStart(9)}`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
