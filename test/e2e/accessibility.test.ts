/**
 * Accessibility of every main view, checked by axe-core running in the real page (Debian's
 * chromium): the front page, the bench with each results tab (a solved example and a new, empty
 * netlist), the help sheet, the language reference, the sign-in page, and — signed in through the
 * provider's page — the team netlists and the members page. No violation of impact serious or
 * critical may remain; the full list of every impact goes to test-results/accessibility.json.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ROOT } from '../../tools/postgres';
import { launchBrowser, RESULTS_DIR, type Browser } from '../support/browser';
import { editOnLine, focusEditor, replaceNetlist, waitForPainted } from './bench-support';
import { shotBoth, signInThroughPage } from './team-support';

const AXE_SOURCE = readFileSync(join(ROOT, 'node_modules/axe-core/axe.min.js'), 'utf8');

/**
 * Rules we deliberately leave out, each with its reason. Kept empty unless a rule cannot apply
 * to this product; a rule that merely fails is fixed, not listed here.
 */
const EXCLUDED: Record<string, string> = {};

/**
 * Experimental rules we want anyway: a control whose accessible name does not contain its visible
 * text cannot be operated by voice ("click Save" must find the button labelled Save).
 */
const EXTRA_RULES = ['label-content-name-mismatch'];

interface Found {
  id: string;
  impact: string;
  help: string;
  nodes: string[];
}

const report: Record<string, Found[]> = {};

/** Runs axe over the whole page; the CSP forbids injected script tags, so the source is evaluated. */
async function audit(page: Page, name: string): Promise<Found[]> {
  await page.evaluate(() => document.fonts.ready);
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE);
  const rules: Record<string, { enabled: boolean }> = {};
  for (const id of EXTRA_RULES) rules[id] = { enabled: true };
  for (const id of Object.keys(EXCLUDED)) rules[id] = { enabled: false };
  const found = await page.evaluate(async (options) => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Array<{ id: string; impact: string; help: string; nodes: Array<{ target: string[]; html: string; failureSummary?: string }> }> }> } }).axe;
    const result = await axe.run(document, options);
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => `${n.target.join(' ')} ${n.html.slice(0, 160)} — ${(n.failureSummary ?? '').replace(/\s+/g, ' ').slice(0, 300)}`),
    }));
  }, { rules, resultTypes: ['violations'] });
  report[name] = found;
  return found;
}

/** The serious and critical violations, written so a failure names the rule and the elements. */
function serious(found: Found[]): string[] {
  return found.filter((f) => f.impact === 'serious' || f.impact === 'critical').map((f) => `${f.id} (${f.impact}): ${f.help}\n  ${f.nodes.join('\n  ')}`);
}

let browser: Browser;
const base = () => inject('baseUrl');

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  writeFileSync(join(RESULTS_DIR, 'accessibility.json'), JSON.stringify(report, null, 2));
  await browser?.close();
});

/**
 * A pair on a current-source tail (with a megohm across it), so every panel has something to
 * show and the Sources table holds a current source among the voltage sources.
 */
const PAIR = `title  Pair on a current-source tail
model  qn: npn(is=1e-16, beta=100, va=80, cje=1p, cjc=0.5p, tauf=0.3n)
vcc: vsrc(vcc, gnd) 10 V
vee: vsrc(vee, gnd) -10 V
va:  vsrc(ina, gnd) 0 ac=1
vb:  vsrc(inb, gnd) 0
q1:  npn(c=outa, b=ina, e=tail) qn
q2:  npn(c=outb, b=inb, e=tail) qn
it:  isrc(tail, vee) 2m
rto: res(tail, vee) 1M
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
ports in=(va, vb) out=(outa, outb)
analyze ac from 10 Hz to 1 GHz per decade 20
analyze transfer va from -100m to 100m step 2m
measure a0 = db(adm)
measure f3 = corner(adm)
check a0 >= 40
check cmrr_db >= 60
`;

/** A file-name-friendly form of a tab's name. */
const slug = (name: string) => name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');

async function openBench(page: Page, query = '?example=resistor-tail'): Promise<void> {
  await page.goto(`${base()}/bench${query}`);
  await page.locator('.cm-content').waitFor();
  await waitForPainted(page);
}

/** The names of the bench's results tabs, as shown (every tab is checked, whatever is added). */
async function tabNames(page: Page): Promise<string[]> {
  return (await page.getByRole('tab').allTextContents()).map((t) => t.replace(/\s+\d+ fail$/, '').trim());
}

describe('accessibility (axe-core)', { timeout: 90_000 }, () => {
  it('the front page', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${base()}/`);
    await page.locator('h1').first().waitFor();
    expect(serious(await audit(page, 'front page'))).toEqual([]);
    await page.close();
  });

  it('the bench, with each results tab of a solved netlist', async () => {
    const page = await browser.context.newPage();
    await openBench(page);
    await replaceNetlist(page, PAIR);
    await waitForPainted(page);
    const problems: string[] = [];
    for (const tab of await tabNames(page)) {
      await page.getByRole('tab', { name: tab }).click();
      await page.locator('.mat-mdc-tab-body-active div.panel').waitFor();
      problems.push(...serious(await audit(page, `bench: ${tab}`)));
      await shotBoth(page, `view-bench-${slug(tab)}`);
    }
    expect(problems).toEqual([]);
    await page.close();
  });

  it('the bench after New, every panel empty, and with a problem in the list', async () => {
    const page = await browser.context.newPage();
    await openBench(page);
    await page.getByRole('button', { name: 'New netlist' }).click();
    await expect.poll(() => page.locator('.cm-content').textContent()).toContain('Untitled netlist');
    await waitForPainted(page);
    const problems: string[] = [];
    for (const tab of await tabNames(page)) {
      await page.getByRole('tab', { name: tab }).click();
      await page.locator('.mat-mdc-tab-body-active div.panel').waitFor();
      problems.push(...serious(await audit(page, `bench after New: ${tab}`)));
      if (tab === 'Bias') await shotBoth(page, 'view-bench-new-bias');
    }
    await focusEditor(page);
    await page.keyboard.press('Control+End');
    await page.keyboard.insertText('analyze noise\n');
    await page.locator('nw-problems-list li').first().waitFor();
    problems.push(...serious(await audit(page, 'bench with a problem')));
    await shotBoth(page, 'view-bench-problem');
    expect(problems).toEqual([]);
    await page.close();
  });

  it('the bench showing the last result that solved while the circuit has an error', async () => {
    const page = await browser.context.newPage();
    await openBench(page);
    const lines = await page.locator('.cm-line').allTextContents();
    const at = lines.findIndex((l) => /^rca:/.test(l)) + 1;
    expect(at).toBeGreaterThan(0);
    await editOnLine(page, at, ') rc', ') 1meg');
    await waitForPainted(page);
    await page.locator('nw-problems-list li').first().waitFor();
    const problems: string[] = [];
    for (const tab of await tabNames(page)) {
      await page.getByRole('tab', { name: tab }).click();
      await page.locator('.mat-mdc-tab-body-active div.panel').waitFor();
      problems.push(...serious(await audit(page, `bench, stale: ${tab}`)));
    }
    expect(problems).toEqual([]);
    await page.close();
  });

  it('the help sheet', async () => {
    const page = await browser.context.newPage();
    await openBench(page);
    await page.getByRole('button', { name: 'Keyboard shortcuts and help' }).click();
    await page.getByRole('dialog').waitFor();
    expect(serious(await audit(page, 'help sheet'))).toEqual([]);
    await shotBoth(page, 'view-help-sheet');
    await page.close();
  });

  it('the language reference', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${base()}/reference`);
    await page.locator('h1').first().waitFor();
    expect(serious(await audit(page, 'reference'))).toEqual([]);
    await page.close();
  });

  it('the sign-in page', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${base()}/sign-in?next=/bench`);
    await page.locator('h1').waitFor();
    expect(serious(await audit(page, 'sign-in'))).toEqual([]);
    await page.close();
  });

  it('the team netlists and the members page, signed in as an admin', async () => {
    const b = await launchBrowser();
    try {
      const page = await b.context.newPage();
      await signInThroughPage(page, base(), 'ada@strainlab.example', '/netlists');
      await page.locator('h1', { hasText: 'Netlists' }).waitFor();
      await expect.poll(() => page.locator('.filters .count').textContent()).toMatch(/\d/);
      const problems = serious(await audit(page, 'netlists'));
      await page.goto(`${base()}/w/strainlab/admin`);
      await page.locator('h1', { hasText: 'Members' }).waitFor();
      await page.getByRole('table').first().waitFor();
      problems.push(...serious(await audit(page, 'admin')));
      expect(problems).toEqual([]);
    } finally {
      await b.close();
    }
  });
});
