/**
 * The team half in the browser, end to end on the real product: a designer signs in through the
 * identity provider's page, saves a netlist to the team twice (two revisions), shares it; a
 * reader with no session opens the link in a fresh browser and reads the same CMRR; a colleague
 * saves in between, so the designer's next save meets the conflict view and both texts survive;
 * an admin invites a newcomer whose mailed link works.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, type Browser } from '../support/browser';
import { TeamClient } from '../support/team-client';
import { editOnLine, waitForPainted } from './bench-support';
import { cmrrFigure, fillProviderForm, shotBoth, signInThroughPage } from './team-support';

const base = () => inject('baseUrl');
const browsers: Browser[] = [];
async function freshBrowser(): Promise<Browser> {
  const b = await launchBrowser();
  browsers.push(b);
  return b;
}
afterAll(async () => {
  for (const b of browsers) await b.close().catch(() => undefined);
});

/** What the API says about a netlist, read as the designer over HTTP. */
async function apiAs(email: string): Promise<TeamClient> {
  const c = new TeamClient(base());
  await c.signIn(email, 'strainlab-demo');
  await c.get('/api/me');
  return c;
}

let designerPage: Page;
let netlistId = '';
let shareUrl = '';
let authorCmrr = '';
const name = `Mirror-loaded pair ${Date.now().toString(36)}`;

describe('a designer and the team', { timeout: 120_000 }, () => {
  beforeAll(async () => {
    designerPage = await (await freshBrowser()).context.newPage();
  });

  it('signs in through the provider’s page and sees who is signed in', async () => {
    await designerPage.goto(`${base()}/sign-in?next=/bench`);
    await shotBoth(designerPage, 'team-sign-in');
    await signInThroughPage(designerPage, base(), 'ravi@strainlab.example');
    await expect.poll(() => designerPage.locator('.top-bar').textContent()).toContain('Ravi Lindqvist');
  });

  it('saves a netlist to the team, then a second revision', async () => {
    const page = designerPage;
    await page.goto(`${base()}/bench?example=mirror-loaded`);
    await page.locator('.cm-content').waitFor();
    await waitForPainted(page);
    await page.getByRole('button', { name: 'Save to team' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill(name);
    await dialog.getByRole('button', { name: 'Save to team' }).click();
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 15_000 }).toMatch(/Saved to team · v1/);
    const api = await apiAs('ravi@strainlab.example');
    const list = await api.get(`/api/workspaces/strainlab/netlists?q=${encodeURIComponent(name)}`);
    expect(list.body.total).toBe(1);
    netlistId = list.body.items[0].id;

    // A second revision: change the mirror's reference resistor and save with Ctrl-S.
    const lines = await page.locator('.cm-line').allTextContents();
    const lineNo = lines.findIndex((l) => /^param\s+rref\s*=/.test(l)) + 1;
    expect(lineNo).toBeGreaterThan(0);
    await editOnLine(page, lineNo, '9.3k', '9.1k');
    await waitForPainted(page);
    await page.keyboard.press('Control+s');
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 15_000 }).toMatch(/Saved to team · v2/);
    const revs = await api.get(`/api/netlists/${netlistId}/revisions`);
    expect(revs.body.items.map((r: { version: number }) => r.version)).toEqual([2, 1]);
    authorCmrr = await cmrrFigure(page);
    expect(authorCmrr).toMatch(/dB$/);
  });

  it('shares it, and a reader with no session sees the very same CMRR', async () => {
    const page = designerPage;
    await page.getByRole('button', { name: 'Share' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByRole('button', { name: 'Create link' }).click();
    const url = dialog.locator('[data-testid=share-url]');
    await url.waitFor();
    shareUrl = ((await url.textContent()) ?? '').trim();
    expect(shareUrl).toMatch(new RegExp(`^${base()}/s/[A-Za-z0-9_-]{22}$`));
    await shotBoth(page, 'team-share-dialog');
    await page.keyboard.press('Escape');

    const reader = await (await freshBrowser()).context.newPage();
    await reader.goto(shareUrl);
    await reader.locator('.cm-content').waitFor();
    await expect.poll(() => reader.locator('main').textContent(), { timeout: 15_000 }).toContain(name);
    expect(await cmrrFigure(reader)).toBe(authorCmrr);
    await shotBoth(reader, 'team-shared-view');
    // The author sees the opening counted.
    const api = await apiAs('ravi@strainlab.example');
    const [link] = (await api.get(`/api/netlists/${netlistId}/shares`)).body.items;
    expect(link.openCount).toBeGreaterThanOrEqual(1);
  });

  it('meets the conflict view when a colleague saved meanwhile, and both texts survive', async () => {
    // Mei saves a version 3 from her own browser.
    const mei = await (await freshBrowser()).context.newPage();
    await signInThroughPage(mei, base(), 'mei@strainlab.example', '/bench');
    await mei.goto(`${base()}/bench?netlist=${netlistId}`);
    await expect.poll(() => mei.locator('nw-file-bar .save').textContent(), { timeout: 15_000 }).toMatch(/v2/);
    const meiLines = await mei.locator('.cm-line').allTextContents();
    const meiLine = meiLines.findIndex((l) => /^title\s/.test(l)) + 1;
    await editOnLine(mei, meiLine, 'title', 'title  Mei:');
    await mei.keyboard.press('Control+s');
    await expect.poll(() => mei.locator('nw-file-bar .save').textContent(), { timeout: 15_000 }).toMatch(/Saved to team · v3/);

    // Ravi, still on version 2, changes something else and saves.
    const page = designerPage;
    const lines = await page.locator('.cm-line').allTextContents();
    const lineNo = lines.findIndex((l) => /^param\s+rref\s*=/.test(l)) + 1;
    await editOnLine(page, lineNo, '9.1k', '9.15k');
    await page.keyboard.press('Control+s');
    const conflict = page.getByRole('dialog', { name: 'Save conflict' });
    await conflict.waitFor({ timeout: 15_000 });
    const both = (await conflict.textContent()) ?? '';
    expect(both).toContain('Mei:');
    expect(both).toContain('9.15k');
    await shotBoth(page, 'team-conflict');
    await conflict.getByRole('button', { name: 'Keep mine' }).click();
    await expect.poll(() => page.locator('nw-file-bar .save').textContent(), { timeout: 15_000 }).toMatch(/Saved to team · v4/);

    const api = await apiAs('ravi@strainlab.example');
    const v3 = await api.get(`/api/netlists/${netlistId}/revisions/3`);
    const v4 = await api.get(`/api/netlists/${netlistId}/revisions/4`);
    expect(v3.body.source).toContain('Mei:');
    expect(v4.body.source).toContain('9.15k');
  });

  it('lists the team’s netlists in a table', async () => {
    const page = designerPage;
    await page.goto(`${base()}/w/strainlab/netlists`);
    await page.getByRole('row', { name: new RegExp(name) }).waitFor();
    await shotBoth(page, 'team-netlists');
  });
});

describe('an admin and a newcomer', { timeout: 120_000 }, () => {
  it('invites by e-mail, and the mailed link lets the newcomer join', async () => {
    const admin = await (await freshBrowser()).context.newPage();
    await signInThroughPage(admin, base(), 'ada@strainlab.example', '/w/strainlab/admin');
    await admin.getByRole('table', { name: /members/i }).waitFor();
    await shotBoth(admin, 'team-admin');
    await admin.getByRole('tab', { name: /Invitations/i }).click();
    await admin.getByLabel('Email address').fill('noor@strainlab.example');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => admin.locator('main').textContent(), { timeout: 15_000 }).toMatch(/mailed to noor@strainlab\.example/i);

    const inbox = await (await fetch(`${inject('inboxUrl')}api/messages?to=noor@strainlab.example`)).json();
    const link = /https?:\/\/\S+\/join\/[A-Za-z0-9_-]{22}/.exec(inbox.items[0].text)![0];
    expect(inbox.items[0].html).toContain(link);

    const noor = await (await freshBrowser()).context.newPage();
    await noor.goto(link);
    await expect.poll(() => noor.locator('main').textContent(), { timeout: 15_000 }).toMatch(/Strainlab sensor front end/);
    await noor.getByRole('button', { name: 'Sign in to join' }).click();
    await fillProviderForm(noor, 'noor@strainlab.example');
    await noor.waitForURL(/\/netlists/, { timeout: 20_000 });
    await expect.poll(() => noor.locator('.top-bar').textContent()).toContain('Noor Haddad');
    const me = await noor.evaluate(async () => (await fetch('/api/me')).json());
    expect(me.workspaces).toEqual([{ slug: 'strainlab', name: 'Strainlab sensor front end', role: 'designer' }]);
  });
});
