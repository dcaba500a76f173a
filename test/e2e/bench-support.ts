/**
 * Helpers for the bench's browser tests: typing into the CodeMirror editor and waiting for the
 * solve that follows.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { RESULTS_DIR } from '../support/browser';

/**
 * Focuses the editor by clicking near its top left corner (a click on the middle of a long
 * `.cm-content` would make the browser scroll the editor sideways to reach it). On a loaded
 * machine the click has twice been refused for 30 s as "<html> intercepts pointer events" right
 * after sign-in, never reproduced alone; then the editor is focused as a screen reader user's
 * Tab would, a screenshot of the moment is kept in test-results/, and the hit element is logged.
 */
export async function focusEditor(page: Page): Promise<void> {
  const content = page.locator('.cm-content');
  try {
    await content.click({ position: { x: 8, y: 8 }, timeout: 8_000 });
  } catch (error) {
    const hit = await content.evaluate((el) => {
      const r = el.getBoundingClientRect();
      const at = document.elementFromPoint(r.left + 8, r.top + 8);
      return `content at ${Math.round(r.left)},${Math.round(r.top)} ${Math.round(r.width)}×${Math.round(r.height)}; hit ${at?.tagName ?? 'nothing'}.${at?.className ?? ''}`;
    });
    console.warn(`focusEditor: the click was refused (${(error as Error).message.split('\n')[0]}); ${hit}`);
    mkdirSync(RESULTS_DIR, { recursive: true });
    await page.screenshot({ path: join(RESULTS_DIR, `focus-editor-refused-${Date.now()}.png`) }).catch(() => undefined);
    await content.focus();
  }
}

/** Replaces the whole netlist in the editor, as a paste would. */
export async function replaceNetlist(page: Page, text: string): Promise<void> {
  await focusEditor(page);
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Delete');
  await page.keyboard.insertText(text);
}

/** Waits until a result is painted after the newest edit (the bench's performance marks). */
export async function waitForPainted(page: Page): Promise<void> {
  await page.waitForFunction(() => {
    const edits = performance.getEntriesByName('nw-edit');
    const painted = performance.getEntriesByName('nw-painted');
    const lastEdit = edits.length ? edits[edits.length - 1].startTime : -1;
    return painted.some((p) => p.startTime > lastEdit);
  }, undefined, { timeout: 15_000 });
}

/** Puts the cursor on a line of the editor (1-based) at a column (1-based). */
export async function cursorTo(page: Page, line: number, col = 1): Promise<void> {
  await focusEditor(page);
  await page.keyboard.press('Control+Home');
  for (let k = 1; k < line; k++) await page.keyboard.press('ArrowDown');
  await page.keyboard.press('Home');
  for (let k = 1; k < col; k++) await page.keyboard.press('ArrowRight');
}

/** Replaces the first occurrence of `from` on line `line` by `to`, typed as a user would. */
export async function editOnLine(page: Page, line: number, from: string, to: string): Promise<void> {
  const text = await lineText(page, line);
  const at = text.indexOf(from);
  if (at < 0) throw new Error(`line ${line} has no "${from}": ${text}`);
  await cursorTo(page, line, at + 1);
  for (let k = 0; k < from.length; k++) await page.keyboard.press('Shift+ArrowRight');
  await page.keyboard.type(to);
}

/** The text of an editor line (1-based), as rendered. */
export async function lineText(page: Page, line: number): Promise<string> {
  return (await page.locator('.cm-line').nth(line - 1).textContent()) ?? '';
}

/** The line (1-based) the cursor is on. */
export async function cursorLine(page: Page): Promise<number> {
  return page.evaluate(() => {
    const active = document.querySelector('.cm-activeLine');
    const lines = [...document.querySelectorAll('.cm-line')];
    return active ? lines.indexOf(active) + 1 : 0;
  });
}

/** The line (1-based) of the first editor line that starts with `prefix`; throws when there is none. */
export async function lineStartingWith(page: Page, prefix: string): Promise<number> {
  const line = (await page.locator('.cm-line').allTextContents()).findIndex((t) => t.startsWith(prefix)) + 1;
  if (line === 0) throw new Error(`no line starts with "${prefix}"`);
  return line;
}

/** Adds `text` as a new line after the last one, as a paste would (no completion pops up). */
export async function appendLine(page: Page, text: string): Promise<void> {
  await focusEditor(page);
  await page.keyboard.press('Control+End');
  const last = (await page.locator('.cm-line').last().textContent()) ?? '';
  await page.keyboard.insertText(last.trim() === '' ? text : `\n${text}`);
}

/** Replaces the whole netlist in one edit (select all, then paste), so no emptied text is solved between. */
export async function pasteNetlist(page: Page, text: string): Promise<void> {
  await focusEditor(page);
  await page.keyboard.press('Control+A');
  await page.keyboard.insertText(text);
}

/** A bench page that records uncaught errors and console errors. */
export interface WatchedPage extends Page {
  problems: string[];
}

/**
 * Opens `url` (a bench address) in a new page of `context` that records uncaught errors and
 * console errors, after `beforeLoad` (e.g. an init script), and waits for the first results.
 */
export async function openWatchedBench(context: BrowserContext, url: string, beforeLoad?: (page: Page) => Promise<unknown>): Promise<WatchedPage> {
  const page = (await context.newPage()) as WatchedPage;
  page.problems = [];
  page.on('pageerror', (e) => page.problems.push(e.message));
  page.on('console', (m) => {
    // The team server is not asked for in these tests; a refused fetch of it is not a fault of the bench.
    if (m.type() === 'error' && !/Failed to load resource/.test(m.text())) page.problems.push(m.text());
  });
  await beforeLoad?.(page);
  await page.goto(url);
  await page.locator('.cm-content').waitFor();
  await waitForPainted(page);
  return page;
}
