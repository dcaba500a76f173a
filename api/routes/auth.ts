/**
 * Sign-in with the team's OpenID Connect provider through passport-google-oauth20 (authorization
 * code with PKCE and state), pointed by configuration at any provider: the local fake in
 * development, the team's own in production. Endpoints come from the provider's discovery
 * document unless configured, read at the first sign-in (so the server starts without it).
 */
import { Router, type Request, type Response } from 'express';
import { Passport } from 'passport';
import { Strategy as OAuthStrategy, type Profile } from 'passport-google-oauth20';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import type { OidcConfig } from '../config';
import { issueXsrfToken } from '../middleware/xsrf';
import { HttpError } from '../services/http-error';
import { acceptInvitation } from '../services/members';
import { looksLikeToken } from '../services/tokens';
import { userForSignIn, type ProviderProfile } from '../services/users';
import type { RequestHandler } from 'express';

const STRATEGY = 'nodewright-oidc';
type PassportInstance = InstanceType<typeof Passport>;

export interface AuthDeps {
  ds: DataSource;
  oidc: OidcConfig;
  logger: Logger;
  sessionCookie: string;
  xsrfSecret: string;
  cookieSecure: boolean;
  limiter: RequestHandler;
}

/** A path of this app to return to after sign-in; anything else (another site) is ignored. */
export function safeNext(next: unknown): string {
  if (typeof next !== 'string' || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\') || /[\u0000-\u001f]/.test(next) || next.length > 2000) return '/bench';
  if (next.startsWith('/auth/')) return '/bench';
  return next;
}

interface Endpoints {
  authorizationURL: string;
  tokenURL: string;
  userProfileURL: string;
}

async function discover(oidc: OidcConfig): Promise<Endpoints> {
  if (oidc.authorizationUrl && oidc.tokenUrl && oidc.userInfoUrl) {
    return { authorizationURL: oidc.authorizationUrl, tokenURL: oidc.tokenUrl, userProfileURL: oidc.userInfoUrl };
  }
  const res = await fetch(`${oidc.issuer.replace(/\/+$/, '')}/.well-known/openid-configuration`, { signal: AbortSignal.timeout(5000) });
  if (!res.ok) throw new Error(`discovery answered ${res.status}`);
  const doc = (await res.json()) as { authorization_endpoint?: string; token_endpoint?: string; userinfo_endpoint?: string };
  if (!doc.authorization_endpoint || !doc.token_endpoint || !doc.userinfo_endpoint) throw new Error('discovery document lacks an endpoint');
  return {
    authorizationURL: oidc.authorizationUrl ?? doc.authorization_endpoint,
    tokenURL: oidc.tokenUrl ?? doc.token_endpoint,
    userProfileURL: oidc.userInfoUrl ?? doc.userinfo_endpoint,
  };
}

function profileOf(p: Profile): ProviderProfile | undefined {
  const email = p.emails?.[0];
  if (!p.id || !email?.value) return undefined;
  const verified = (email as { verified?: unknown }).verified;
  return { subject: p.id, email: email.value, emailVerified: verified === true || verified === 'true', name: p.displayName ?? '' };
}

export function authRouter(deps: AuthDeps): Router {
  const router = Router();
  let ready: Promise<PassportInstance> | undefined;

  const passportReady = (): Promise<PassportInstance> => {
    ready ??= discover(deps.oidc).then((endpoints) => {
      const passport = new Passport();
      const strategy = new OAuthStrategy(
        { clientID: deps.oidc.clientId, clientSecret: deps.oidc.clientSecret, callbackURL: deps.oidc.callbackUrl, ...endpoints, scope: ['openid', 'email', 'profile'], state: true, pkce: true },
        (_access: string, _refresh: string, profile: Profile, done: (err: unknown, user?: ProviderProfile | false) => void) => done(null, profileOf(profile) ?? false),
      );
      // OpenID providers want the access token in the Authorization header, not the query.
      (strategy as unknown as { _oauth2: { useAuthorizationHeaderforGET(on: boolean): void } })._oauth2.useAuthorizationHeaderforGET(true);
      passport.use(STRATEGY, strategy);
      return passport;
    });
    ready.catch(() => (ready = undefined));
    return ready;
  };

  const problem = (res: Response, code: string) => res.redirect(303, `/sign-in?problem=${code}`);

  router.get('/sign-in', deps.limiter, async (req, res, next) => {
    let passport: PassportInstance;
    try {
      passport = await passportReady();
    } catch (err) {
      deps.logger.warn({ reason: (err as Error).message, issuer: deps.oidc.issuer }, 'identity provider unreachable');
      return problem(res, 'provider_unreachable');
    }
    const invite = typeof req.query.invite === 'string' && looksLikeToken(req.query.invite) ? req.query.invite : undefined;
    req.session.signIn = { next: safeNext(req.query.next), ...(invite ? { invite } : {}) };
    passport.authenticate(STRATEGY, { session: false })(req, res, next);
  });

  router.get('/callback', deps.limiter, async (req, res, next) => {
    let passport: PassportInstance;
    try {
      passport = await passportReady();
    } catch {
      return problem(res, 'provider_unreachable');
    }
    passport.authenticate(STRATEGY, { session: false }, (err: unknown, profile: ProviderProfile | false, info: { message?: string } | undefined) => {
      void finishSignIn(req, res, err, profile, info).catch(next);
    })(req, res, next);
  });

  async function finishSignIn(req: Request, res: Response, err: unknown, profile: ProviderProfile | false, info: { message?: string } | undefined): Promise<void> {
    if (err || !profile) {
      const reason = err instanceof Error ? err.message : (info?.message ?? String(req.query.error ?? 'no profile'));
      deps.logger.warn({ reason }, 'sign-in refused');
      if (req.query.error) return problem(res, 'denied');
      if (/state|verifier/i.test(reason)) return problem(res, 'state_mismatch');
      return problem(res, 'sign_in_failed');
    }
    const pending = req.session.signIn ?? { next: '/bench' };
    let user;
    try {
      user = await deps.ds.transaction((m) => userForSignIn(m, profile));
    } catch (e) {
      if (e instanceof HttpError && e.status < 500) return problem(res, e.code);
      throw e;
    }
    // A new session id at sign-in, so an id known before it (fixation) is worth nothing after.
    await new Promise<void>((resolve, reject) => req.session.regenerate((e) => (e ? reject(e) : resolve())));
    req.session.userId = user.id;
    let target = pending.next;
    if (pending.invite) {
      try {
        const { slug } = await deps.ds.transaction((m) => acceptInvitation(m, user, pending.invite!));
        target = pending.next === '/bench' ? `/w/${slug}/netlists` : pending.next;
      } catch (e) {
        if (!(e instanceof HttpError)) throw e;
        target = `/sign-in?problem=${e.code}`;
      }
    }
    await new Promise<void>((resolve, reject) => req.session.save((e) => (e ? reject(e) : resolve())));
    issueXsrfToken(req, res, deps.xsrfSecret, deps.cookieSecure);
    res.redirect(303, target);
  }

  router.post('/sign-out', (req, res, next) => {
    req.session.destroy((err) => {
      if (err) return next(err);
      res.clearCookie(deps.sessionCookie, { path: '/', httpOnly: true, sameSite: 'lax', secure: deps.cookieSecure });
      res.status(204).end();
    });
  });

  return router;
}
