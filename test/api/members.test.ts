/**
 * Members, invitations and the audit log of a workspace, over real HTTP on the real database,
 * with invitation mail read back from the mail fake and accepted through the identity provider.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../api/services/seed';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { TeamClient } from '../support/team-client';

const NOOR = 'noor@strainlab.example';

let api: ApiHarness;
let ada: TeamClient;
let ravi: TeamClient;
let sam: TeamClient;
const ids = new Map<string, string>();

async function userId(email: string): Promise<string> {
  const [row]: { id: string }[] = await api.dataSource.query(`SELECT id FROM users WHERE lower(email) = $1`, [email]);
  return row.id;
}

/** The strainlab role of `email` straight from PostgreSQL (null when not a member). */
async function roleInStrainlab(email: string): Promise<string | null> {
  const rows: { role: string }[] = await api.dataSource.query(
    `SELECT m.role FROM memberships m JOIN users u ON u.id = m.user_id JOIN workspaces w ON w.id = m.workspace_id
     WHERE w.slug = 'strainlab' AND lower(u.email) = $1`,
    [email],
  );
  return rows[0]?.role ?? null;
}

async function setRoleInStrainlab(email: string, role: string): Promise<void> {
  await api.dataSource.query(
    `UPDATE memberships SET role = $2 WHERE user_id = (SELECT id FROM users WHERE lower(email) = $1)
     AND workspace_id = (SELECT id FROM workspaces WHERE slug = 'strainlab')`,
    [email, role],
  );
}

async function removeFromStrainlab(email: string): Promise<void> {
  await api.dataSource.query(
    `DELETE FROM memberships WHERE user_id IN (SELECT id FROM users WHERE lower(email) = $1)
     AND workspace_id = (SELECT id FROM workspaces WHERE slug = 'strainlab')`,
    [email],
  );
}

/** Ada invites `email`; returns the answer and the token read from the mail it sent. */
async function invite(email: string, role: string): Promise<{ id: string; token: string; text: string; html: string }> {
  const res = await ada.post('/api/workspaces/strainlab/invitations', { email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const [mail] = await api.mailTo(email);
  const link = new RegExp(`${api.url.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}/join/([A-Za-z0-9_-]{22})`);
  const token = link.exec(mail.text)?.[1];
  expect(token, mail.text).toBeDefined();
  return { id: res.body.id, token: token!, text: mail.text, html: mail.html ?? '' };
}

async function pendingIds(): Promise<string[]> {
  const res = await ada.get('/api/workspaces/strainlab/invitations');
  expect(res.status).toBe(200);
  return res.body.items.map((i: { id: string }) => i.id);
}

beforeAll(async () => {
  api = await startApi();
  [ada, ravi, sam] = await Promise.all(['ada', 'ravi', 'sam'].map((n) => api.signedIn(`${n}@strainlab.example`)));
  for (const n of ['ada', 'ravi', 'sam', 'mei']) ids.set(n, await userId(`${n}@strainlab.example`));
  // A rerun in the same database, or another file, may have left noor in strainlab.
  await removeFromStrainlab(NOOR);
});

afterAll(async () => {
  // The seeded roles and noor's absence are what other files expect.
  await setRoleInStrainlab('ada@strainlab.example', 'admin');
  await setRoleInStrainlab('ravi@strainlab.example', 'designer');
  await setRoleInStrainlab('sam@strainlab.example', 'viewer');
  await removeFromStrainlab(NOOR);
  await api?.close();
});

describe('members', () => {
  it('lists the members with their roles to any member, a viewer included', async () => {
    const res = await sam.get('/api/workspaces/strainlab/members');
    expect(res.status).toBe(200);
    const byEmail = Object.fromEntries(res.body.items.map((m: { email: string; role: string }) => [m.email, m.role]));
    expect(byEmail).toMatchObject({ 'ada@strainlab.example': 'admin', 'ravi@strainlab.example': 'designer', 'mei@strainlab.example': 'reviewer', 'sam@strainlab.example': 'viewer' });
    expect(byEmail['jon@tidepool.example']).toBeUndefined();
    const adaRow = res.body.items.find((m: { email: string }) => m.email === 'ada@strainlab.example');
    expect(adaRow).toEqual({ userId: ids.get('ada'), name: 'Ada Okafor', email: 'ada@strainlab.example', role: 'admin', joinedAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/) });
  });

  it('refuses a member of another workspace (403 not_a_member) and names an unknown one (404)', async () => {
    const jon = await api.signedIn('jon@tidepool.example');
    const other = await jon.get('/api/workspaces/strainlab/members');
    expect(other.status).toBe(403);
    expect(other.body.error.code).toBe('not_a_member');
    const unknown = await jon.get('/api/workspaces/no-such-team/members');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('workspace_not_found');
  });

  it('lets an admin change a role, recorded in the audit log with from and to', async () => {
    const res = await ada.patch(`/api/workspaces/strainlab/members/${ids.get('sam')}`, { role: 'reviewer' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ userId: ids.get('sam'), email: 'sam@strainlab.example', role: 'reviewer' });
    expect(await roleInStrainlab('sam@strainlab.example')).toBe('reviewer');
    expect((await sam.get('/api/me')).body.workspaces).toEqual([expect.objectContaining({ slug: 'strainlab', role: 'reviewer' })]);

    const log = await ada.get('/api/workspaces/strainlab/audit?pageSize=5');
    expect(log.body.items[0]).toMatchObject({
      action: 'member.role_change', targetType: 'user', targetId: ids.get('sam'),
      actor: { id: ids.get('ada'), name: 'Ada Okafor', email: 'ada@strainlab.example' },
      details: { from: 'viewer', to: 'reviewer' },
    });

    expect((await ada.patch(`/api/workspaces/strainlab/members/${ids.get('sam')}`, { role: 'viewer' })).status).toBe(200);
    expect(await roleInStrainlab('sam@strainlab.example')).toBe('viewer');
  });

  it('refuses role changes and removals by a non-admin (403) and unknown roles (400)', async () => {
    const patch = await ravi.patch(`/api/workspaces/strainlab/members/${ids.get('sam')}`, { role: 'admin' });
    expect(patch.status).toBe(403);
    expect(patch.body.error.code).toBe('forbidden');
    const remove = await ravi.delete(`/api/workspaces/strainlab/members/${ids.get('sam')}`);
    expect(remove.status).toBe(403);
    expect(await roleInStrainlab('sam@strainlab.example')).toBe('viewer');
    const owner = await ada.patch(`/api/workspaces/strainlab/members/${ids.get('sam')}`, { role: 'owner' });
    expect(owner.status).toBe(400);
    expect(owner.body.error.details).toEqual([expect.objectContaining({ path: 'body.role' })]);
  });

  it('never leaves the workspace without an admin (409 last_admin), but allows it once another admin exists', async () => {
    const admins: { n: string }[] = await api.dataSource.query(
      `SELECT count(*)::int AS n FROM memberships m JOIN workspaces w ON w.id = m.workspace_id WHERE w.slug = 'strainlab' AND m.role = 'admin'`,
    );
    expect(admins[0].n, 'the seed makes ada the only admin').toBe(1);

    const demote = await ada.patch(`/api/workspaces/strainlab/members/${ids.get('ada')}`, { role: 'designer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_admin');
    const leave = await ada.delete(`/api/workspaces/strainlab/members/${ids.get('ada')}`);
    expect(leave.status).toBe(409);
    expect(leave.body.error.code).toBe('last_admin');
    expect(await roleInStrainlab('ada@strainlab.example')).toBe('admin');

    // With ravi made admin, ada may step down; then the roles are put back by the API itself.
    expect((await ada.patch(`/api/workspaces/strainlab/members/${ids.get('ravi')}`, { role: 'admin' })).status).toBe(200);
    expect((await ada.patch(`/api/workspaces/strainlab/members/${ids.get('ada')}`, { role: 'designer' })).status).toBe(200);
    expect((await ravi.patch(`/api/workspaces/strainlab/members/${ids.get('ravi')}`, { role: 'designer' })).body.error.code).toBe('last_admin');
    expect((await ravi.patch(`/api/workspaces/strainlab/members/${ids.get('ada')}`, { role: 'admin' })).status).toBe(200);
    expect((await ada.patch(`/api/workspaces/strainlab/members/${ids.get('ravi')}`, { role: 'designer' })).status).toBe(200);
    expect(await roleInStrainlab('ada@strainlab.example')).toBe('admin');
    expect(await roleInStrainlab('ravi@strainlab.example')).toBe('designer');
  });

  it('keeps an admin when two admins demote each other at the same moment', async () => {
    try {
      for (let round = 0; round < 5; round++) {
        await setRoleInStrainlab('ravi@strainlab.example', 'admin');
        const [byAda, byRavi] = await Promise.all([
          ada.patch(`/api/workspaces/strainlab/members/${ids.get('ravi')}`, { role: 'designer' }),
          ravi.patch(`/api/workspaces/strainlab/members/${ids.get('ada')}`, { role: 'designer' }),
        ]);
        // One wins; the other is refused, as last admin or as no longer an admin.
        const statuses = [byAda.status, byRavi.status];
        expect(statuses.filter((st) => st === 200), JSON.stringify([byAda.body, byRavi.body])).toHaveLength(1);
        expect([403, 409]).toContain(statuses.find((st) => st !== 200));
        const roles = [await roleInStrainlab('ada@strainlab.example'), await roleInStrainlab('ravi@strainlab.example')];
        expect(roles.filter((r) => r === 'admin')).toHaveLength(1);
        await setRoleInStrainlab('ada@strainlab.example', 'admin');
      }
    } finally {
      await setRoleInStrainlab('ada@strainlab.example', 'admin');
      await setRoleInStrainlab('ravi@strainlab.example', 'designer');
    }
  });

  it('answers 404 member_not_found for someone who is not a member', async () => {
    const jonId = await userId('jon@tidepool.example');
    const res = await ada.patch(`/api/workspaces/strainlab/members/${jonId}`, { role: 'viewer' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('member_not_found');
  });
});

describe('invitations', () => {
  let accepted: { id: string; token: string };

  it('mails a single-use link in plain text and HTML when an admin invites', async () => {
    const res = await ada.post('/api/workspaces/strainlab/invitations', { email: 'Noor@Strainlab.example', role: 'designer' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: NOOR, role: 'designer', mailed: true, invitedBy: { id: ids.get('ada'), name: 'Ada Okafor' } });
    expect(JSON.stringify(res.body)).not.toMatch(/token|\/join\//);

    const [mail] = await api.mailTo(NOOR);
    expect(mail.subject).toContain('Ada Okafor');
    const links = (s: string) => [...s.matchAll(/https?:\/\/[^\s"<]+\/join\/[A-Za-z0-9_-]+/g)].map((m) => m[0]);
    const inText = links(mail.text);
    const inHtml = links(mail.html ?? '');
    expect(inText).toHaveLength(1);
    expect(inText[0]).toMatch(new RegExp(`^${api.url.replace(/\./g, '\\.')}/join/[A-Za-z0-9_-]{22}$`));
    expect(new Set(inHtml)).toEqual(new Set(inText));
    expect(mail.html).toContain(`href="${inText[0]}"`);
    accepted = { id: res.body.id, token: inText[0].split('/join/')[1] };
  });

  it('previews the invitation without a session', async () => {
    const res = await api.client().get(`/api/invitations/${accepted.token}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      workspace: { slug: 'strainlab', name: 'Strainlab sensor front end' },
      email: NOOR,
      role: 'designer',
      invitedBy: { name: 'Ada Okafor' },
      expiresAt: expect.any(String),
    });
    const days = (Date.parse(res.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.9);
    expect(days).toBeLessThanOrEqual(7);
    expect(await pendingIds()).toContain(accepted.id);
  });

  it('is accepted by signing in with the invited address, landing in the workspace', async () => {
    const noor = api.client();
    const landed = await noor.signIn(NOOR, DEMO_PASSWORD, { invite: accepted.token, next: '/bench' });
    expect(landed).toBe('/w/strainlab/netlists');
    const me = await noor.get('/api/me');
    expect(me.body.workspaces).toEqual([{ slug: 'strainlab', name: 'Strainlab sensor front end', role: 'designer' }]);
    expect(await roleInStrainlab(NOOR)).toBe('designer');
    expect(await pendingIds()).not.toContain(accepted.id);
  });

  it('works once: the same link afterwards is 404 invitation_unavailable', async () => {
    const res = await api.client().get(`/api/invitations/${accepted.token}`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('invitation_unavailable');
    const again = await api.client().signIn(NOOR, DEMO_PASSWORD, { invite: accepted.token });
    expect(again).toBe('/sign-in?problem=invitation_unavailable');
    const revoke = await ada.delete(`/api/invitations/${accepted.id}`);
    expect(revoke.status).toBe(409);
    expect(revoke.body.error.code).toBe('invitation_accepted');
  });

  it('refuses to invite an existing member (409 already_member), whatever the case of the address', async () => {
    for (const email of ['ravi@strainlab.example', 'RAVI@strainlab.EXAMPLE', NOOR]) {
      const res = await ada.post('/api/workspaces/strainlab/invitations', { email, role: 'viewer' });
      expect(res.status, email).toBe(409);
      expect(res.body.error.code).toBe('already_member');
    }
  });

  it('is not accepted by another address: the app explains, no membership is made, the link stays valid', async () => {
    const address = `guest-${randomBytes(4).toString('hex')}@elsewhere.example`;
    const inv = await invite(address, 'viewer');
    const jon = api.client();
    const landed = await jon.signIn('jon@tidepool.example', DEMO_PASSWORD, { invite: inv.token });
    expect(landed).toBe('/sign-in?problem=invitation_email_mismatch');
    expect(await roleInStrainlab('jon@tidepool.example')).toBeNull();
    expect((await jon.get('/api/me')).body.workspaces.map((w: { slug: string }) => w.slug)).toEqual(['tidepool']);
    expect((await api.client().get(`/api/invitations/${inv.token}`)).status).toBe(200);
    expect(await pendingIds()).toContain(inv.id);
  });

  it('expires: a link past its date is 404 and no longer pending', async () => {
    const inv = await invite(`late-${randomBytes(4).toString('hex')}@elsewhere.example`, 'viewer');
    expect((await api.client().get(`/api/invitations/${inv.token}`)).status).toBe(200);
    await api.dataSource.query(`UPDATE invitations SET expires_at = now() - interval '1 minute' WHERE id = $1`, [inv.id]);
    const res = await api.client().get(`/api/invitations/${inv.token}`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('invitation_unavailable');
    expect(await pendingIds()).not.toContain(inv.id);
  });

  it('is revoked by an admin: 204, then 404 and gone from the pending list', async () => {
    const inv = await invite(`gone-${randomBytes(4).toString('hex')}@elsewhere.example`, 'reviewer');
    expect(await pendingIds()).toContain(inv.id);
    expect((await ravi.delete(`/api/invitations/${inv.id}`)).status).toBe(403);
    const jon = await api.signedIn('jon@tidepool.example');
    expect((await jon.delete(`/api/invitations/${inv.id}`)).status).toBe(403);
    expect(await pendingIds()).toContain(inv.id);
    expect((await ada.delete(`/api/invitations/${inv.id}`)).status).toBe(204);
    expect((await api.client().get(`/api/invitations/${inv.token}`)).body.error.code).toBe('invitation_unavailable');
    expect(await pendingIds()).not.toContain(inv.id);
  });

  it('replaces a pending invitation to the same address with the new one', async () => {
    const address = `twice-${randomBytes(4).toString('hex')}@elsewhere.example`;
    const first = await invite(address, 'viewer');
    const second = await invite(address, 'designer');
    expect(second.token).not.toBe(first.token);
    expect((await api.client().get(`/api/invitations/${first.token}`)).status).toBe(404);
    expect((await api.client().get(`/api/invitations/${second.token}`)).body.role).toBe('designer');
    const pending = await pendingIds();
    expect(pending).toContain(second.id);
    expect(pending).not.toContain(first.id);
  });

  it('lists pending invitations to admins only', async () => {
    const res = await ada.get('/api/workspaces/strainlab/invitations');
    expect(res.status).toBe(200);
    for (const item of res.body.items) {
      expect(item).toEqual({ id: expect.any(String), email: expect.any(String), role: expect.any(String), createdAt: expect.any(String), expiresAt: expect.any(String), invitedBy: expect.objectContaining({ name: expect.any(String) }) });
    }
    for (const client of [ravi, sam]) {
      const refused = await client.get('/api/workspaces/strainlab/invitations');
      expect(refused.status).toBe(403);
      expect(refused.body.error.code).toBe('forbidden');
    }
    expect((await ravi.post('/api/workspaces/strainlab/invitations', { email: 'x@elsewhere.example', role: 'viewer' })).status).toBe(403);
  });

  it('lets an admin remove a member (204), after which their workspace is gone from /api/me', async () => {
    const noorId = await userId(NOOR);
    const res = await ada.delete(`/api/workspaces/strainlab/members/${noorId}`);
    expect(res.status).toBe(204);
    expect(await roleInStrainlab(NOOR)).toBeNull();
    const noor = await api.signedIn(NOOR);
    expect((await noor.get('/api/me')).body.workspaces).toEqual([]);
    expect((await noor.get('/api/workspaces/strainlab/netlists')).body.error.code).toBe('not_a_member');
  });
});

describe('audit log', () => {
  it('shows the writes made here newest first, with actor and action, to admins', async () => {
    const res = await ada.get('/api/workspaces/strainlab/audit?pageSize=100');
    expect(res.status).toBe(200);
    const items: { id: string; at: string; action: string; actor: { email: string } | null; targetId: string | null; details: Record<string, unknown> | null }[] = res.body.items;
    expect(res.body.total).toBeGreaterThanOrEqual(items.length);
    const times = items.map((i) => Date.parse(i.at));
    expect(times).toEqual([...times].sort((a, b) => b - a));

    const noorId = await userId(NOOR);
    const at = (action: string, pred: (i: (typeof items)[number]) => boolean = () => true) => items.findIndex((i) => i.action === action && pred(i));
    const removed = at('member.remove', (i) => i.targetId === noorId);
    const acceptedIdx = at('invitation.accept', (i) => i.details?.email === NOOR);
    const invited = at('invitation.create', (i) => i.details?.email === NOOR);
    const revoked = at('invitation.revoke');
    const roleChange = at('member.role_change', (i) => i.targetId === ids.get('sam'));
    for (const idx of [removed, acceptedIdx, invited, revoked, roleChange]) expect(idx).toBeGreaterThanOrEqual(0);
    // Newest first: the removal came after the acceptance, which came after the invitation.
    expect(removed).toBeLessThan(acceptedIdx);
    expect(acceptedIdx).toBeLessThan(invited);
    expect(invited).toBeLessThan(roleChange);
    expect(items[removed].actor?.email).toBe('ada@strainlab.example');
    expect(items[acceptedIdx].actor?.email).toBe(NOOR);
    expect(items[revoked].actor?.email).toBe('ada@strainlab.example');
  });

  it('pages the log', async () => {
    const first = await ada.get('/api/workspaces/strainlab/audit?page=0&pageSize=2');
    const second = await ada.get('/api/workspaces/strainlab/audit?page=1&pageSize=2');
    expect(first.body.items).toHaveLength(2);
    expect(second.body.items).toHaveLength(2);
    expect(second.body.total).toBe(first.body.total);
    expect(new Set([...first.body.items, ...second.body.items].map((i: { id: string }) => i.id)).size).toBe(4);
  });

  it('is refused to a designer (403)', async () => {
    const res = await ravi.get('/api/workspaces/strainlab/audit');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });
});
