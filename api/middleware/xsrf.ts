/**
 * Cross-site request forgery protection for cookie-authenticated writes, in Angular's own
 * convention: the server sets a readable `XSRF-TOKEN` cookie; the app copies it into the
 * `X-XSRF-TOKEN` header of every write; a write whose header does not equal the cookie, or whose
 * token the server did not sign for this session, is refused with 403.
 *
 * The token is `nonce.signature`, the signature an HMAC of the nonce and the signed-in user's
 * session id: a token planted by a sibling site cannot be forged, and one from before sign-in
 * stops working after it (a fresh one is issued then).
 */
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { HttpError } from '../services/http-error';

export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** One cookie's value from the request (no parser needed for one name). */
export function readCookie(req: Request, name: string): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === name) {
      try {
        return decodeURIComponent(part.slice(eq + 1).trim());
      } catch {
        return undefined;
      }
    }
  }
  return undefined;
}

function binding(req: Request): string {
  return req.session?.userId ? req.sessionID : 'anonymous';
}

function sign(secret: string, nonce: string, bound: string): string {
  return createHmac('sha256', secret).update(`${nonce}.${bound}`).digest('base64url');
}

function valid(secret: string, token: string | undefined, bound: string): boolean {
  if (!token) return false;
  const [nonce, signature] = token.split('.');
  if (!nonce || !signature) return false;
  const expected = Buffer.from(sign(secret, nonce, bound));
  const given = Buffer.from(signature);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

/** Sets a fresh token cookie for this request's session binding. */
export function issueXsrfToken(req: Request, res: Response, secret: string, secure: boolean): void {
  const nonce = randomBytes(18).toString('base64url');
  res.cookie(XSRF_COOKIE, `${nonce}.${sign(secret, nonce, binding(req))}`, { httpOnly: false, sameSite: 'lax', secure, path: '/' });
}

/**
 * Issues a token when the request has none valid, and refuses unsafe methods whose header does
 * not carry the cookie's valid token. Mounted after the session middleware.
 */
export function xsrfProtection(secret: string, secure: boolean): RequestHandler {
  return (req, res, next) => {
    const cookie = readCookie(req, XSRF_COOKIE);
    const bound = binding(req);
    const cookieValid = valid(secret, cookie, bound);
    if (!SAFE.has(req.method)) {
      const header = req.get(XSRF_HEADER);
      if (!cookieValid || header !== cookie) {
        issueXsrfToken(req, res, secret, secure);
        next(new HttpError(403, 'xsrf_failed', 'This write did not carry the X-XSRF-TOKEN header matching the XSRF-TOKEN cookie; reload the page and try again.'));
        return;
      }
    } else if (!cookieValid) {
      issueXsrfToken(req, res, secret, secure);
    }
    next();
  };
}
