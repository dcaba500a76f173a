/**
 * People: who is signed in (from the session), and the account made or found at sign-in.
 */
import type { Request } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '../entities';
import { HttpError } from './http-error';
import { rowsOf } from './sql';

declare module 'express-session' {
  interface SessionData {
    /** The signed-in user's id. */
    userId?: string;
    /** A sign-in in progress: where to go afterwards and the invitation it carries. */
    signIn?: { next: string; invite?: string };
  }
}

/** A person as the API shows them. */
export interface Person {
  id: string;
  name: string;
  email: string;
}

export interface SignedInUser extends Person {}

export interface WorkspaceRole {
  id: string;
  slug: string;
  name: string;
  role: Role;
}

const USER_CACHE = Symbol('nodewright.user');

/** The signed-in user of this request, read once per request; undefined when signed out. */
export async function currentUser(ds: DataSource, req: Request): Promise<SignedInUser | undefined> {
  const holder = req as Request & { [USER_CACHE]?: SignedInUser | null };
  if (holder[USER_CACHE] !== undefined) return holder[USER_CACHE] ?? undefined;
  const id = req.session?.userId;
  let user: SignedInUser | null = null;
  if (id) {
    const rows: Person[] = await ds.query(`SELECT id, display_name AS name, email FROM users WHERE id = $1`, [id]);
    user = rows[0] ?? null;
  }
  holder[USER_CACHE] = user;
  return user ?? undefined;
}

/** The user's workspaces with their role, by name. */
export async function workspacesOf(ds: DataSource | EntityManager, userId: string): Promise<WorkspaceRole[]> {
  return ds.query(
    `SELECT w.id, w.slug, w.name, m.role FROM memberships m JOIN workspaces w ON w.id = m.workspace_id
     WHERE m.user_id = $1 ORDER BY w.name`,
    [userId],
  );
}

/** What the identity provider told us about the person signing in. */
export interface ProviderProfile {
  subject: string;
  email: string;
  emailVerified: boolean;
  name: string;
}

/**
 * The account for a sign-in: found by the provider's subject, else linked by a verified address
 * (a seeded or invited member signing in for the first time), else created.
 */
export async function userForSignIn(m: EntityManager, profile: ProviderProfile): Promise<Person> {
  const email = profile.email.trim().toLowerCase();
  const name = profile.name.trim() || email;
  const bySubject = rowsOf<Person>(await m.query(
    `UPDATE users SET last_sign_in_at = now(), email = $2, display_name = $3 WHERE oidc_subject = $1
     RETURNING id, display_name AS name, email`,
    [profile.subject, email, name],
  ));
  if (bySubject[0]) return bySubject[0];
  if (!profile.emailVerified) throw new HttpError(403, 'email_unverified', 'The identity provider has not verified this address.');
  const byEmail = rowsOf<Person>(await m.query(
    `UPDATE users SET oidc_subject = $1, last_sign_in_at = now(), display_name = $3
     WHERE lower(email) = $2 AND oidc_subject IS NULL RETURNING id, display_name AS name, email`,
    [profile.subject, email, name],
  ));
  if (byEmail[0]) return byEmail[0];
  const created: Person[] = await m.query(
    `INSERT INTO users (email, display_name, oidc_subject, last_sign_in_at) VALUES ($1, $2, $3, now())
     ON CONFLICT (email) DO NOTHING RETURNING id, display_name AS name, email`,
    [email, name, profile.subject],
  );
  if (created[0]) return created[0];
  // Two first sign-ins at once (two tabs, two devices): the other one linked or created the
  // account after our statements above looked; each statement sees what is committed, so look again.
  const linked = rowsOf<Person>(await m.query(
    `UPDATE users SET last_sign_in_at = now() WHERE oidc_subject = $1 RETURNING id, display_name AS name, email`,
    [profile.subject],
  ));
  if (linked[0]) return linked[0];
  throw new HttpError(409, 'email_in_use', 'This address belongs to another account of this server.');
}
