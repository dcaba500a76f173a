/**
 * The development identity provider: a real OpenID Connect provider (oidc-provider 9) on
 * loopback, so the team server's sign-in runs the same authorization code + PKCE flow in
 * development and tests as against a real provider.
 *
 * - demo accounts share one password and sign in on a plain page of our own (the library's
 *   development pages load a web font from the internet);
 * - sign-in is asked on every authorization, so any demo account can be chosen after signing
 *   out of Nodewright; consent is never asked (the grant is made in `loadExistingGrant`);
 * - userinfo is mounted at `/v1/userinfo`: passport-google-oauth20 picks its profile parser
 *   from that path; access tokens are opaque and accepted in the Authorization header;
 * - everything lives in memory and is lost on close; the signing and cookie keys are random
 *   per start, the subject of an account is not (see {@link identitySubject}).
 */
import { createHash, generateKeyPairSync, randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
// @ts-expect-error -- oidc-provider 9 publishes no type declarations; the shapes used are typed below.
import Provider, { interactionPolicy } from 'oidc-provider';

/** Options of {@link startIdentityFake}. */
export interface IdentityFakeOptions {
  /** 0 picks a free port. */
  port: number;
  /** A loopback address; default 127.0.0.1. */
  host?: string;
  clients: { clientId: string; clientSecret: string; redirectUris: string[] }[];
  accounts: readonly { email: string; name: string }[];
  /** One password for every demo account. */
  password: string;
}

/** A started identity fake; the URLs are the ones a passport strategy is configured with. */
export interface RunningIdentityFake {
  /** e.g. `http://127.0.0.1:PORT` (no trailing slash). */
  issuer: string;
  authorizationURL: string;
  tokenURL: string;
  userInfoURL: string;
  /** Stops the HTTP server, cutting open connections. */
  close(): Promise<void>;
}

// The few parts of oidc-provider's JavaScript API this file uses.
interface Interaction {
  uid: string;
  prompt: { name: string };
  params: Record<string, unknown>;
  session?: { accountId?: string };
}
interface GrantInstance {
  accountId?: string;
  addOIDCScope(scope: string): void;
  save(): Promise<string>;
}
interface OidcProvider {
  callback(): (req: IncomingMessage, res: ServerResponse) => void;
  interactionDetails(req: IncomingMessage, res: ServerResponse): Promise<Interaction>;
  interactionFinished(req: IncomingMessage, res: ServerResponse, result: object, options: { mergeWithLastSubmission: boolean }): Promise<void>;
  Grant: { new (init: { clientId: string; accountId: string }): GrantInstance; find(id: string): Promise<GrantInstance | undefined> };
}
interface Ctx {
  oidc: {
    client: { clientId: string };
    session: { accountId?: string; grantIdFor(clientId: string): string | undefined };
    result?: { login?: unknown; consent?: { grantId?: string } };
    provider: OidcProvider;
  };
}

type Account = IdentityFakeOptions['accounts'][number];

const ROUTES = { authorization: '/auth', token: '/token', userinfo: '/v1/userinfo', jwks: '/jwks' };
const SCOPES = 'openid email profile';

/** The stable `sub` of a demo account: derived from its address, the same across restarts. */
export function identitySubject(email: string): string {
  return createHash('sha256').update(email.trim().toLowerCase()).digest('hex').slice(0, 32);
}

/** Starts the provider; resolves once it listens. */
export async function startIdentityFake(o: IdentityFakeOptions): Promise<RunningIdentityFake> {
  const host = o.host ?? '127.0.0.1';
  if (!isLoopback(host)) throw new Error(`The identity fake listens on loopback only, not on ${host}.`);
  const accounts = new Map(o.accounts.map((a) => [identitySubject(a.email), a]));

  // The issuer names the real port, so the server listens before the provider exists.
  let handler: (req: IncomingMessage, res: ServerResponse) => void = (_req, res) => res.writeHead(503).end();
  const server = createServer((req, res) => handler(req, res));
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(o.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const { port } = server.address() as AddressInfo;
  const issuer = `http://${host.includes(':') ? `[${host}]` : host}:${port}`;

  let provider: OidcProvider;
  try {
    provider = createProvider(issuer, o.clients, accounts);
  } catch (error) {
    server.close(); // a configuration the library refuses must not leave the port taken
    throw error;
  }

  const callback = provider.callback();
  handler = (req, res) => {
    const uid = /^\/interaction\/([\w-]+)\/?(?:\?.*)?$/.exec(req.url ?? '')?.[1];
    if (!uid) {
      callback(req, res);
      return;
    }
    interaction(provider, req, res, uid, accounts, o.password).catch((error: Error) => {
      if (res.headersSent) {
        res.end();
        return;
      }
      // An expired or finished sign-in (SessionNotFound) is a user's situation, not a crash.
      const expired = error.name === 'SessionNotFound';
      if (!expired) console.error('identity fake:', error);
      html(res, expired ? 400 : 500, messagePage('Sign-in problem', expired
        ? '<p>This sign-in has expired or was already used. Go back to Nodewright and sign in again.</p>'
        : '<p>The development identity provider failed; see its console.</p>'));
    });
  };

  return {
    issuer,
    authorizationURL: issuer + ROUTES.authorization,
    tokenURL: issuer + ROUTES.token,
    userInfoURL: issuer + ROUTES.userinfo,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

/** The provider's configuration: everything that makes it a development provider is here. */
function createProvider(issuer: string, clients: IdentityFakeOptions['clients'], accounts: Map<string, Account>): OidcProvider {
  // Sign-in is asked for every authorization: a remembered session would pin the browser to
  // the last demo account, and switching accounts is what a development sign-in is for.
  const policy = interactionPolicy.base();
  policy.get('login').checks.add(
    new interactionPolicy.Check('every_authorization', 'sign-in is asked for every authorization', (ctx: Ctx) => !ctx.oidc.result?.login),
  );

  return new Provider(issuer, {
    clients: clients.map((c) => ({
      client_id: c.clientId,
      client_secret: c.clientSecret,
      redirect_uris: c.redirectUris,
      grant_types: ['authorization_code'],
      response_types: ['code'],
      // oidc-provider 9 accepts client_secret_basic too for a client registered with _post.
      token_endpoint_auth_method: 'client_secret_post',
    })),
    adapter: createMemoryAdapter(),
    jwks: { keys: [{ ...generateKeyPairSync('rsa', { modulusLength: 2048 }).privateKey.export({ format: 'jwk' }), use: 'sig' }] },
    cookies: { keys: [randomBytes(32).toString('base64url')] },
    routes: ROUTES,
    scopes: SCOPES.split(' '),
    claims: { openid: ['sub'], email: ['email', 'email_verified'], profile: ['name', 'given_name', 'family_name'] },
    pkce: { required: () => true },
    ttl: { AccessToken: 3600, AuthorizationCode: 60, IdToken: 3600, Interaction: 1800, Session: 8 * 3600, Grant: 8 * 3600 },
    features: {
      devInteractions: { enabled: false },
      // Without a resource parameter the access token is then an opaque one for userinfo.
      resourceIndicators: { enabled: false },
      revocation: { enabled: false },
      // Kept: switching accounts signs the previous one out through it. Its pages are ours.
      rpInitiatedLogout: {
        enabled: true,
        logoutSource: (ctx: { body: string }, form: string) => {
          ctx.body = messagePage('Sign out', `<p>Sign out of the development identity provider?</p>${form}<button type="submit" form="op.logoutForm" name="logout" value="yes">Sign out</button>`);
        },
        postLogoutSuccessSource: (ctx: { body: string }) => {
          ctx.body = messagePage('Signed out', '<p>You are signed out of the development identity provider.</p>');
        },
      },
    },
    interactions: { url: (_ctx: unknown, interaction: { uid: string }) => `/interaction/${interaction.uid}`, policy },
    // No consent screen: every registered client is ours, so the grant is made here.
    async loadExistingGrant(ctx: Ctx) {
      const { client, session, result } = ctx.oidc;
      const grantId = result?.consent?.grantId ?? session.grantIdFor(client.clientId);
      const existing = grantId ? await ctx.oidc.provider.Grant.find(grantId) : undefined;
      if (existing && existing.accountId === session.accountId) return existing;
      if (!session.accountId) return undefined;
      const grant = new ctx.oidc.provider.Grant({ clientId: client.clientId, accountId: session.accountId });
      grant.addOIDCScope(SCOPES);
      await grant.save();
      return grant;
    },
    async findAccount(_ctx: unknown, sub: string) {
      const account = accounts.get(sub);
      if (!account) return undefined;
      const [given, ...family] = account.name.trim().split(/\s+/);
      return {
        accountId: sub,
        async claims() {
          return { sub, email: account.email, email_verified: true, name: account.name, given_name: given, family_name: family.join(' ') || undefined };
        },
      };
    },
    async renderError(ctx: { type: string; body: string }, out: { error?: string; error_description?: string }) {
      ctx.type = 'html';
      ctx.body = messagePage('Sign-in problem', `<p>${esc(out.error_description ?? out.error ?? 'Something went wrong.')}</p><p>Go back to Nodewright and sign in again.</p>`);
    },
  });
}

/** The sign-in page: GET shows it, POST checks the demo account and finishes the login. */
async function interaction(
  provider: OidcProvider,
  req: IncomingMessage,
  res: ServerResponse,
  uid: string,
  accounts: Map<string, Account>,
  password: string,
): Promise<void> {
  const details = await provider.interactionDetails(req, res);
  if (details.uid !== uid) throw Object.assign(new Error('interaction mismatch'), { name: 'SessionNotFound' });
  const clientId = String(details.params.client_id ?? '');
  if (req.method === 'GET' || req.method === 'HEAD') {
    const hint = typeof details.params.login_hint === 'string' ? details.params.login_hint : '';
    return html(res, 200, signInPage({ email: hint, clientId }));
  }
  if (req.method !== 'POST') {
    res.setHeader('allow', 'GET, POST');
    return html(res, 405, messagePage('Sign-in problem', '<p>Use the sign-in form.</p>'));
  }
  const form = new URLSearchParams(await readBody(req));
  const email = (form.get('email') ?? '').trim();
  const accountId = identitySubject(email);
  if (!email || !accounts.has(accountId) || form.get('password') !== password) {
    // 401 with the form again: the interaction stays alive for another try.
    return html(res, 401, signInPage({ email, clientId, error: 'No demo account has that email and password.' }));
  }
  await provider.interactionFinished(req, res, { login: { accountId } }, { mergeWithLastSubmission: false });
}

async function readBody(req: IncomingMessage): Promise<string> {
  let body = '';
  for await (const chunk of req) {
    body += chunk;
    if (body.length > 16_384) throw new Error('sign-in form too large');
  }
  return body;
}

function html(res: ServerResponse, status: number, page: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    // No form-action: browsers apply it to the redirects after the POST, which leave this origin.
    'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'",
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
  });
  res.end(page);
}

/**
 * The provider's storage: in memory, one store per start (the library's own memory adapter
 * shares one store per process and warns loudly about it). Lookups scan: a development
 * provider holds a few hundred entries at most.
 */
function createMemoryAdapter() {
  type Payload = Record<string, unknown> & { uid?: string; userCode?: string; grantId?: string };
  const entries = new Map<string, { payload: Payload; expiresAt: number }>();
  const live = (key: string) => {
    const entry = entries.get(key);
    if (entry && entry.expiresAt <= Date.now()) entries.delete(key);
    return entry && entry.expiresAt > Date.now() ? entry : undefined;
  };
  const findBy = (model: string, field: 'uid' | 'userCode', value: string) => {
    for (const [key, entry] of entries) {
      if (key.startsWith(`${model}:`) && entry.payload[field] === value) return live(key)?.payload;
    }
    return undefined;
  };
  return (model: string) => ({
    async upsert(id: string, payload: Payload, expiresIn?: number) {
      for (const [key, entry] of entries) if (entry.expiresAt <= Date.now()) entries.delete(key);
      entries.set(`${model}:${id}`, { payload: { ...payload }, expiresAt: expiresIn ? Date.now() + expiresIn * 1000 : Infinity });
    },
    async find(id: string) {
      return live(`${model}:${id}`)?.payload;
    },
    async findByUid(uid: string) {
      return findBy(model, 'uid', uid);
    },
    async findByUserCode(userCode: string) {
      return findBy(model, 'userCode', userCode);
    },
    async consume(id: string) {
      const entry = live(`${model}:${id}`);
      if (entry) entry.payload.consumed = Math.floor(Date.now() / 1000);
    },
    async destroy(id: string) {
      entries.delete(`${model}:${id}`);
    },
    // Only this model's entries: an Interaction also names a grantId and must outlive the
    // sign-out that switching accounts performs in the middle of that interaction.
    async revokeByGrantId(grantId: string) {
      for (const [key, entry] of entries) if (key.startsWith(`${model}:`) && entry.payload.grantId === grantId) entries.delete(key);
    },
  });
}

/** The sign-in form; `email` is kept after a failed try. */
function signInPage(o: { email: string; clientId: string; error?: string }): string {
  return layout(
    'Nodewright development sign-in',
    `<h1>Sign in</h1>
<p class="note">This is the development identity provider, running on this machine: it signs in
the demo accounts listed in the README, all with the same password. ${o.clientId ? `Requested by <code>${esc(o.clientId)}</code>.` : ''}</p>
${o.error ? `<p class="error" role="alert">${esc(o.error)}</p>` : ''}
<form method="post">
  <label for="email">Email</label>
  <input id="email" name="email" type="email" autocomplete="username" required value="${esc(o.email)}"${o.email ? '' : ' autofocus'}>
  <label for="password">Password</label>
  <input id="password" name="password" type="password" autocomplete="current-password" required${o.email ? ' autofocus' : ''}>
  <button type="submit">Sign in</button>
</form>`,
  );
}

/** A page with a heading and a trusted HTML message (callers escape what they insert). */
function messagePage(heading: string, message: string): string {
  return layout(`${heading} · Nodewright development sign-in`, `<h1>${esc(heading)}</h1>\n${message}`);
}

function layout(title: string, main: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>
body { font: 16px/1.5 system-ui, sans-serif; color: #1d232b; background: #fff; max-width: 26rem; margin: 3rem auto; padding: 0 1rem; }
.note { color: #4a5561; } .error { color: #a4161a; background: #fdeced; padding: .5rem .75rem; border-radius: 4px; }
label { display: block; margin-top: 1rem; font-weight: 600; }
input { display: block; width: 100%; box-sizing: border-box; font: inherit; padding: .5rem; margin-top: .25rem; border: 1px solid #9aa5b1; border-radius: 4px; }
button { margin-top: 1.25rem; font: inherit; font-weight: 600; padding: .5rem 1.25rem; border: 0; border-radius: 4px; background: #0b57a4; color: #fff; cursor: pointer; }
</style></head>
<body><main>
${main}
</main></body></html>`;
}

/** Escapes text for HTML content and double-quoted attributes. */
function esc(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function isLoopback(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127\.\d+\.\d+\.\d+$/.test(host);
}
