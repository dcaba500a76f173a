/**
 * The authorization matrix: every API route, called as anonymous, as each role of the Strainlab
 * workspace and as a member of another workspace (Tidepool), with the status each must get.
 * The server decides; this table is the contract. A route added to the API without a row here
 * fails the last test.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiRoutes } from '../../api/routes';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

const ACTORS = ['anonymous', 'viewer', 'designer', 'reviewer', 'admin', 'outsider'] as const;
type Actor = (typeof ACTORS)[number];
const EMAIL: Record<Exclude<Actor, 'anonymous'>, string> = {
  viewer: 'sam@strainlab.example',
  designer: 'ravi@strainlab.example',
  reviewer: 'mei@strainlab.example',
  admin: 'ada@strainlab.example',
  outsider: 'jon@tidepool.example',
};

let api: ApiHarness;
const clients = {} as Record<Actor, TeamClient>;
let designer: TeamClient;
let admin: TeamClient;
let seq = 0;

beforeAll(async () => {
  api = await startApi();
  for (const actor of ACTORS) {
    clients[actor] = actor === 'anonymous' ? api.client() : await api.signedIn(EMAIL[actor]);
    await clients[actor].get('/api/health'); // every browser holds an XSRF cookie once it has loaded a page
  }
  designer = clients.designer;
  admin = clients.admin;
});
afterAll(async () => {
  await api?.close();
});

/** A workspace netlist owned by the designer, saved twice (versions 1 and 2). */
async function netlist(visibility: 'workspace' | 'private' = 'workspace'): Promise<string> {
  const made = await designer.post('/api/workspaces/strainlab/netlists', { name: `Matrix ${++seq}`, source: `title Matrix ${seq}\n`, visibility });
  expect(made.status).toBe(201);
  expect((await designer.put(`/api/netlists/${made.body.id}`, { source: `title Matrix ${seq} v2\n`, baseVersion: 1 })).status).toBe(200);
  return made.body.id;
}
async function deletedNetlist(): Promise<string> {
  const id = await netlist();
  expect((await designer.delete(`/api/netlists/${id}`)).status).toBe(204);
  return id;
}
async function share(): Promise<{ id: string; token: string; netlist: string }> {
  const id = await netlist();
  const s = await designer.post(`/api/netlists/${id}/shares`, {});
  return { id: s.body.id, token: s.body.url.split('/s/')[1], netlist: id };
}
async function invitation(): Promise<{ id: string; token: string }> {
  const email = `matrix-${++seq}@elsewhere.example`;
  const inv = await admin.post('/api/workspaces/strainlab/invitations', { email, role: 'viewer' });
  expect(inv.status).toBe(201);
  const mail = (await api.mailTo(email))[0];
  return { id: inv.body.id, token: /\/join\/([A-Za-z0-9_-]{22})/.exec(mail.text)![1] };
}
/** A throw-away member of Strainlab (made in SQL: the matrix tests removal, not invitations). */
async function throwawayMember(): Promise<string> {
  const [u] = await api.dataSource.query(`INSERT INTO users (email, display_name) VALUES ($1, 'Matrix Member') RETURNING id`, [`member-${++seq}@strainlab.example`]);
  await api.dataSource.query(`INSERT INTO memberships (user_id, workspace_id, role) SELECT $1, id, 'viewer' FROM workspaces WHERE slug = 'strainlab'`, [u.id]);
  return u.id;
}
async function samId(): Promise<string> {
  return (await api.dataSource.query(`SELECT id FROM users WHERE email = 'sam@strainlab.example'`))[0].id;
}

/** A block of the designer's in the given state; returns its URL below /api/workspaces/strainlab. */
async function block(state: 'draft' | 'in_review' | 'vetted'): Promise<string> {
  const name = `m${++seq}`;
  const source = `model qm: npn(is=1e-16, beta=100)\nblock ${name}(in, out, rail)\n  qa: npn(c=in, b=in, e=rail) qm\n  qb: npn(c=out, b=in, e=rail) qm\nend\n`;
  expect((await designer.post('/api/workspaces/strainlab/blocks', { path: `matrix/${name}`, source })).status).toBe(201);
  const url = `/api/workspaces/strainlab/blocks/matrix/${name}`;
  if (state !== 'draft') expect((await designer.post(`${url}/versions/1/submit`, { checks: [] })).status).toBe(200);
  if (state === 'vetted') expect((await admin.post(`${url}/versions/1/review`, { decision: 'approve' })).status).toBe(200);
  return url;
}
const blockSource = (name: string) => `block ${name}(a, b)\n  r1: res(a, b) 1k\nend\n`;

interface Row {
  route: string; // "METHOD /path" exactly as in the route table
  call: (c: TeamClient) => Promise<{ status: number }>;
  expect: Record<Actor, number>;
}

/** `all(s)` when every actor gets the same; `by(anon, viewer, designer, reviewer, admin, outsider)`. */
const by = (anonymous: number, viewer: number, designer: number, reviewer: number, admin: number, outsider: number): Record<Actor, number> => ({ anonymous, viewer, designer, reviewer, admin, outsider });
const all = (s: number) => by(s, s, s, s, s, s);
const nwl = (name: string, text: string) => new File([text], name, { type: 'text/plain' });

const ROWS: Row[] = [
  { route: 'GET /health', call: (c) => c.get('/api/health'), expect: all(200) },
  { route: 'GET /settings', call: (c) => c.get('/api/settings'), expect: all(200) },
  { route: 'GET /openapi.json', call: (c) => c.get('/api/openapi.json'), expect: all(200) },
  { route: 'GET /me', call: (c) => c.get('/api/me'), expect: by(401, 200, 200, 200, 200, 200) },
  { route: 'GET /workspaces/:slug/netlists', call: (c) => c.get('/api/workspaces/strainlab/netlists'), expect: by(401, 200, 200, 200, 200, 403) },
  { route: 'POST /workspaces/:slug/netlists', call: (c) => c.post('/api/workspaces/strainlab/netlists', { name: 'By role', source: 'title By role\n' }), expect: by(401, 403, 201, 201, 201, 403) },
  {
    route: 'POST /workspaces/:slug/netlists/upload',
    call: (c) => { const f = new FormData(); f.append('files', nwl('upload.nwl', 'title Uploaded\n')); return c.request('POST', '/api/workspaces/strainlab/netlists/upload', { body: f }); },
    expect: by(401, 403, 201, 201, 201, 403),
  },
  { route: 'GET /netlists/:id', call: async (c) => c.get(`/api/netlists/${await netlist()}`), expect: by(401, 200, 200, 200, 200, 404) },
  // A private netlist is its owner's alone: not even an admin reads it.
  { route: 'GET /netlists/:id', call: async (c) => c.get(`/api/netlists/${await netlist('private')}`), expect: by(401, 404, 200, 404, 404, 404) },
  { route: 'PUT /netlists/:id', call: async (c) => c.put(`/api/netlists/${await netlist()}`, { source: 'title Saved\n', baseVersion: 2 }), expect: by(401, 403, 200, 200, 200, 404) },
  { route: 'PATCH /netlists/:id', call: async (c) => c.patch(`/api/netlists/${await netlist()}`, { name: 'Renamed' }), expect: by(401, 403, 200, 200, 200, 404) },
  // Visibility is the owner's choice (the designer owns every matrix netlist).
  { route: 'PATCH /netlists/:id', call: async (c) => c.patch(`/api/netlists/${await netlist()}`, { visibility: 'private' }), expect: by(401, 403, 200, 403, 403, 404) },
  { route: 'DELETE /netlists/:id', call: async (c) => c.delete(`/api/netlists/${await netlist()}`), expect: by(401, 403, 204, 403, 204, 404) },
  { route: 'POST /netlists/:id/restore', call: async (c) => c.post(`/api/netlists/${await deletedNetlist()}/restore`), expect: by(401, 403, 200, 403, 200, 404) },
  { route: 'GET /netlists/:id/revisions', call: async (c) => c.get(`/api/netlists/${await netlist()}/revisions`), expect: by(401, 200, 200, 200, 200, 404) },
  { route: 'GET /netlists/:id/revisions/:version', call: async (c) => c.get(`/api/netlists/${await netlist()}/revisions/1`), expect: by(401, 200, 200, 200, 200, 404) },
  { route: 'GET /netlists/:id/revisions/:version/file', call: async (c) => c.get(`/api/netlists/${await netlist()}/revisions/1/file`), expect: by(401, 200, 200, 200, 200, 404) },
  { route: 'POST /netlists/:id/revisions/:version/restore', call: async (c) => c.post(`/api/netlists/${await netlist()}/revisions/1/restore`, { baseVersion: 2 }), expect: by(401, 403, 200, 200, 200, 404) },
  { route: 'POST /netlists/:id/shares', call: async (c) => c.post(`/api/netlists/${await netlist()}/shares`, {}), expect: by(401, 403, 201, 201, 201, 404) },
  { route: 'GET /netlists/:id/shares', call: async (c) => c.get(`/api/netlists/${await netlist()}/shares`), expect: by(401, 403, 200, 200, 200, 404) },
  // Revoking: the link's creator (the designer) or an admin.
  { route: 'DELETE /shares/:id', call: async (c) => c.delete(`/api/shares/${(await share()).id}`), expect: by(401, 403, 204, 403, 204, 404) },
  { route: 'GET /shared/:token', call: async (c) => c.get(`/api/shared/${(await share()).token}`), expect: all(200) },
  { route: 'GET /workspaces/:slug/members', call: (c) => c.get('/api/workspaces/strainlab/members'), expect: by(401, 200, 200, 200, 200, 403) },
  { route: 'PATCH /workspaces/:slug/members/:userId', call: async (c) => c.patch(`/api/workspaces/strainlab/members/${await samId()}`, { role: 'viewer' }), expect: by(401, 403, 403, 403, 200, 403) },
  { route: 'DELETE /workspaces/:slug/members/:userId', call: async (c) => c.delete(`/api/workspaces/strainlab/members/${await throwawayMember()}`), expect: by(401, 403, 403, 403, 204, 403) },
  { route: 'GET /workspaces/:slug/invitations', call: (c) => c.get('/api/workspaces/strainlab/invitations'), expect: by(401, 403, 403, 403, 200, 403) },
  { route: 'POST /workspaces/:slug/invitations', call: (c) => c.post('/api/workspaces/strainlab/invitations', { email: `role-${++seq}@elsewhere.example`, role: 'viewer' }), expect: by(401, 403, 403, 403, 201, 403) },
  { route: 'DELETE /invitations/:id', call: async (c) => c.delete(`/api/invitations/${(await invitation()).id}`), expect: by(401, 403, 403, 403, 204, 403) },
  { route: 'GET /invitations/:token', call: async (c) => c.get(`/api/invitations/${(await invitation()).token}`), expect: all(200) },
  { route: 'GET /workspaces/:slug/blocks', call: (c) => c.get('/api/workspaces/strainlab/blocks'), expect: by(401, 200, 200, 200, 200, 403) },
  { route: 'POST /workspaces/:slug/blocks', call: (c) => { const n = `p${++seq}`; return c.post('/api/workspaces/strainlab/blocks', { path: `matrix/${n}`, source: blockSource(n) }); }, expect: by(401, 403, 201, 201, 201, 403) },
  { route: 'GET /workspaces/:slug/review-queue', call: (c) => c.get('/api/workspaces/strainlab/review-queue'), expect: by(401, 403, 403, 200, 200, 403) },
  { route: 'GET /workspaces/:slug/blocks/:category/:name', call: async (c) => c.get(await block('draft')), expect: by(401, 200, 200, 200, 200, 403) },
  { route: 'POST /workspaces/:slug/blocks/:category/:name/versions', call: async (c) => { const url = await block('vetted'); return c.post(`${url}/versions`, { source: blockSource(url.split('/').pop()!) }); }, expect: by(401, 403, 201, 201, 201, 403) },
  { route: 'GET /workspaces/:slug/blocks/:category/:name/versions/:version', call: async (c) => c.get(`${await block('draft')}/versions/1`), expect: by(401, 200, 200, 200, 200, 403) },
  // A draft is its author's (the designer's) to edit and submit.
  { route: 'PUT /workspaces/:slug/blocks/:category/:name/versions/:version', call: async (c) => { const url = await block('draft'); return c.put(`${url}/versions/1`, { source: blockSource(url.split('/').pop()!) }); }, expect: by(401, 403, 200, 403, 403, 403) },
  { route: 'POST /workspaces/:slug/blocks/:category/:name/versions/:version/submit', call: async (c) => c.post(`${await block('draft')}/versions/1/submit`, { checks: [] }), expect: by(401, 403, 200, 403, 403, 403) },
  // Vetting: reviewers and admins other than the author.
  { route: 'POST /workspaces/:slug/blocks/:category/:name/versions/:version/review', call: async (c) => c.post(`${await block('in_review')}/versions/1/review`, { decision: 'approve' }), expect: by(401, 403, 403, 200, 200, 403) },
  { route: 'POST /workspaces/:slug/blocks/:category/:name/versions/:version/retire', call: async (c) => c.post(`${await block('vetted')}/versions/1/retire`), expect: by(401, 403, 403, 403, 200, 403) },
  { route: 'GET /workspaces/:slug/library/:category/:name/:version', call: async (c) => c.get((await block('vetted')).replace('/blocks/', '/library/') + '/1'), expect: by(401, 200, 200, 200, 200, 403) },
  { route: 'GET /workspaces/:slug/audit', call: (c) => c.get('/api/workspaces/strainlab/audit'), expect: by(401, 403, 403, 403, 200, 403) },
];

describe('authorization matrix', () => {
  for (const row of ROWS) {
    it(`${row.route} → ${ACTORS.map((a) => `${a} ${row.expect[a]}`).join(', ')}`, async () => {
      const got = {} as Record<Actor, number>;
      for (const actor of ACTORS) got[actor] = (await row.call(clients[actor])).status;
      expect(got).toEqual(row.expect);
    });
  }

  it('covers every route of the API', () => {
    const table = apiRoutes({ ds: api.dataSource, mailer: { send: async () => true, close() {} }, publicUrl: '', devInboxUrl: null, lookupLimiter: (_q, _s, n) => n(), openApi: () => ({}) });
    const routes = new Set(table.map((r) => `${r.method.toUpperCase()} ${r.path}`));
    expect(new Set(ROWS.map((r) => r.route))).toEqual(routes);
  });
});
