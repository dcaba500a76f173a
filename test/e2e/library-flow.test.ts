/**
 * The block library end to end on the real product, with its own server so it can be stopped: a
 * designer proposes a block from the bench; a reviewer, signed in separately, vets it from the
 * review queue after the checks are re-solved in their browser; the designer uses it by version
 * in a new netlist and reads the figure its check expects; when an admin retires it, the bench
 * warns and one click moves the pin to the newer vetted version; with the server stopped, the
 * netlist still solves from this browser's copy of the block.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { APP_DIST } from '../../tools/build-app';
import { startTeamStack, type RunningStack } from '../../tools/team-stack';
import { launchBrowser, type Browser } from '../support/browser';
import { TeamClient } from '../support/team-client';
import { freshTestDatabase } from '../support/test-database';
import { lineStartingWith, lineText, replaceNetlist, waitForPainted } from './bench-support';
import { shotBoth, signInThroughPage } from './team-support';

let server: RunningStack | undefined;
let url = '';
const browsers: Browser[] = [];
async function freshBrowser(): Promise<Browser> {
  const b = await launchBrowser();
  browsers.push(b);
  return b;
}

beforeAll(async () => {
  const db = await freshTestDatabase('nodewright_test_e2e_library', { seed: true });
  server = await startTeamStack({ databaseUrl: db.url, appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, staticDir: APP_DIST, logLevel: 'warn' });
  url = server.url;
}, 120_000);
afterAll(async () => {
  for (const b of browsers) await b.close().catch(() => undefined);
  await server?.close().catch(() => undefined);
});

async function apiAs(email: string): Promise<TeamClient> {
  const c = new TeamClient(url);
  await c.signIn(email, 'strainlab-demo');
  return c;
}

/** A documented block with its fixture: a divider by two (ratio rb/(ra + rb), Ohm's law). */
const DIVIDER = `#: Divider by two
#: Halves the voltage between in and rail: out = in · rb/(ra + rb).
#: pin in — the driven end
#: pin out — the midpoint
#: pin rail — the other end, usually gnd
#: param ra — upper resistor
#: param rb — lower resistor
#: tags passive, divider

block half_divider(in, out, rail)
  param ra = 10k
  param rb = 10k
  r1: res(in, out) ra
  r2: res(out, rail) rb
end

title  Divider by two, driven from 2 V
vin: vsrc(top, gnd) 2
d1: half_divider(in=top, out=mid, rail=gnd)
measure ratio = v(mid) / v(top)
check ratio = 0.5 ± 0.1%
`;

/** A netlist of the designer's that pins the vetted block (ra = 30k: 10k/(30k + 10k) = 0.25). */
const USER = `title  Quarter from the library
use blocks/half_divider@1
vin: vsrc(top, gnd) 4
d1: half_divider(in=top, out=mid, rail=gnd) ra=30k
measure vmid = v(mid)
check vmid = 1 ± 0.1%
`;

let designer: Page;

describe('the block library, from proposal to use', { timeout: 180_000 }, () => {
  it('a designer proposes the block at the cursor from the bench and submits it with its checks', async () => {
    designer = await (await freshBrowser()).context.newPage();
    await signInThroughPage(designer, url, 'ravi@strainlab.example');
    await designer.locator('.cm-content').waitFor();
    await replaceNetlist(designer, DIVIDER);
    await waitForPainted(designer);
    await designer.getByRole('button', { name: 'Propose block' }).click();
    const dialog = designer.getByRole('dialog');
    await expect.poll(() => dialog.getByLabel('Path (category/name)').inputValue()).toBe('blocks/half_divider');
    await dialog.getByRole('button', { name: 'Propose' }).click();
    await designer.waitForURL(/\/library\/blocks\/half_divider\/1$/, { timeout: 20_000 });
    const submit = designer.getByRole('button', { name: 'Submit v1 for review' });
    await submit.waitFor();
    await submit.click();
    const ravi = await apiAs('ravi@strainlab.example');
    await expect.poll(async () => (await ravi.get('/api/workspaces/strainlab/blocks/blocks/half_divider/versions/1')).body.state, { timeout: 15_000 }).toBe('in_review');
    const v1 = (await ravi.get('/api/workspaces/strainlab/blocks/blocks/half_divider/versions/1')).body;
    expect(v1.checks).toEqual([expect.objectContaining({ pass: true })]);
  });

  it('a reviewer vets it from the queue after their browser re-solved its checks', async () => {
    const mei = await apiAs('mei@strainlab.example');
    const comment = await mei.post('/api/workspaces/strainlab/blocks/blocks/half_divider/versions/1/review', { decision: 'comment', comments: [{ line: 13, text: 'ra and rb at 10k load the source with 50 µA at 1 V: fine for a reference, state it in the summary.' }] });
    expect(comment.status).toBe(200);
    const reviewer = await (await freshBrowser()).context.newPage();
    await signInThroughPage(reviewer, url, 'mei@strainlab.example', '/library/queue');
    await reviewer.getByRole('link', { name: 'Review blocks/half_divider version 1' }).waitFor();
    await shotBoth(reviewer, 'library-queue');
    await reviewer.getByRole('link', { name: 'Review blocks/half_divider version 1' }).click();
    await reviewer.waitForURL(/\/library\/blocks\/half_divider\/1$/);
    // The reviewer's own solve of the check, beside the author's: both pass.
    await expect.poll(() => reviewer.locator('nw-block-checks .summary').textContent(), { timeout: 30_000 }).toContain('every check agrees with the author');
    await shotBoth(reviewer, 'library-review');
    await reviewer.getByRole('button', { name: 'Approve: vetted' }).click();
    await expect.poll(async () => (await mei.get('/api/workspaces/strainlab/blocks/blocks/half_divider/versions/1')).body.state, { timeout: 15_000 }).toBe('vetted');
    await expect.poll(() => reviewer.locator('h1').first().textContent()).toMatch(/blocks\/half_divider.*vetted/i);
    await reviewer.evaluate(() => window.scrollTo(0, 0));
    await shotBoth(reviewer, 'library-block-vetted');
    // The catalogue lists it beside the seed blocks, vetted.
    await reviewer.goto(`${url}/library`);
    await reviewer.getByRole('link', { name: 'blocks/half_divider' }).first().waitFor();
    await shotBoth(reviewer, 'library-catalogue');
  });

  it('the designer uses it by version in a new netlist and reads the figure its check expects', async () => {
    await designer.goto(`${url}/bench`);
    await designer.locator('.cm-content').waitFor();
    await replaceNetlist(designer, USER);
    await waitForPainted(designer);
    await expect.poll(() => designer.locator('.cm-lintRange-error').count()).toBe(0);
    // 4 V · 10k/(30k + 10k) = 1 V, the divider law the block's own check holds at ra = rb.
    await expect.poll(() => designer.locator('nw-results-summary').textContent(), { timeout: 15_000 }).toMatch(/The check passes/);
    await expect.poll(() => designer.locator('nw-problems-list').textContent()).toContain('No problems');
  });

  it('warns when the pin is retired, and one click moves it to the newer vetted version', async () => {
    // Version 2 (rb doubled in the fixture only) proposed, submitted and vetted; version 1 retired.
    const ravi = await apiAs('ravi@strainlab.example');
    const mei = await apiAs('mei@strainlab.example');
    const ada = await apiAs('ada@strainlab.example');
    const base = '/api/workspaces/strainlab/blocks/blocks/half_divider';
    expect((await ravi.post(`${base}/versions`, { source: DIVIDER.replace('title  Divider by two, driven from 2 V', 'title  Divider by two, version 2') })).status).toBe(201);
    expect((await ravi.post(`${base}/versions/2/submit`, { checks: [{ line: 21, text: 'ratio = 0.5 ± 0.1%', pass: true, value: 0.5 }] })).status).toBe(200);
    expect((await mei.post(`${base}/versions/2/review`, { decision: 'approve' })).status).toBe(200);
    expect((await ada.post(`${base}/versions/1/retire`, {})).status).toBe(200);

    await designer.reload();
    await designer.locator('.cm-content').waitFor();
    await waitForPainted(designer);
    const problems = designer.locator('nw-problems-list');
    await expect.poll(() => problems.textContent(), { timeout: 15_000 }).toContain('`blocks/half_divider@1` is retired');
    await shotBoth(designer, 'library-retired-warning');
    await problems.getByRole('button', { name: 'Pin blocks/half_divider at version 2 instead of 1' }).click();
    const useLine = await lineStartingWith(designer, 'use ');
    expect(await lineText(designer, useLine)).toBe('use blocks/half_divider@2');
    await waitForPainted(designer);
    await expect.poll(() => problems.textContent(), { timeout: 15_000 }).toContain('No problems');
    await expect.poll(() => designer.locator('nw-results-summary').textContent()).toMatch(/The check passes/);
  });

  it('still solves the netlist from this browser’s copy of the block with the server stopped', async () => {
    // The service worker holds the app once it has prefetched it (as in the offline bench test).
    await designer.waitForFunction(async () => !!(await navigator.serviceWorker.getRegistration())?.active, undefined, { timeout: 60_000 });
    await designer.waitForFunction(async () => {
      const manifest = await (await fetch('/ngsw.json')).json();
      const want = (manifest.assetGroups as { name: string; urls: string[] }[]).find((g) => g.name === 'app')!.urls.length;
      for (const key of await caches.keys()) {
        if (key.endsWith(':assets:app:cache') && (await (await caches.open(key)).keys()).length >= want) return true;
      }
      return false;
    }, undefined, { timeout: 60_000 });
    await waitForPainted(designer);
    await expect.poll(() => designer.locator('nw-file-bar .save').textContent(), { timeout: 5000 }).toBe('Saved in this browser');
    await server!.close();
    server = undefined;
    expect(await fetch(url + '/api/health').then(() => 'up', () => 'down')).toBe('down');
    await designer.reload();
    await designer.locator('.cm-content').waitFor();
    await expect.poll(() => designer.locator('.cm-content').textContent()).toContain('use blocks/half_divider@2');
    await waitForPainted(designer);
    await expect.poll(() => designer.locator('.cm-lintRange-error').count()).toBe(0);
    await expect.poll(() => designer.locator('nw-results-summary').textContent(), { timeout: 15_000 }).toMatch(/The check passes/);
  });
});
