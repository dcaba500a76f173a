/**
 * Workspace members and invitations. Admins change roles, remove members (never the last admin)
 * and invite by e-mail; an invitation is a single-use link that expires, accepted by signing in
 * with the invited address.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '../entities';
import { workspaceFor } from './access';
import { audit } from './audit';
import { conflict, HttpError } from './http-error';
import { invitationMail } from './mail-templates';
import type { Mailer } from './mailer';
import { rowsOf } from './sql';
import { hashToken, looksLikeToken, newToken } from './tokens';
import type { Person } from './users';

/** How long an invitation link works. */
export const INVITATION_DAYS = 7;

export interface MemberView {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export async function listMembers(ds: DataSource, userId: string, slug: string): Promise<{ items: MemberView[] }> {
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  const rows: { user_id: string; name: string; email: string; role: Role; created_at: Date }[] = await ds.query(
    `SELECT m.user_id, u.display_name AS name, u.email, m.role, m.created_at FROM memberships m JOIN users u ON u.id = m.user_id
     WHERE m.workspace_id = $1 ORDER BY lower(u.display_name)`,
    [ws.id],
  );
  return { items: rows.map((r) => ({ userId: r.user_id, name: r.name, email: r.email, role: r.role, joinedAt: new Date(r.created_at).toISOString() })) };
}

/** Locks the workspace's memberships and refuses a change that would leave it without an admin. */
async function keepAnAdmin(m: EntityManager, workspaceId: string, changedUserId: string, newRole: Role | null): Promise<void> {
  const rows: { user_id: string; role: Role }[] = await m.query(`SELECT user_id, role FROM memberships WHERE workspace_id = $1 FOR UPDATE`, [workspaceId]);
  const admins = rows.filter((r) => (r.user_id === changedUserId ? newRole : r.role) === 'admin');
  if (admins.length === 0) throw conflict('last_admin', 'A workspace needs at least one admin: make someone else admin first.');
}

async function memberRow(m: EntityManager, workspaceId: string, userId: string): Promise<{ role: Role; name: string; email: string }> {
  const rows: { role: Role; name: string; email: string }[] = await m.query(
    `SELECT m.role, u.display_name AS name, u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.workspace_id = $1 AND m.user_id = $2`,
    [workspaceId, userId],
  );
  if (!rows[0]) throw new HttpError(404, 'member_not_found', 'This person is not a member of the workspace.');
  return rows[0];
}

export async function changeRole(ds: DataSource, actorId: string, slug: string, memberId: string, role: Role): Promise<MemberView> {
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actorId, 'admin');
    const before = await memberRow(m, ws.id, memberId);
    await keepAnAdmin(m, ws.id, memberId, role);
    const [row] = rowsOf<{ created_at: Date }>(await m.query(`UPDATE memberships SET role = $3 WHERE workspace_id = $1 AND user_id = $2 RETURNING created_at`, [ws.id, memberId, role]));
    await audit(m, { workspaceId: ws.id, actorId, action: 'member.role_change', targetType: 'user', targetId: memberId, details: { email: before.email, from: before.role, to: role } });
    return { userId: memberId, name: before.name, email: before.email, role, joinedAt: new Date(row.created_at).toISOString() };
  });
}

export async function removeMember(ds: DataSource, actorId: string, slug: string, memberId: string): Promise<void> {
  await ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actorId, 'admin');
    const before = await memberRow(m, ws.id, memberId);
    await keepAnAdmin(m, ws.id, memberId, null);
    await m.query(`DELETE FROM memberships WHERE workspace_id = $1 AND user_id = $2`, [ws.id, memberId]);
    await audit(m, { workspaceId: ws.id, actorId, action: 'member.remove', targetType: 'user', targetId: memberId, details: { email: before.email, role: before.role } });
  });
}

export interface InvitationView {
  id: string;
  email: string;
  role: Role;
  createdAt: string;
  expiresAt: string;
  invitedBy: Person;
}

export async function listInvitations(ds: DataSource, userId: string, slug: string): Promise<{ items: InvitationView[] }> {
  const ws = await workspaceFor(ds, slug, userId, 'admin');
  const rows: { id: string; email: string; role: Role; created_at: Date; expires_at: Date; invited_by: string; name: string; inviter_email: string }[] = await ds.query(
    `SELECT i.id, i.email, i.role, i.created_at, i.expires_at, i.invited_by, u.display_name AS name, u.email AS inviter_email
     FROM invitations i JOIN users u ON u.id = i.invited_by
     WHERE i.workspace_id = $1 AND i.accepted_at IS NULL AND i.revoked_at IS NULL AND i.expires_at > now()
     ORDER BY i.created_at DESC`,
    [ws.id],
  );
  return { items: rows.map((r) => ({ id: r.id, email: r.email, role: r.role, createdAt: new Date(r.created_at).toISOString(), expiresAt: new Date(r.expires_at).toISOString(), invitedBy: { id: r.invited_by, name: r.name, email: r.inviter_email } })) };
}

/** Creates an invitation (replacing a pending one for the same address) and mails its link. */
export async function invite(ds: DataSource, mailer: Mailer, publicUrl: string, actor: Person, slug: string, body: { email: string; role: Role }): Promise<InvitationView & { mailed: boolean }> {
  const email = body.email.trim().toLowerCase();
  const token = newToken();
  const created = await ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'admin');
    const member: unknown[] = await m.query(`SELECT 1 FROM memberships mm JOIN users u ON u.id = mm.user_id WHERE mm.workspace_id = $1 AND lower(u.email) = $2`, [ws.id, email]);
    if (member.length) throw conflict('already_member', `${email} is already a member of ${ws.name}.`);
    await m.query(`UPDATE invitations SET revoked_at = now() WHERE workspace_id = $1 AND email = $2 AND accepted_at IS NULL AND revoked_at IS NULL`, [ws.id, email]);
    const [row] = await m.query(
      `INSERT INTO invitations (workspace_id, email, role, token_hash, invited_by, expires_at)
       VALUES ($1, $2, $3, $4, $5, now() + interval '${INVITATION_DAYS} days') RETURNING id, created_at, expires_at`,
      [ws.id, email, body.role, hashToken(token), actor.id],
    );
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'invitation.create', targetType: 'invitation', targetId: row.id, details: { email, role: body.role } });
    return { ws, row };
  });
  const expiresAt = new Date(created.row.expires_at);
  const mailed = await mailer.send(invitationMail({ to: email, inviter: actor.name, workspace: created.ws.name, role: body.role, url: `${publicUrl}/join/${token}`, expiresAt }));
  return { id: created.row.id, email, role: body.role, createdAt: new Date(created.row.created_at).toISOString(), expiresAt: expiresAt.toISOString(), invitedBy: actor, mailed };
}

export async function revokeInvitation(ds: DataSource, actorId: string, invitationId: string): Promise<void> {
  await ds.transaction(async (m) => {
    const rows: { workspace_id: string; slug: string; email: string; revoked_at: Date | null; accepted_at: Date | null }[] = await m.query(
      `SELECT i.workspace_id, w.slug, i.email, i.revoked_at, i.accepted_at FROM invitations i JOIN workspaces w ON w.id = i.workspace_id WHERE i.id = $1 FOR UPDATE OF i`,
      [invitationId],
    );
    const inv = rows[0];
    if (!inv) throw new HttpError(404, 'invitation_not_found', 'There is no such invitation.');
    await workspaceFor(m, inv.slug, actorId, 'admin');
    if (inv.accepted_at) throw conflict('invitation_accepted', `${inv.email} has already accepted this invitation.`);
    if (inv.revoked_at) return;
    await m.query(`UPDATE invitations SET revoked_at = now() WHERE id = $1`, [invitationId]);
    await audit(m, { workspaceId: inv.workspace_id, actorId, action: 'invitation.revoke', targetType: 'invitation', targetId: invitationId, details: { email: inv.email } });
  });
}

interface PendingInvitation {
  id: string;
  workspace_id: string;
  slug: string;
  workspace_name: string;
  email: string;
  role: Role;
  inviter: string;
  expires_at: Date;
}

async function pending(m: EntityManager | DataSource, token: string, lock = false): Promise<PendingInvitation> {
  const unavailable = new HttpError(404, 'invitation_unavailable', 'This invitation link has expired, was already used or was revoked; ask the workspace admin for a new one.');
  if (!looksLikeToken(token)) throw unavailable;
  const rows: PendingInvitation[] = await m.query(
    `SELECT i.id, i.workspace_id, w.slug, w.name AS workspace_name, i.email, i.role, u.display_name AS inviter, i.expires_at
     FROM invitations i JOIN workspaces w ON w.id = i.workspace_id JOIN users u ON u.id = i.invited_by
     WHERE i.token_hash = $1 AND i.accepted_at IS NULL AND i.revoked_at IS NULL AND i.expires_at > now()${lock ? ' FOR UPDATE OF i' : ''}`,
    [hashToken(token)],
  );
  if (!rows[0]) throw unavailable;
  return rows[0];
}

/** What an invitation link offers, for the join page (no sign-in needed to read it). */
export async function previewInvitation(ds: DataSource, token: string) {
  const inv = await pending(ds, token);
  return { workspace: { slug: inv.slug, name: inv.workspace_name }, email: inv.email, role: inv.role, invitedBy: { name: inv.inviter }, expiresAt: new Date(inv.expires_at).toISOString() };
}

/** Accepts an invitation for the signed-in user, whose address must be the invited one. */
export async function acceptInvitation(m: EntityManager, user: Person, token: string): Promise<{ slug: string }> {
  const inv = await pending(m, token, true);
  if (inv.email !== user.email.toLowerCase()) {
    throw new HttpError(403, 'invitation_email_mismatch', `This invitation was sent to ${inv.email}, but you signed in as ${user.email}.`);
  }
  await m.query(
    `INSERT INTO memberships (user_id, workspace_id, role) VALUES ($1, $2, $3) ON CONFLICT (user_id, workspace_id) DO NOTHING`,
    [user.id, inv.workspace_id, inv.role],
  );
  await m.query(`UPDATE invitations SET accepted_at = now(), accepted_by = $2 WHERE id = $1`, [inv.id, user.id]);
  await audit(m, { workspaceId: inv.workspace_id, actorId: user.id, action: 'invitation.accept', targetType: 'invitation', targetId: inv.id, details: { email: inv.email, role: inv.role } });
  return { slug: inv.slug };
}
