/**
 * Share links: pinned to the revision current when made, opened without sign-in, stored only as
 * a hash of a 128-bit token, refused when expired or revoked, every opening counted, and the
 * "shared with you" mail carrying a link that works.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

let api: ApiHarness;
let ravi: TeamClient;
let ada: TeamClient;
let mei: TeamClient;
const tag = `s${Date.now().toString(36)}`;

beforeAll(async () => {
  api = await startApi();
  ravi = await api.signedIn('ravi@strainlab.example');
  ada = await api.signedIn('ada@strainlab.example');
  mei = await api.signedIn('mei@strainlab.example');
});
afterAll(async () => {
  await api?.close();
});

async function netlist(text = `title Shared pair ${tag}\n`): Promise<string> {
  const res = await ravi.post('/api/workspaces/strainlab/netlists', { name: `Shared ${tag}`, source: text });
  return res.body.id;
}
const tokenOf = (url: string) => url.split('/s/')[1];

describe('share links', () => {
  it('makes a link pinned to the current revision: later saves do not change what it shows', async () => {
    const id = await netlist('title Version one\n');
    const two = 'title Version two\nuse mirrors/wilson_npn@3\nuse nowhere/no_block@1\n';
    await ravi.put(`/api/netlists/${id}`, { source: two, baseVersion: 1 });
    const made = await ravi.post(`/api/netlists/${id}/shares`, {});
    expect(made.status).toBe(201);
    expect(made.body).toMatchObject({ version: 2, expiresAt: null, url: expect.stringMatching(new RegExp(`^${api.url}/s/[A-Za-z0-9_-]{22}$`)) });
    await ravi.put(`/api/netlists/${id}`, { source: 'title Version three\n', baseVersion: 2 });
    const anonymous = api.client();
    const shared = await anonymous.get(`/api/shared/${tokenOf(made.body.url)}`);
    expect(shared.status).toBe(200);
    expect(shared.body).toMatchObject({ name: `Shared ${tag}`, source: two, version: 2, workspace: { name: 'Strainlab sensor front end' }, author: { name: 'Ravi Lindqvist' }, sharedBy: { name: 'Ravi Lindqvist' } });
    // The pins are read from the revision by the server; the reader gets the sources it has (the
    // seed Wilson mirror, vetted in the demo workspace), not the block the workspace lacks.
    expect(shared.body.libraryPins).toEqual([{ path: 'mirrors/wilson_npn', version: 3 }, { path: 'nowhere/no_block', version: 1 }]);
    expect(shared.body.library).toHaveLength(1);
    expect(shared.body.library[0]).toMatchObject({ path: 'mirrors/wilson_npn', version: 3 });
    expect(shared.body.library[0].source).toContain('block wilson_npn(in, out, rail)');
    expect(shared.headers.get('cache-control')).toBe('no-store');
  });

  it('keeps only the SHA-256 of a 128-bit token, and shows the token in the creation answer only', async () => {
    const id = await netlist();
    const made = await ravi.post(`/api/netlists/${id}/shares`, {});
    const token = tokenOf(made.body.url);
    expect(Buffer.from(token, 'base64url')).toHaveLength(16);
    const [row] = await api.dataSource.query(`SELECT to_jsonb(s) AS row FROM share_links s WHERE id = $1`, [made.body.id]);
    expect(row.row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(row.row)).not.toContain(token);
    const listed = await ravi.get(`/api/netlists/${id}/shares`);
    expect(JSON.stringify(listed.body)).not.toContain(token);
  });

  it('counts each opening and shows the last one to the author', async () => {
    const id = await netlist();
    const made = await ravi.post(`/api/netlists/${id}/shares`, {});
    for (let i = 0; i < 3; i++) expect((await api.client().get(`/api/shared/${tokenOf(made.body.url)}`)).status).toBe(200);
    const [link] = (await ravi.get(`/api/netlists/${id}/shares`)).body.items;
    expect(link).toMatchObject({ id: made.body.id, state: 'active', openCount: 3, lastOpenedAt: expect.any(String), createdBy: { email: 'ravi@strainlab.example' } });
    expect(Date.now() - Date.parse(link.lastOpenedAt)).toBeLessThan(60_000);
  });

  it('refuses an unknown, an expired and a revoked link with 404 and a code that says which', async () => {
    const anonymous = api.client();
    expect((await anonymous.get('/api/shared/AAAAAAAAAAAAAAAAAAAAAA')).body.error.code).toBe('share_not_found');
    expect((await anonymous.get('/api/shared/not-a-token')).status).toBe(404);
    const id = await netlist();
    const soon = new Date(Date.now() + 3600_000).toISOString();
    const expiring = await ravi.post(`/api/netlists/${id}/shares`, { expiresAt: soon });
    expect(expiring.body.expiresAt).toBe(soon);
    expect((await anonymous.get(`/api/shared/${tokenOf(expiring.body.url)}`)).status).toBe(200);
    await api.dataSource.query(`UPDATE share_links SET expires_at = now() - interval '1 minute' WHERE id = $1`, [expiring.body.id]);
    const expired = await anonymous.get(`/api/shared/${tokenOf(expiring.body.url)}`);
    expect(expired.status).toBe(404);
    expect(expired.body.error.code).toBe('share_expired');
    const revocable = await ravi.post(`/api/netlists/${id}/shares`, {});
    expect((await ravi.delete(`/api/shares/${revocable.body.id}`)).status).toBe(204);
    const revoked = await anonymous.get(`/api/shared/${tokenOf(revocable.body.url)}`);
    expect(revoked.status).toBe(404);
    expect(revoked.body.error.code).toBe('share_revoked');
    const states = (await ravi.get(`/api/netlists/${id}/shares`)).body.items.map((s: { id: string; state: string }) => [s.id, s.state]);
    expect(states).toEqual(expect.arrayContaining([[expiring.body.id, 'expired'], [revocable.body.id, 'revoked']]));
  });

  it('stops working when its netlist is deleted', async () => {
    const id = await netlist();
    const made = await ravi.post(`/api/netlists/${id}/shares`, {});
    await ravi.delete(`/api/netlists/${id}`);
    expect((await api.client().get(`/api/shared/${tokenOf(made.body.url)}`)).body.error.code).toBe('share_revoked');
  });

  it('refuses an expiry in the past and a malformed one', async () => {
    const id = await netlist();
    expect((await ravi.post(`/api/netlists/${id}/shares`, { expiresAt: '2020-01-01T00:00:00Z' })).status).toBe(400);
    const bad = await ravi.post(`/api/netlists/${id}/shares`, { expiresAt: 'next tuesday' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('body.expiresAt');
  });

  it('lists a designer’s own links, and all of them to an admin, who may revoke any', async () => {
    const id = await netlist();
    await ravi.post(`/api/netlists/${id}/shares`, {});
    const meis = await mei.post(`/api/netlists/${id}/shares`, {});
    expect((await ravi.get(`/api/netlists/${id}/shares`)).body.items).toHaveLength(1);
    expect((await ada.get(`/api/netlists/${id}/shares`)).body.items).toHaveLength(2);
    expect((await ravi.delete(`/api/shares/${meis.body.id}`)).status).toBe(403);
    expect((await ada.delete(`/api/shares/${meis.body.id}`)).status).toBe(204);
  });

  it('mails "shared with you" in plain text and HTML, with an absolute link that opens the shared netlist', async () => {
    const id = await netlist('title Mailed pair\n');
    const to = `reviewer-${tag}@partner.example`;
    const made = await ravi.post(`/api/netlists/${id}/shares`, { notify: [to] });
    expect(made.body.notified).toEqual([to]);
    const [mail] = await api.mailTo(to);
    expect(mail.subject).toBe(`Ravi Lindqvist shared “Shared ${tag}” with you`);
    expect(mail.text).toContain(made.body.url);
    expect(mail.html).toContain(`href="${made.body.url}"`);
    // The link is the app's page; the page reads the netlist through the API without a session.
    const page = await api.client().get(new URL(made.body.url).pathname);
    expect([200, 404]).toContain(page.status); // no built app in this stack: the API alone answers
    const shared = await api.client().get(`/api/shared/${tokenOf(made.body.url)}`);
    expect(shared.body.source).toBe('title Mailed pair\n');
  });
});
