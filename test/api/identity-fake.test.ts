import { createHash, randomBytes } from 'node:crypto';
import { Strategy as GoogleStrategy, type Profile } from 'passport-google-oauth20';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { identitySubject, startIdentityFake, type RunningIdentityFake } from '../../tools/identity-fake';

// The whole authorization code + PKCE flow over real HTTP, by hand: the test plays the browser
// (cookies, redirects, forms) and the client (token and userinfo requests).
const CLIENT = { clientId: 'nodewright-test', clientSecret: 'test-secret', redirectUris: ['http://127.0.0.1:9/cb'] };
const ACCOUNTS = [
  { email: 'ada.designer@example.test', name: 'Ada Designer' },
  { email: 'bo.reviewer@example.test', name: 'Bo Reviewer' },
] as const;
const PASSWORD = 'demo-password';

let idp: RunningIdentityFake;
beforeAll(async () => {
  idp = await startIdentityFake({ port: 0, clients: [CLIENT], accounts: ACCOUNTS, password: PASSWORD });
});
afterAll(async () => {
  await idp?.close();
});

/** A cookie jar for one host; paths are ignored (every cookie goes to the provider). */
class Browser {
  private readonly cookies = new Map<string, string>();

  async request(url: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set('cookie', [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '));
    const res = await fetch(new URL(url, idp.issuer), { ...init, headers, redirect: 'manual' });
    for (const line of res.headers.getSetCookie()) {
      const [pair, ...attributes] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      const expired = attributes.some((a) => /^\s*expires=/i.test(a) && Date.parse(a.split('=')[1]) < Date.now());
      if (!value || expired) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return res;
  }

  postForm(url: string, fields: Record<string, string>): Promise<Response> {
    return this.request(url, { method: 'POST', body: new URLSearchParams(fields), headers: { 'content-type': 'application/x-www-form-urlencoded' } });
  }

  /**
   * Follows redirects (and the provider's self-submitting forms, which a browser posts by
   * script) until one leaves for the client's redirect URI; returns that URL.
   */
  async followToClient(res: Response): Promise<URL> {
    for (let hops = 0; hops < 10; hops++) {
      const location = res.headers.get('location');
      if (location) {
        const next = new URL(location, idp.issuer);
        if (next.origin !== idp.issuer) return next;
        res = await this.request(next.href);
        continue;
      }
      const page = await res.text();
      const form = /<form method="post" action="([^"]+)">([\s\S]*?)<\/form>/.exec(page);
      if (!form) throw new Error(`stuck at ${res.status} ${res.url}: ${page.slice(-600)}`);
      const fields = Object.fromEntries([...form[2].matchAll(/<input type="hidden" name="([^"]+)" value="([^"]*)"/g)].map((m) => [m[1], m[2]]));
      res = await this.postForm(form[1], fields);
    }
    throw new Error('too many redirects');
  }
}

function pkce() {
  const verifier = randomBytes(32).toString('base64url');
  return { verifier, challenge: createHash('sha256').update(verifier).digest('base64url') };
}

/** Starts an authorization; returns the sign-in page's URL and the PKCE/state values. */
async function authorize(browser: Browser) {
  const { verifier, challenge } = pkce();
  const state = randomBytes(12).toString('base64url');
  const url = new URL(idp.authorizationURL);
  url.search = new URLSearchParams({
    client_id: CLIENT.clientId,
    response_type: 'code',
    redirect_uri: CLIENT.redirectUris[0],
    scope: 'openid email profile',
    state,
    code_challenge: challenge,
    code_challenge_method: 'S256',
  }).toString();
  const res = await browser.request(url.href);
  expect(res.status).toBe(303);
  const signInUrl = new URL(res.headers.get('location')!, idp.issuer).href;
  expect(signInUrl).toMatch(/\/interaction\/[\w-]+$/);
  return { signInUrl, verifier, state };
}

function token(code: string, verifier: string, auth: 'basic' | 'post' = 'basic') {
  const body = new URLSearchParams({ grant_type: 'authorization_code', code, redirect_uri: CLIENT.redirectUris[0], code_verifier: verifier });
  const headers: Record<string, string> = { 'content-type': 'application/x-www-form-urlencoded' };
  if (auth === 'basic') headers.authorization = `Basic ${Buffer.from(`${CLIENT.clientId}:${CLIENT.clientSecret}`).toString('base64')}`;
  else body.set('client_id', CLIENT.clientId), body.set('client_secret', CLIENT.clientSecret);
  return fetch(idp.tokenURL, { method: 'POST', headers, body });
}

async function signIn(browser: Browser, email: string) {
  const { signInUrl, verifier, state } = await authorize(browser);
  const redirect = await browser.followToClient(await browser.postForm(signInUrl, { email, password: PASSWORD }));
  expect(redirect.origin + redirect.pathname).toBe(CLIENT.redirectUris[0]);
  expect(redirect.searchParams.get('state')).toBe(state);
  return { code: redirect.searchParams.get('code')!, verifier };
}

describe('identity fake', () => {
  it('publishes its discovery document', async () => {
    const res = await fetch(`${idp.issuer}/.well-known/openid-configuration`);
    const config = (await res.json()) as Record<string, unknown>;
    expect(idp.issuer).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    expect(config).toMatchObject({
      issuer: idp.issuer,
      authorization_endpoint: idp.authorizationURL,
      token_endpoint: idp.tokenURL,
      userinfo_endpoint: idp.userInfoURL,
    });
    expect(idp.userInfoURL.endsWith('/userinfo')).toBe(true);
    expect(config.code_challenge_methods_supported).toContain('S256');
  });

  it('runs the authorization code flow with PKCE, its own sign-in page and userinfo', async () => {
    const browser = new Browser();
    const { signInUrl, verifier, state } = await authorize(browser);

    const page = await browser.request(signInUrl);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('<title>Nodewright development sign-in</title>');
    expect(html).toMatch(/<input[^>]+name="email"/);
    expect(html).toMatch(/<input[^>]+name="password"[^>]+type="password"/);
    expect(html).toContain('>Sign in</button>');
    expect(html).not.toMatch(/https?:\/\//); // no external resources

    const wrong = await browser.postForm(signInUrl, { email: ACCOUNTS[0].email, password: 'nope' });
    expect(wrong.status).toBe(401);
    expect(wrong.headers.get('location')).toBeNull();
    const again = await wrong.text();
    expect(again).toContain('No demo account has that email and password.');
    expect(again).toContain(`value="${ACCOUNTS[0].email}"`);

    const hostile = await (await browser.postForm(signInUrl, { email: '"><script>x</script>', password: PASSWORD })).text();
    expect(hostile).not.toContain('<script>');
    expect(hostile).toContain('value="&#34;&#62;&#60;script&#62;x&#60;/script&#62;"');

    // The interaction survived the failed tries; the address matches whatever its case.
    const ok = await browser.postForm(signInUrl, { email: ACCOUNTS[0].email.toUpperCase(), password: PASSWORD });
    expect(ok.status).toBe(303);
    const redirect = await browser.followToClient(ok);
    expect(redirect.origin + redirect.pathname).toBe(CLIENT.redirectUris[0]);
    expect(redirect.searchParams.get('state')).toBe(state);
    const code = redirect.searchParams.get('code');
    expect(code).toBeTruthy();

    const tokens = await token(code!, verifier);
    expect(tokens.status).toBe(200);
    const { access_token: accessToken, token_type: tokenType } = (await tokens.json()) as Record<string, string>;
    expect(tokenType).toBe('Bearer');
    expect(accessToken.split('.')).toHaveLength(1); // opaque, not a JWT

    const userinfo = await fetch(idp.userInfoURL, { headers: { authorization: `Bearer ${accessToken}` } });
    expect(userinfo.status).toBe(200);
    expect(await userinfo.json()).toEqual({
      sub: identitySubject(ACCOUNTS[0].email),
      email: ACCOUNTS[0].email,
      email_verified: true,
      name: 'Ada Designer',
      given_name: 'Ada',
      family_name: 'Designer',
    });
  });

  it('serves passport-google-oauth20 as the team server configures it', async () => {
    const { code, verifier } = await signIn(new Browser(), ACCOUNTS[1].email);
    const strategy = new GoogleStrategy(
      { clientID: CLIENT.clientId, clientSecret: CLIENT.clientSecret, callbackURL: CLIENT.redirectUris[0], authorizationURL: idp.authorizationURL, tokenURL: idp.tokenURL, userProfileURL: idp.userInfoURL },
      () => {},
    );
    // The strategy's OAuth client (protected in the types) does the token request and userinfo.
    const oauth2 = (strategy as unknown as { _oauth2: { useAuthorizationHeaderforGET(on: boolean): void; getOAuthAccessToken(code: string, params: object, cb: (err: unknown, token?: string) => void): void } })._oauth2;
    oauth2.useAuthorizationHeaderforGET(true);
    const accessToken = await new Promise<string>((resolve, reject) =>
      oauth2.getOAuthAccessToken(code, { grant_type: 'authorization_code', redirect_uri: CLIENT.redirectUris[0], code_verifier: verifier }, (err, token) => (err ? reject(err) : resolve(token!))),
    );
    const profile = await new Promise<Profile>((resolve, reject) => strategy.userProfile(accessToken, (err, p) => (err ? reject(err) : resolve(p))));
    expect(profile.id).toBe(identitySubject(ACCOUNTS[1].email));
    expect(profile.displayName).toBe('Bo Reviewer');
    expect(profile.emails).toEqual([{ value: ACCOUNTS[1].email, verified: true }]);
  });

  it('refuses a code with the wrong PKCE verifier', async () => {
    const { code } = await signIn(new Browser(), ACCOUNTS[1].email);
    const res = await token(code, pkce().verifier, 'post');
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: string }).error).toBe('invalid_grant');
  });

  it('refuses an authorization request without PKCE', async () => {
    const url = new URL(idp.authorizationURL);
    url.search = new URLSearchParams({ client_id: CLIENT.clientId, response_type: 'code', redirect_uri: CLIENT.redirectUris[0], scope: 'openid', state: 's' }).toString();
    const res = await fetch(url, { redirect: 'manual' });
    const back = new URL(res.headers.get('location')!);
    expect(back.searchParams.get('error')).toBe('invalid_request');
  });

  it('explains problems on its own pages, with nothing loaded from the internet', async () => {
    const badRedirect = new URL(idp.authorizationURL);
    badRedirect.search = new URLSearchParams({ client_id: CLIENT.clientId, response_type: 'code', redirect_uri: 'http://evil.test/cb', scope: 'openid' }).toString();
    const error = await fetch(badRedirect, { redirect: 'manual' });
    expect(error.status).toBe(400);
    const errorPage = await error.text();
    expect(errorPage).toContain('redirect_uri');
    expect(errorPage).not.toMatch(/@import|https:\/\//);

    // A sign-in page opened without its cookie (another browser, or long after) is expired.
    const stale = await fetch(`${idp.issuer}/interaction/no-such-interaction`);
    expect(stale.status).toBe(400);
    expect(await stale.text()).toContain('This sign-in has expired or was already used.');
  });

  it('asks to sign in again on every authorization, so another account can be chosen', async () => {
    const browser = new Browser();
    const claimsOf = async ({ code, verifier }: { code: string; verifier: string }) => {
      const { access_token: accessToken } = (await (await token(code, verifier)).json()) as Record<string, string>;
      const res = await fetch(idp.userInfoURL, { headers: { authorization: `Bearer ${accessToken}` } });
      return (await res.json()) as { sub: string; email: string };
    };
    // The same browser, so the provider's session of the first account is still there.
    const first = await claimsOf(await signIn(browser, ACCOUNTS[0].email));
    const second = await claimsOf(await signIn(browser, ACCOUNTS[1].email));
    expect([first.email, second.email]).toEqual(ACCOUNTS.map((a) => a.email));
    expect([first.sub, second.sub]).toEqual(ACCOUNTS.map((a) => identitySubject(a.email)));
    expect(first.sub).not.toBe(second.sub);
  });
});
