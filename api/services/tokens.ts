/**
 * Bearer tokens for links (share links, invitations): 128 random bits in base64url, kept in the
 * database only as their SHA-256, so a copy of the database opens nothing.
 */
import { createHash, randomBytes } from 'node:crypto';

/** A new token: 16 random bytes, base64url (22 characters). */
export function newToken(): string {
  return randomBytes(16).toString('base64url');
}

/** What the database keeps of a token. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A well-formed token (anything else cannot match, so it is refused without a lookup). */
export function looksLikeToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{22}$/.test(token);
}
