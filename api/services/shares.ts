/**
 * Share links: a read-only link to one revision of a netlist, opened without sign-in. The token
 * appears once, in the creation answer; the database keeps its SHA-256. Every opening is recorded.
 */
import type { DataSource } from 'typeorm';
import { roleAtLeast, type LibraryPin, type Role } from '../entities';
import { netlistRights } from './access';
import { audit } from './audit';
import { forbidden, HttpError, notFound } from './http-error';
import { sharedMail } from './mail-templates';
import { pinnedSources, pinsOf } from './share-library';
import type { Mailer } from './mailer';
import { hashToken, looksLikeToken, newToken } from './tokens';
import type { Person } from './users';

export type ShareState = 'active' | 'expired' | 'revoked';

export interface ShareView {
  id: string;
  version: number;
  createdAt: string;
  expiresAt: string | null;
  revokedAt: string | null;
  state: ShareState;
  openCount: number;
  lastOpenedAt: string | null;
  createdBy: Person;
}

interface NetlistAccess {
  id: string;
  name: string;
  version: number;
  workspace_id: string;
  workspace_name: string;
  owner_id: string;
  visibility: string;
  role: Role | null;
}

async function netlistFor(ds: DataSource, userId: string, netlistId: string): Promise<NetlistAccess & { canShare: boolean }> {
  const rows: NetlistAccess[] = await ds.query(
    `SELECT n.id, n.name, n.version, n.workspace_id, w.name AS workspace_name, n.owner_id, n.visibility, m.role
     FROM netlists n JOIN workspaces w ON w.id = n.workspace_id
     LEFT JOIN memberships m ON m.workspace_id = n.workspace_id AND m.user_id = $2
     WHERE n.id = $1 AND n.deleted_at IS NULL`,
    [netlistId, userId],
  );
  const n = rows[0];
  const rights = n ? netlistRights(n.role, userId, { ownerId: n.owner_id, visibility: n.visibility }) : undefined;
  if (!n || !rights) throw notFound('This netlist');
  return { ...n, canShare: rights.write };
}

/** Makes a link to the netlist's current revision and mails it to `notify`, if any. */
export async function createShare(
  ds: DataSource,
  mailer: Mailer,
  publicUrl: string,
  actor: Person,
  netlistId: string,
  body: { expiresAt?: Date; notify?: string[] },
): Promise<{ id: string; url: string; version: number; expiresAt: string | null; createdAt: string; notified: string[] }> {
  const n = await netlistFor(ds, actor.id, netlistId);
  if (!n.canShare) throw forbidden(`Sharing needs the designer role; yours is ${n.role}.`);
  if (body.expiresAt && body.expiresAt.getTime() <= Date.now()) throw new HttpError(400, 'invalid_request', 'The expiry must be in the future.', [{ path: 'body.expiresAt', message: 'must be in the future' }]);
  const token = newToken();
  const row = await ds.transaction(async (m) => {
    // The library versions the shared revision uses, with the blocks they bring in.
    const [rev]: { source: string }[] = await m.query(`SELECT source FROM netlist_revisions WHERE netlist_id = $1 AND version = $2`, [netlistId, n.version]);
    const pins = await pinsOf(m, n.workspace_id, rev?.source ?? '');
    const [r] = await m.query(
      `INSERT INTO share_links (netlist_id, version, token_hash, created_by, expires_at, library_pins)
       VALUES ($1, $2, $3, $4, $5, $6) RETURNING id, created_at`,
      [netlistId, n.version, hashToken(token), actor.id, body.expiresAt ?? null, JSON.stringify(pins)],
    );
    await audit(m, { workspaceId: n.workspace_id, actorId: actor.id, action: 'share.create', targetType: 'share_link', targetId: r.id, details: { netlist: netlistId, version: n.version, expiresAt: body.expiresAt?.toISOString() ?? null, notify: body.notify ?? [] } });
    return r as { id: string; created_at: Date };
  });
  const url = `${publicUrl}/s/${token}`;
  const notified: string[] = [];
  for (const to of new Set((body.notify ?? []).map((e) => e.trim().toLowerCase()))) {
    const sent = await mailer.send(sharedMail({ to, sharer: actor.name, netlist: n.name, version: n.version, workspace: n.workspace_name, url, expiresAt: body.expiresAt ?? null }));
    if (sent) notified.push(to);
  }
  return { id: row.id, url, version: n.version, expiresAt: body.expiresAt?.toISOString() ?? null, createdAt: new Date(row.created_at).toISOString(), notified };
}

function stateOf(r: { revoked_at: Date | null; expires_at: Date | null }): ShareState {
  if (r.revoked_at) return 'revoked';
  if (r.expires_at && new Date(r.expires_at).getTime() <= Date.now()) return 'expired';
  return 'active';
}

/** The netlist's links: the caller's own, or all of them for an admin. */
export async function listShares(ds: DataSource, userId: string, netlistId: string): Promise<{ items: ShareView[] }> {
  const n = await netlistFor(ds, userId, netlistId);
  if (!n.canShare) throw forbidden(`Share links need the designer role; yours is ${n.role}.`);
  const all = roleAtLeast(n.role!, 'admin');
  const rows: { id: string; version: number; created_at: Date; expires_at: Date | null; revoked_at: Date | null; created_by: string; name: string; email: string; opens: string; last_opened: Date | null }[] = await ds.query(
    `SELECT s.id, s.version, s.created_at, s.expires_at, s.revoked_at, s.created_by, u.display_name AS name, u.email,
            (SELECT count(*) FROM share_openings o WHERE o.share_id = s.id) AS opens,
            (SELECT max(opened_at) FROM share_openings o WHERE o.share_id = s.id) AS last_opened
     FROM share_links s JOIN users u ON u.id = s.created_by
     WHERE s.netlist_id = $1 AND (s.created_by = $2 OR ${all ? 'true' : 'false'}) ORDER BY s.created_at DESC`,
    [netlistId, userId],
  );
  return {
    items: rows.map((r) => ({
      id: r.id,
      version: r.version,
      createdAt: new Date(r.created_at).toISOString(),
      expiresAt: r.expires_at ? new Date(r.expires_at).toISOString() : null,
      revokedAt: r.revoked_at ? new Date(r.revoked_at).toISOString() : null,
      state: stateOf(r),
      openCount: Number(r.opens),
      lastOpenedAt: r.last_opened ? new Date(r.last_opened).toISOString() : null,
      createdBy: { id: r.created_by, name: r.name, email: r.email },
    })),
  };
}

/** Revokes a link: its creator, or an admin of its workspace. */
export async function revokeShare(ds: DataSource, userId: string, shareId: string): Promise<void> {
  await ds.transaction(async (m) => {
    const rows: { netlist_id: string; workspace_id: string; created_by: string; revoked_at: Date | null; role: Role | null; owner_id: string; visibility: string }[] = await m.query(
      `SELECT s.netlist_id, n.workspace_id, s.created_by, s.revoked_at, mm.role, n.owner_id, n.visibility
       FROM share_links s JOIN netlists n ON n.id = s.netlist_id
       LEFT JOIN memberships mm ON mm.workspace_id = n.workspace_id AND mm.user_id = $2
       WHERE s.id = $1 FOR UPDATE OF s`,
      [shareId, userId],
    );
    const s = rows[0];
    if (!s || !netlistRights(s.role, userId, { ownerId: s.owner_id, visibility: s.visibility })) throw new HttpError(404, 'share_not_found', 'There is no such share link.');
    if (s.created_by !== userId && s.role !== 'admin') throw forbidden('Only the link’s creator or an admin revokes it.');
    if (s.revoked_at) return;
    await m.query(`UPDATE share_links SET revoked_at = now() WHERE id = $1`, [shareId]);
    await audit(m, { workspaceId: s.workspace_id, actorId: userId, action: 'share.revoke', targetType: 'share_link', targetId: shareId, details: { netlist: s.netlist_id } });
  });
}

/** What a share link shows; records the opening. 404 for an unknown, expired or revoked token. */
export async function openShared(ds: DataSource, token: string) {
  const unknown = new HttpError(404, 'share_not_found', 'There is no shared netlist at this address.');
  if (!looksLikeToken(token)) throw unknown;
  const rows: { id: string; version: number; created_at: Date; expires_at: Date | null; revoked_at: Date | null; library_pins: LibraryPin[]; name: string; deleted_at: Date | null; workspace_id: string; workspace: string; source: string; rev_at: Date; author: string; sharer: string }[] = await ds.query(
    `SELECT s.id, s.version, s.created_at, s.expires_at, s.revoked_at, s.library_pins, n.name, n.deleted_at, n.workspace_id, w.name AS workspace,
            r.source, r.created_at AS rev_at, a.display_name AS author, c.display_name AS sharer
     FROM share_links s JOIN netlists n ON n.id = s.netlist_id JOIN workspaces w ON w.id = n.workspace_id
     JOIN netlist_revisions r ON r.netlist_id = s.netlist_id AND r.version = s.version
     JOIN users a ON a.id = r.author_id JOIN users c ON c.id = s.created_by
     WHERE s.token_hash = $1`,
    [hashToken(token)],
  );
  const s = rows[0];
  if (!s) throw unknown;
  if (s.revoked_at) throw new HttpError(404, 'share_revoked', 'This link was revoked by its author.');
  if (s.deleted_at) throw new HttpError(404, 'share_revoked', 'This link no longer works: its netlist was deleted.');
  if (stateOf(s) === 'expired') throw new HttpError(404, 'share_expired', `This link expired on ${new Date(s.expires_at!).toUTCString()}.`);
  await ds.query(`INSERT INTO share_openings (share_id) VALUES ($1)`, [s.id]);
  return {
    name: s.name,
    source: s.source,
    version: s.version,
    workspace: { name: s.workspace },
    author: { name: s.author },
    revisionCreatedAt: new Date(s.rev_at).toISOString(),
    sharedBy: { name: s.sharer },
    sharedAt: new Date(s.created_at).toISOString(),
    expiresAt: s.expires_at ? new Date(s.expires_at).toISOString() : null,
    libraryPins: s.library_pins,
    library: await pinnedSources(ds, s.workspace_id, s.library_pins),
  };
}
