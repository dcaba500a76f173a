/**
 * Sign-in through the development identity provider, over its real protocol: the redirect to the
 * provider, its form, the callback, the session cookie and its regeneration, sign-out destroying
 * the session in PostgreSQL, the open-redirect guard, account linking, and the rate limits.
 */
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../api/services/seed';
import { identitySubject } from '../../tools/identity-fake';
import { startApi, type ApiHarness } from '../support/api-harness';
import type { Answer, TeamClient } from '../support/team-client';

let api: ApiHarness;
beforeAll(async () => {
  api = await startApi();
});
afterAll(async () => {
  await api?.close();
});

interface Walk {
  /** The answer of `GET /auth/sign-in`. */
  start: Answer;
  /** The provider's page the start led to. */
  page: { url: string; res: Answer };
  /** The answer to posting the provider's form. */
  posted: Answer;
  /** The answer of `GET /auth/callback`, when the provider sent the browser back, and its URL. */
  callback?: Answer;
  callbackUrl?: string;
  /** Where the callback sent the browser (its Location, not followed: it may be another site). */
  landed?: string;
}

/**
 * Walks the sign-in as a browser does, one hop at a time, keeping every answer: the callback's
 * own Set-Cookie and Location are what these tests are about, and the landing is never fetched.
 */
async function walk(client: TeamClient, email: string, password: string, query: Record<string, string> = { next: '/bench' }): Promise<Walk> {
  const start = await client.request('GET', `/auth/sign-in?${new URLSearchParams(query)}`);
  const page = await client.follow(start.headers.get('location') ?? '/auth/sign-in');
  const action = /<form[^>]*action="([^"]*)"/i.exec(page.res.text)?.[1]?.replace(/&amp;/g, '&');
  const posted = await client.absolute('POST', new URL(action || page.url, page.url).toString(), { email, password });
  let location = posted.headers.get('location');
  let current = page.url;
  for (let hop = 0; location && hop < 10; hop++) {
    const target = new URL(location, current);
    const res = await client.absolute('GET', target.toString());
    if (target.origin === api.url && target.pathname === '/auth/callback') {
      const landed = res.headers.get('location') ?? undefined;
      return { start, page, posted, callback: res, callbackUrl: target.toString(), landed };
    }
    current = target.toString();
    location = res.headers.get('location');
  }
  return { start, page, posted };
}

/** The session id inside a signed `nodewright.sid` cookie value (`s:<sid>.<signature>`). */
function sidOf(cookie: string | undefined): string {
  const m = /^s:([^.]+)\./.exec(decodeURIComponent(cookie ?? ''));
  if (!m) throw new Error(`not a signed session cookie: ${cookie}`);
  return m[1];
}

function setCookieLine(res: Answer, name: string): string | undefined {
  return res.headers.getSetCookie().find((line) => line.startsWith(`${name}=`));
}

async function sessionRows(sid: string): Promise<{ sess: { userId?: string } }[]> {
  return api.dataSource.query(`SELECT sess FROM session WHERE sid = $1`, [sid]);
}

describe('the sign-in flow', () => {
  it('redirects to the provider with an authorization code request carrying PKCE and state', async () => {
    const client = api.client();
    const start = await client.request('GET', '/auth/sign-in?next=/bench');
    expect([302, 303]).toContain(start.status);
    const to = new URL(start.headers.get('location')!);
    expect(`${to.origin}${to.pathname}`).toBe(api.stack.idp.authorizationURL);
    expect(to.searchParams.get('response_type')).toBe('code');
    expect(to.searchParams.get('client_id')).toBe('nodewright');
    expect(to.searchParams.get('redirect_uri')).toBe(`${api.url}/auth/callback`);
    expect(to.searchParams.get('code_challenge_method')).toBe('S256');
    expect(to.searchParams.get('code_challenge')).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(to.searchParams.get('state')).toBeTruthy();
  });

  it("shows the provider's form with email and password fields", async () => {
    const client = api.client();
    const start = await client.request('GET', '/auth/sign-in?next=/bench');
    const page = await client.follow(start.headers.get('location')!);
    expect(new URL(page.url).origin).toBe(api.stack.idp.issuer);
    expect(page.res.status).toBe(200);
    expect(page.res.text).toMatch(/<form[^>]*method="post"/i);
    expect(page.res.text).toMatch(/<input[^>]*name="email"/);
    expect(page.res.text).toMatch(/<input[^>]*name="password"[^>]*type="password"/);
  });

  it('lands on next, with the role of each workspace in /api/me (401 signed_out before)', async () => {
    const client = api.client();
    const before = await client.get('/api/me');
    expect(before.status).toBe(401);
    expect(before.body.error.code).toBe('signed_out');

    const next = '/w/strainlab/netlists?sort=name&order=asc';
    const w = await walk(client, 'mei@strainlab.example', DEMO_PASSWORD, { next });
    expect(w.callback?.status).toBe(303);
    expect(w.landed).toBe(next);

    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body).toEqual({
      user: { id: expect.any(String), email: 'mei@strainlab.example', name: 'Mei Tanaka' },
      workspaces: [{ slug: 'strainlab', name: 'Strainlab sensor front end', role: 'reviewer' }],
    });
    expect(me.headers.get('cache-control')).toBe('no-store');
  });

  it('sets an HttpOnly, SameSite=Lax session cookie with a new id at sign-in (no fixation)', async () => {
    const client = api.client();
    // A first, abandoned sign-in stores its OAuth state in a session: the client now holds an id.
    await client.request('GET', '/auth/sign-in?next=/bench');
    const before = client.cookie('nodewright.sid');
    expect(before).toBeTruthy();
    const sidBefore = sidOf(before);
    expect(await sessionRows(sidBefore)).toHaveLength(1);

    const w = await walk(client, 'ravi@strainlab.example', DEMO_PASSWORD);
    const line = setCookieLine(w.callback!, 'nodewright.sid');
    expect(line, 'the callback sets the session cookie').toBeDefined();
    expect(line).toMatch(/;\s*HttpOnly/i);
    expect(line).toMatch(/;\s*SameSite=Lax/i);
    expect(line).toMatch(/;\s*Path=\//i);
    expect(line).not.toMatch(/;\s*Secure/i); // plain http on loopback
    // The callback answered with a new id, and the old one is gone from the store.
    const sidAfter = sidOf(line!.split(';')[0].slice('nodewright.sid='.length));
    expect(sidAfter).not.toBe(sidBefore);
    expect(await sessionRows(sidBefore)).toHaveLength(0);
    const [row] = await sessionRows(sidAfter);
    expect(row.sess.userId).toEqual(expect.any(String));

    // The pre-sign-in cookie, replayed, is not signed in.
    const attacker = api.client();
    attacker.setCookie('nodewright.sid', before!);
    expect((await attacker.get('/api/me')).status).toBe(401);
  });

  it('signs out with 204, destroying the session in PostgreSQL so a replayed cookie is refused', async () => {
    const client = await api.signedIn('sam@strainlab.example');
    const cookie = client.cookie('nodewright.sid')!;
    const sid = sidOf(cookie);
    expect(await sessionRows(sid)).toHaveLength(1);

    const unguarded = await client.request('POST', '/auth/sign-out', { xsrf: false });
    expect(unguarded.status).toBe(403);
    expect(unguarded.body.error.code).toBe('xsrf_failed');
    expect((await client.get('/api/me')).status).toBe(200);

    const out = await client.post('/auth/sign-out');
    expect(out.status).toBe(204);
    expect(setCookieLine(out, 'nodewright.sid')).toMatch(/Expires=Thu, 01 Jan 1970/i);
    expect(await sessionRows(sid)).toHaveLength(0);

    const replay = api.client();
    replay.setCookie('nodewright.sid', cookie);
    const me = await replay.get('/api/me');
    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe('signed_out');
  });

  it.each(['//evil.example', 'https://evil.example', '/\\evil.example', '/auth/sign-out'])('never redirects to next=%s (lands on /bench)', async (next) => {
    const w = await walk(api.client(), 'ravi@strainlab.example', DEMO_PASSWORD, { next });
    expect(w.landed).toBe('/bench');
  });

  it("keeps a wrong password on the provider's form, never coming back", async () => {
    const client = api.client();
    const w = await walk(client, 'ravi@strainlab.example', 'not-the-password');
    expect(w.posted.status).toBe(401);
    expect(w.posted.headers.get('location')).toBeNull();
    expect(w.posted.text).toMatch(/name="password"/);
    expect(w.posted.text).toContain('No demo account has that email and password.');
    expect(w.callback).toBeUndefined();
    expect((await client.get('/api/me')).status).toBe(401);
  });
});

describe('refused sign-ins', () => {
  it('sends a callback that does not belong to the browser to /sign-in?problem=state_mismatch', async () => {
    const client = api.client();
    const w = await walk(client, 'ravi@strainlab.example', DEMO_PASSWORD);
    expect(w.landed).toBe('/bench');
    // The same callback again, in the same browser (its state was used up) and in another one.
    const same = await client.absolute('GET', w.callbackUrl!);
    expect(same.status).toBe(303);
    expect(same.headers.get('location')).toBe('/sign-in?problem=state_mismatch');
    const stranger = api.client();
    await stranger.request('GET', '/auth/sign-in?next=/bench');
    const res = await stranger.absolute('GET', w.callbackUrl!);
    expect(res.headers.get('location')).toBe('/sign-in?problem=state_mismatch');
    expect((await stranger.get('/api/me')).status).toBe(401);
  });

  it('sends a refusal by the provider to /sign-in?problem=denied', async () => {
    const client = api.client();
    const start = await client.request('GET', '/auth/sign-in?next=/bench');
    const state = new URL(start.headers.get('location')!).searchParams.get('state')!;
    const res = await client.request('GET', `/auth/callback?error=access_denied&state=${state}`);
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe('/sign-in?problem=denied');
    expect((await client.get('/api/me')).status).toBe(401);
  });
});

describe('accounts', () => {
  it('creates a user with no workspace at the first sign-in of a newcomer', async () => {
    // Another file may have signed noor in already: her row is renamed out of the way, so this
    // sign-in is a first one again (her history stays attached to the renamed row).
    await api.dataSource.query(
      `UPDATE users SET email = 'noor-before-' || left(id::text, 8) || '@retired.example', oidc_subject = NULL WHERE lower(email) = 'noor@strainlab.example'`,
    );
    const client = api.client();
    expect((await walk(client, 'noor@strainlab.example', DEMO_PASSWORD)).landed).toBe('/bench');
    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ email: 'noor@strainlab.example', name: 'Noor Haddad' });
    expect(me.body.workspaces).toEqual([]);
    const rows: { id: string; oidc_subject: string }[] = await api.dataSource.query(`SELECT id, oidc_subject FROM users WHERE lower(email) = 'noor@strainlab.example'`);
    expect(rows).toEqual([{ id: me.body.user.id, oidc_subject: identitySubject('noor@strainlab.example') }]);
  });

  it('links a seeded member by e-mail and keeps the same user id at every sign-in', async () => {
    const [seeded]: { id: string }[] = await api.dataSource.query(`SELECT id FROM users WHERE email = 'mei@strainlab.example'`);
    for (let i = 0; i < 2; i++) {
      const client = await api.signedIn('mei@strainlab.example');
      expect((await client.get('/api/me')).body.user.id).toBe(seeded.id);
    }
    const rows: { id: string; oidc_subject: string | null }[] = await api.dataSource.query(`SELECT id, oidc_subject FROM users WHERE lower(email) = 'mei@strainlab.example'`);
    expect(rows).toEqual([{ id: seeded.id, oidc_subject: identitySubject('mei@strainlab.example') }]);
  });
});

describe('rate limits', () => {
  let limited: ApiHarness;
  beforeAll(async () => {
    limited = await startApi({ NODEWRIGHT_SIGNIN_RATE: '3', NODEWRIGHT_SHARED_RATE: '3' });
  });
  afterAll(async () => {
    // The counters are shared by every instance on this database: leave none for other files.
    await limited?.dataSource.query(`DELETE FROM rate_limit_hits`);
    await limited?.close();
  });

  it('answers the 4th sign-in start in a minute with 429 rate_limited and RateLimit headers', async () => {
    await limited.dataSource.query(`DELETE FROM rate_limit_hits`);
    const client = limited.client();
    const answers = [];
    for (let i = 0; i < 4; i++) answers.push(await client.request('GET', '/auth/sign-in?next=/bench'));
    expect(answers.slice(0, 3).map((a) => a.status)).toEqual([302, 302, 302]);
    const refused = answers[3];
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    expect(refused.headers.get('ratelimit')).toMatch(/r=0/);
    expect(refused.headers.get('ratelimit-policy')).toMatch(/q=3/);
  });

  it('limits link lookups (shared netlists and invitations together) to the configured rate', async () => {
    await limited.dataSource.query(`DELETE FROM rate_limit_hits`);
    const client = limited.client();
    const token = () => randomBytes(16).toString('base64url');
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) {
      const res = await client.get(`/api/shared/${token()}`);
      expect(res.body.error.code).toBe('share_not_found');
      statuses.push(res.status);
    }
    expect(statuses).toEqual([404, 404, 404]);
    const shared = await client.get(`/api/shared/${token()}`);
    expect(shared.status).toBe(429);
    expect(shared.body.error.code).toBe('rate_limited');
    expect(shared.headers.get('ratelimit')).toMatch(/r=0/);
    const invitation = await client.get(`/api/invitations/${token()}`);
    expect(invitation.status).toBe(429);
  });
});
