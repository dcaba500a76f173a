/**
 * Team netlists over real HTTP on the real PostgreSQL: every save a revision, optimistic
 * concurrency (a stale save gets 409 with the server copy and overwrites nothing), listing with
 * sort/filter/paging, rename, visibility, soft delete and restore, revisions, restore of a
 * revision as a new one, downloads, and history that even SQL cannot rewrite.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

let api: ApiHarness;
let ravi: TeamClient;
let mei: TeamClient;
let ada: TeamClient;
const tag = `n${Date.now().toString(36)}`;

beforeAll(async () => {
  api = await startApi();
  ravi = await api.signedIn('ravi@strainlab.example');
  mei = await api.signedIn('mei@strainlab.example');
  ada = await api.signedIn('ada@strainlab.example');
});
afterAll(async () => {
  await api?.close();
});

const PAIR = `title Resistor-loaded pair ${tag}
vcc: vsrc(vcc, gnd) 10 V
rc: res(vcc, out) 5k
`;

async function create(c: TeamClient, name: string, source = PAIR, visibility?: string) {
  const res = await c.post('/api/workspaces/strainlab/netlists', { name, source, ...(visibility ? { visibility } : {}) });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; version: number };
}

describe('create, read and save', () => {
  it('creates version 1 with its first revision, and reads it back with the text', async () => {
    const made = await create(ravi, `Pair ${tag}`);
    expect(made).toMatchObject({ version: 1, name: `Pair ${tag}`, visibility: 'workspace', workspace: 'strainlab', size: Buffer.byteLength(PAIR), canWrite: true, canDelete: true });
    const read = await mei.get(`/api/netlists/${made.id}`);
    expect(read.status).toBe(200);
    expect(read.body).toMatchObject({ id: made.id, source: PAIR, version: 1, owner: { email: 'ravi@strainlab.example' }, canDelete: false });
  });

  it('keeps every save as a revision (who, when, the text), newest first', async () => {
    const { id } = await create(ravi, `Revised ${tag}`);
    const v2 = await ravi.put(`/api/netlists/${id}`, { source: PAIR + '# two\n', baseVersion: 1 });
    expect(v2.status).toBe(200);
    expect(v2.body.version).toBe(2);
    const v3 = await mei.put(`/api/netlists/${id}`, { source: PAIR + '# three\n', baseVersion: 2, name: `Revised again ${tag}` });
    expect(v3.body).toMatchObject({ version: 3, name: `Revised again ${tag}`, updatedBy: { email: 'mei@strainlab.example' } });
    const revs = await ravi.get(`/api/netlists/${id}/revisions`);
    expect(revs.body.items.map((r: { version: number; author: { email: string } }) => [r.version, r.author.email])).toEqual([
      [3, 'mei@strainlab.example'],
      [2, 'ravi@strainlab.example'],
      [1, 'ravi@strainlab.example'],
    ]);
    const two = await ravi.get(`/api/netlists/${id}/revisions/2`);
    expect(two.body).toMatchObject({ version: 2, source: PAIR + '# two\n' });
    expect((await ravi.get(`/api/netlists/${id}/revisions/9`)).body.error.code).toBe('revision_not_found');
  });

  it('answers a stale save with 409 and the current server copy, and overwrites nothing', async () => {
    const { id } = await create(ravi, `Contested ${tag}`);
    expect((await mei.put(`/api/netlists/${id}`, { source: 'title Mei was first\n', baseVersion: 1 })).status).toBe(200);
    const stale = await ravi.put(`/api/netlists/${id}`, { source: 'title Ravi second\n', baseVersion: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale');
    expect(stale.body.current).toMatchObject({ version: 2, source: 'title Mei was first\n', author: { email: 'mei@strainlab.example' } });
    const now = await ravi.get(`/api/netlists/${id}`);
    expect(now.body).toMatchObject({ version: 2, source: 'title Mei was first\n' });
    // Keeping one's own text means saving it on top of the version now seen.
    const kept = await ravi.put(`/api/netlists/${id}`, { source: 'title Ravi second\n', baseVersion: stale.body.current.version });
    expect(kept.body.version).toBe(3);
    expect((await ravi.get(`/api/netlists/${id}/revisions`)).body.items).toHaveLength(3);
  });

  it('lets exactly one of two simultaneous saves from the same base win', async () => {
    const { id } = await create(ravi, `Race ${tag}`);
    const answers = await Promise.all([ravi, mei, ada].map((c, i) => c.put(`/api/netlists/${id}`, { source: `title Racer ${i}\n`, baseVersion: 1 })));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 409, 409]);
    expect((await ravi.get(`/api/netlists/${id}/revisions`)).body.items.map((r: { version: number }) => r.version)).toEqual([2, 1]);
  });

  it('refuses a text over 256 kB (413) and text with NUL characters (400), storing nothing', async () => {
    const { id } = await create(ravi, `Limits ${tag}`);
    const big = await ravi.put(`/api/netlists/${id}`, { source: `# ${'x'.repeat(256 * 1024)}\n`, baseVersion: 1 });
    expect([413, 400]).toContain(big.status);
    const nul = await ravi.put(`/api/netlists/${id}`, { source: 'title a\u0000b\n', baseVersion: 1 });
    expect(nul.status).toBe(400);
    expect(nul.body.error.code).toBe('not_text');
    expect((await ravi.get(`/api/netlists/${id}`)).body.version).toBe(1);
  });

  it('validates fields at the edge with field-level details', async () => {
    const res = await ravi.post('/api/workspaces/strainlab/netlists', { name: '', source: 42 });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['body.name', 'body.source']);
  });
});

describe('listing', () => {
  it('sorts, filters and pages on the server, with the owner, time and size', async () => {
    for (const n of ['Al', 'Bravo', 'Charlie']) await create(ravi, `${tag}-list ${n}`, `title ${n}\n${'#'.repeat(n.length * 10)}\n`);
    const byName = await mei.get(`/api/workspaces/strainlab/netlists?q=${tag}-list&sort=name&order=asc&pageSize=2`);
    expect(byName.body.total).toBe(3);
    expect(byName.body.items.map((n: { name: string }) => n.name)).toEqual([`${tag}-list Al`, `${tag}-list Bravo`]);
    expect(byName.body.items[0]).toMatchObject({ owner: { name: 'Ravi Lindqvist' }, size: expect.any(Number), updatedAt: expect.any(String) });
    const page2 = await mei.get(`/api/workspaces/strainlab/netlists?q=${tag}-list&sort=name&order=asc&pageSize=2&page=1`);
    expect(page2.body.items.map((n: { name: string }) => n.name)).toEqual([`${tag}-list Charlie`]);
    const bySize = await mei.get(`/api/workspaces/strainlab/netlists?q=${tag}-list&sort=size&order=desc`);
    expect(bySize.body.items.map((n: { name: string }) => n.name)).toEqual([`${tag}-list Charlie`, `${tag}-list Bravo`, `${tag}-list Al`]);
    // LIKE wildcards in the filter are literal.
    expect((await mei.get(`/api/workspaces/strainlab/netlists?q=${tag}-list%25`)).body.total).toBe(0);
    expect((await mei.get('/api/workspaces/strainlab/netlists?sort=colour')).status).toBe(400);
  });

  it('hides a private netlist from everyone but its owner', async () => {
    const { id } = await create(ravi, `Private ${tag}`, PAIR, 'private');
    const mine = await ravi.get(`/api/workspaces/strainlab/netlists?q=Private%20${tag}`);
    expect(mine.body.total).toBe(1);
    for (const other of [mei, ada]) {
      expect((await other.get(`/api/workspaces/strainlab/netlists?q=Private%20${tag}`)).body.total).toBe(0);
      expect((await other.get(`/api/netlists/${id}`)).status).toBe(404);
    }
    // Making it visible to the workspace is the owner's choice.
    expect((await ravi.patch(`/api/netlists/${id}`, { visibility: 'workspace' })).body.visibility).toBe('workspace');
    expect((await mei.get(`/api/netlists/${id}`)).status).toBe(200);
  });
});

describe('rename, delete and restore', () => {
  it('renames without a new revision', async () => {
    const { id } = await create(ravi, `Old name ${tag}`);
    const renamed = await mei.patch(`/api/netlists/${id}`, { name: `  New name ${tag}  ` });
    expect(renamed.body).toMatchObject({ name: `New name ${tag}`, version: 1 });
  });

  it('soft-deletes: gone from the list, listed as deleted for its owner and admins, restorable', async () => {
    const { id } = await create(ravi, `Doomed ${tag}`);
    expect((await mei.delete(`/api/netlists/${id}`)).status).toBe(403);
    expect((await ravi.delete(`/api/netlists/${id}`)).status).toBe(204);
    expect((await mei.get(`/api/netlists/${id}`)).body.error.code).toBe('deleted');
    expect((await ravi.get(`/api/workspaces/strainlab/netlists?q=Doomed%20${tag}`)).body.total).toBe(0);
    for (const [c, n] of [[ravi, 1], [ada, 1], [mei, 0]] as const) {
      expect((await c.get(`/api/workspaces/strainlab/netlists?deleted=true&q=Doomed%20${tag}`)).body.total).toBe(n);
    }
    const restored = await ada.post(`/api/netlists/${id}/restore`);
    expect(restored.body).toMatchObject({ id, deletedAt: null, version: 1 });
    expect((await ravi.post(`/api/netlists/${id}/restore`)).body.error.code).toBe('not_deleted');
  });

  it('refuses to restore after the 30-day window', async () => {
    const { id } = await create(ravi, `Long gone ${tag}`);
    await ravi.delete(`/api/netlists/${id}`);
    await api.dataSource.query(`UPDATE netlists SET deleted_at = now() - interval '31 days' WHERE id = $1`, [id]);
    expect((await ravi.get(`/api/workspaces/strainlab/netlists?deleted=true&q=Long%20gone%20${tag}`)).body.total).toBe(0);
    expect((await ravi.post(`/api/netlists/${id}/restore`)).status).toBe(410);
  });
});

describe('revisions', () => {
  it('restores an old revision as a new one (history is never rewritten), with a stale check', async () => {
    const { id } = await create(ravi, `Restorable ${tag}`, 'title First\n');
    await ravi.put(`/api/netlists/${id}`, { source: 'title Second\n', baseVersion: 1 });
    expect((await ravi.post(`/api/netlists/${id}/revisions/1/restore`, { baseVersion: 1 })).status).toBe(409);
    const restored = await ravi.post(`/api/netlists/${id}/revisions/1/restore`, { baseVersion: 2 });
    expect(restored.body.version).toBe(3);
    expect((await ravi.get(`/api/netlists/${id}`)).body.source).toBe('title First\n');
    const revs = (await ravi.get(`/api/netlists/${id}/revisions`)).body.items;
    expect(revs[0]).toMatchObject({ version: 3, restoredFrom: 1 });
  });

  it('downloads any revision as a .nwl file', async () => {
    const { id } = await create(ravi, `Download me ${tag}`, 'title Download v1\n');
    await ravi.put(`/api/netlists/${id}`, { source: 'title Download v2\n', baseVersion: 1 });
    const file = await mei.get(`/api/netlists/${id}/revisions/1/file`);
    expect(file.status).toBe(200);
    expect(file.text).toBe('title Download v1\n');
    expect(file.headers.get('content-type')).toBe('text/plain; charset=utf-8');
    expect(file.headers.get('content-disposition')).toMatch(new RegExp(`^attachment; filename="?download-me-${tag}-v1\\.nwl"?$`));
  });

  it('cannot be rewritten, even by a direct UPDATE in SQL', async () => {
    const { id } = await create(ravi, `Immutable ${tag}`);
    await expect(api.dataSource.query(`UPDATE netlist_revisions SET source = 'forged' WHERE netlist_id = $1`, [id])).rejects.toThrow(/never changed/);
    await expect(api.dataSource.query(`UPDATE audit_log SET action = 'netlist.forged' WHERE target_id = $1`, [id])).rejects.toThrow(/never changed/);
  });

  it('audits every write with who, what and when', async () => {
    const { id } = await create(ravi, `Audited ${tag}`);
    await ravi.put(`/api/netlists/${id}`, { source: 'title Audited 2\n', baseVersion: 1 });
    await ravi.delete(`/api/netlists/${id}`);
    const log = await ada.get('/api/workspaces/strainlab/audit?pageSize=100');
    const mine = log.body.items.filter((e: { targetId: string }) => e.targetId === id);
    expect(mine.map((e: { action: string; actor: { email: string } }) => [e.action, e.actor.email])).toEqual([
      ['netlist.delete', 'ravi@strainlab.example'],
      ['netlist.save', 'ravi@strainlab.example'],
      ['netlist.create', 'ravi@strainlab.example'],
    ]);
  });
});
