/**
 * Team netlists: create, list, read, save (every save a revision, optimistic concurrency), rename,
 * soft delete and restore, revisions and restoring one as a new revision. Every write is audited
 * in its own transaction.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { Role, Visibility } from '../entities';
import { netlistRights, workspaceFor, type NetlistRights } from './access';
import { audit } from './audit';
import { conflict, forbidden, HttpError, notFound } from './http-error';
import { rowsOf } from './sql';
import type { Person } from './users';

/** Largest netlist text accepted, in UTF-8 bytes (a netlist is a few kB). */
export const MAX_SOURCE_BYTES = 256 * 1024;
/** How long a deleted netlist can be restored. */
export const RESTORE_DAYS = 30;

export interface NetlistSummary {
  id: string;
  workspace: string;
  name: string;
  visibility: Visibility;
  version: number;
  size: number;
  owner: Person;
  updatedBy: Person;
  createdAt: string;
  updatedAt: string;
  deletedAt: string | null;
  canWrite: boolean;
  canDelete: boolean;
}
export interface NetlistView extends NetlistSummary {
  source: string;
}

export interface NetlistListQuery {
  q?: string;
  sort: 'name' | 'updatedAt' | 'size' | 'owner';
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
  deleted: boolean;
}

interface Row {
  id: string;
  workspace_id: string;
  slug: string;
  name: string;
  visibility: Visibility;
  version: number;
  size: number;
  source?: string;
  owner_id: string;
  owner_name: string;
  owner_email: string;
  updated_by: string;
  updater_name: string;
  updater_email: string;
  created_at: Date;
  updated_at: Date;
  deleted_at: Date | null;
  role: Role | null;
}

const SELECT = `SELECT n.id, n.workspace_id, w.slug, n.name, n.visibility, n.version, n.size,
  n.owner_id, o.display_name AS owner_name, o.email AS owner_email,
  n.updated_by, u.display_name AS updater_name, u.email AS updater_email,
  n.created_at, n.updated_at, n.deleted_at`;
const FROM = `FROM netlists n JOIN workspaces w ON w.id = n.workspace_id
  JOIN users o ON o.id = n.owner_id JOIN users u ON u.id = n.updated_by`;

function summary(r: Row, rights: NetlistRights): NetlistSummary {
  return {
    id: r.id,
    workspace: r.slug,
    name: r.name,
    visibility: r.visibility,
    version: r.version,
    size: r.size,
    owner: { id: r.owner_id, name: r.owner_name, email: r.owner_email },
    updatedBy: { id: r.updated_by, name: r.updater_name, email: r.updater_email },
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
    deletedAt: r.deleted_at ? new Date(r.deleted_at).toISOString() : null,
    canWrite: rights.write && !r.deleted_at,
    canDelete: rights.delete,
  };
}

/** The text's size in bytes, refusing what is not a netlist (too large, or binary). */
export function checkSource(source: string): number {
  const size = Buffer.byteLength(source, 'utf8');
  if (size > MAX_SOURCE_BYTES) throw new HttpError(413, 'source_too_large', `The netlist is ${(size / 1024).toFixed(0)} kB; the limit is ${MAX_SOURCE_BYTES / 1024} kB.`);
  if (source.includes('\u0000')) throw new HttpError(400, 'not_text', 'The netlist contains NUL characters; it must be plain text.');
  return size;
}

/**
 * One netlist with the caller's rights; 404 when it does not exist or is not visible to them
 * (their workspace's, and theirs when private). `lock` takes a row lock for a write.
 */
async function load(m: EntityManager | DataSource, userId: string, id: string, opts: { lock?: boolean; withSource?: boolean; deleted?: 'exclude' | 'include' } = {}): Promise<{ row: Row; rights: NetlistRights }> {
  if (opts.lock) await m.query(`SELECT 1 FROM netlists WHERE id = $1 FOR UPDATE`, [id]);
  const rows: Row[] = await m.query(
    `${SELECT}${opts.withSource ? ', n.source' : ''}, mem.role ${FROM}
     LEFT JOIN memberships mem ON mem.workspace_id = n.workspace_id AND mem.user_id = $2 WHERE n.id = $1`,
    [id, userId],
  );
  const row = rows[0];
  const rights = row ? netlistRights(row.role, userId, { ownerId: row.owner_id, visibility: row.visibility }) : undefined;
  if (!row || !rights) throw notFound('This netlist');
  if (row.deleted_at && opts.deleted !== 'include') throw new HttpError(404, 'deleted', `“${row.name}” was deleted; it can be restored from the deleted list for ${RESTORE_DAYS} days.`);
  return { row, rights };
}

export async function listNetlists(ds: DataSource, userId: string, slug: string, q: NetlistListQuery): Promise<{ items: NetlistSummary[]; total: number }> {
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  const order = { name: 'lower(n.name)', updatedAt: 'n.updated_at', size: 'n.size', owner: 'lower(o.display_name)' }[q.sort];
  const dir = q.order === 'asc' ? 'ASC' : 'DESC';
  const isAdmin = ws.role === 'admin';
  const deletedFilter = q.deleted
    ? `n.deleted_at IS NOT NULL AND n.deleted_at > now() - interval '${RESTORE_DAYS} days' AND (n.owner_id = $2 OR ${isAdmin ? 'true' : 'false'})`
    : 'n.deleted_at IS NULL';
  const like = `%${(q.q ?? '').trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const rows: (Row & { total: string })[] = await ds.query(
    `${SELECT}, count(*) OVER () AS total ${FROM}
     WHERE n.workspace_id = $1 AND (n.visibility = 'workspace' OR n.owner_id = $2) AND ${deletedFilter}
       AND ($3 = '%%' OR n.name ILIKE $3 OR o.display_name ILIKE $3)
     ORDER BY ${order} ${dir}, n.id LIMIT $4 OFFSET $5`,
    [ws.id, userId, like, q.pageSize, q.page * q.pageSize],
  );
  const total = rows[0] ? Number(rows[0].total) : 0;
  return {
    total,
    items: rows.map((r) => summary({ ...r, role: ws.role }, netlistRights(ws.role, userId, { ownerId: r.owner_id, visibility: r.visibility })!)),
  };
}

export async function createNetlist(ds: DataSource, userId: string, slug: string, body: { name: string; source: string; visibility?: Visibility }): Promise<NetlistView> {
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, userId, 'designer');
    const id = await insertNetlist(m, userId, ws.id, body);
    await audit(m, { workspaceId: ws.id, actorId: userId, action: 'netlist.create', targetType: 'netlist', targetId: id, details: { name: body.name.trim() } });
    return getNetlist(m, userId, id);
  });
}

/** Inserts a netlist and its first revision; returns its id. */
export async function insertNetlist(m: EntityManager, userId: string, workspaceId: string, body: { name: string; source: string; visibility?: Visibility }): Promise<string> {
  const size = checkSource(body.source);
  const [{ id }] = await m.query(
    `INSERT INTO netlists (workspace_id, owner_id, name, visibility, version, source, size, updated_by)
     VALUES ($1, $2, $3, $4, 1, $5, $6, $2) RETURNING id`,
    [workspaceId, userId, body.name.trim(), body.visibility ?? 'workspace', body.source, size],
  );
  await m.query(`INSERT INTO netlist_revisions (netlist_id, version, source, size, author_id) VALUES ($1, 1, $2, $3, $4)`, [id, body.source, size, userId]);
  return id;
}

export async function getNetlist(m: EntityManager | DataSource, userId: string, id: string): Promise<NetlistView> {
  const { row, rights } = await load(m, userId, id, { withSource: true });
  return { ...summary(row, rights), source: row.source! };
}

/**
 * Saves new text as the next revision, only if `baseVersion` is still the current version; else
 * 409 `stale` with the current server copy, so the client can show both and nothing is lost.
 */
export async function saveNetlist(ds: DataSource, userId: string, id: string, body: { source: string; baseVersion: number; name?: string }, restoredFrom?: number): Promise<NetlistSummary> {
  const size = checkSource(body.source);
  return ds.transaction(async (m) => {
    const { row, rights } = await load(m, userId, id, { lock: true, withSource: true });
    if (!rights.write) throw forbidden(`Saving needs the designer role; yours is ${rights.role}.`);
    if (row.version !== body.baseVersion) {
      throw conflict('stale', `Version ${row.version} was saved by ${row.updater_name} after the version ${body.baseVersion} you started from.`, {
        current: { version: row.version, source: row.source, name: row.name, updatedAt: new Date(row.updated_at).toISOString(), author: { id: row.updated_by, name: row.updater_name, email: row.updater_email } },
      });
    }
    const version = row.version + 1;
    const name = body.name?.trim() || row.name;
    await m.query(
      `UPDATE netlists SET version = $2, source = $3, size = $4, name = $5, updated_by = $6, updated_at = now() WHERE id = $1`,
      [id, version, body.source, size, name, userId],
    );
    await m.query(
      `INSERT INTO netlist_revisions (netlist_id, version, source, size, author_id, restored_from) VALUES ($1, $2, $3, $4, $5, $6)`,
      [id, version, body.source, size, userId, restoredFrom ?? null],
    );
    await audit(m, {
      workspaceId: row.workspace_id, actorId: userId, action: restoredFrom ? 'netlist.restore_revision' : 'netlist.save', targetType: 'netlist', targetId: id,
      details: { version, ...(restoredFrom ? { from: restoredFrom } : {}), ...(name !== row.name ? { renamedFrom: row.name, name } : {}) },
    });
    const { row: after, rights: r } = await load(m, userId, id);
    return summary(after, r);
  });
}

/** Rename or change visibility (no new revision: the text is unchanged). */
export async function updateNetlist(ds: DataSource, userId: string, id: string, body: { name?: string; visibility?: Visibility }): Promise<NetlistSummary> {
  return ds.transaction(async (m) => {
    const { row, rights } = await load(m, userId, id, { lock: true });
    if (!rights.write) throw forbidden(`Renaming needs the designer role; yours is ${rights.role}.`);
    if (body.visibility && body.visibility !== row.visibility && !rights.own) throw forbidden('Only the owner changes who can see a netlist.');
    const name = body.name?.trim() ?? row.name;
    const visibility = body.visibility ?? row.visibility;
    await m.query(`UPDATE netlists SET name = $2, visibility = $3 WHERE id = $1`, [id, name, visibility]);
    await audit(m, { workspaceId: row.workspace_id, actorId: userId, action: 'netlist.update', targetType: 'netlist', targetId: id, details: { name, visibility, was: { name: row.name, visibility: row.visibility } } });
    const { row: after, rights: r } = await load(m, userId, id);
    return summary(after, r);
  });
}

export async function deleteNetlist(ds: DataSource, userId: string, id: string): Promise<void> {
  await ds.transaction(async (m) => {
    const { row, rights } = await load(m, userId, id, { lock: true });
    if (!rights.delete) throw forbidden('Only its owner or an admin deletes a netlist.');
    await m.query(`UPDATE netlists SET deleted_at = now(), deleted_by = $2 WHERE id = $1`, [id, userId]);
    await audit(m, { workspaceId: row.workspace_id, actorId: userId, action: 'netlist.delete', targetType: 'netlist', targetId: id, details: { name: row.name } });
  });
}

export async function restoreNetlist(ds: DataSource, userId: string, id: string): Promise<NetlistSummary> {
  return ds.transaction(async (m) => {
    const { row, rights } = await load(m, userId, id, { lock: true, deleted: 'include' });
    if (!rights.delete) throw forbidden('Only its owner or an admin restores a netlist.');
    if (!row.deleted_at) throw conflict('not_deleted', `“${row.name}” is not deleted.`);
    if (Date.now() - new Date(row.deleted_at).getTime() > RESTORE_DAYS * 86400_000) throw new HttpError(410, 'restore_expired', `“${row.name}” was deleted more than ${RESTORE_DAYS} days ago.`);
    await m.query(`UPDATE netlists SET deleted_at = NULL, deleted_by = NULL WHERE id = $1`, [id]);
    await audit(m, { workspaceId: row.workspace_id, actorId: userId, action: 'netlist.restore', targetType: 'netlist', targetId: id, details: { name: row.name } });
    const { row: after, rights: r } = await load(m, userId, id);
    return summary(after, r);
  });
}

/** Deleted netlists past their restore window are removed for good (revisions and links with them). */
export async function purgeDeleted(ds: DataSource): Promise<number> {
  const rows = rowsOf<{ id: string }>(await ds.query(`DELETE FROM netlists WHERE deleted_at < now() - interval '${RESTORE_DAYS} days' RETURNING id`));
  return rows.length;
}

export interface RevisionView {
  version: number;
  author: Person;
  createdAt: string;
  size: number;
  restoredFrom: number | null;
  source?: string;
}

export async function listRevisions(ds: DataSource, userId: string, id: string): Promise<{ items: RevisionView[] }> {
  await load(ds, userId, id);
  const rows: { version: number; size: number; created_at: Date; restored_from: number | null; author_id: string; name: string; email: string }[] = await ds.query(
    `SELECT r.version, r.size, r.created_at, r.restored_from, r.author_id, u.display_name AS name, u.email
     FROM netlist_revisions r JOIN users u ON u.id = r.author_id WHERE r.netlist_id = $1 ORDER BY r.version DESC`,
    [id],
  );
  return { items: rows.map((r) => ({ version: r.version, size: r.size, restoredFrom: r.restored_from, createdAt: new Date(r.created_at).toISOString(), author: { id: r.author_id, name: r.name, email: r.email } })) };
}

export async function getRevision(ds: DataSource | EntityManager, userId: string, id: string, version: number): Promise<RevisionView & { source: string; name: string }> {
  const { row } = await load(ds, userId, id);
  const rows: { version: number; size: number; source: string; created_at: Date; restored_from: number | null; author_id: string; name: string; email: string }[] = await ds.query(
    `SELECT r.version, r.size, r.source, r.created_at, r.restored_from, r.author_id, u.display_name AS name, u.email
     FROM netlist_revisions r JOIN users u ON u.id = r.author_id WHERE r.netlist_id = $1 AND r.version = $2`,
    [id, version],
  );
  const r = rows[0];
  if (!r) throw new HttpError(404, 'revision_not_found', `“${row.name}” has no version ${version}; its newest is ${row.version}.`);
  return { version: r.version, size: r.size, source: r.source, restoredFrom: r.restored_from, createdAt: new Date(r.created_at).toISOString(), author: { id: r.author_id, name: r.name, email: r.email }, name: row.name };
}

/** Saves an old revision's text as the next revision (history is never rewritten). */
export async function restoreRevision(ds: DataSource, userId: string, id: string, version: number, baseVersion: number): Promise<NetlistSummary> {
  const old = await getRevision(ds, userId, id, version);
  return saveNetlist(ds, userId, id, { source: old.source, baseVersion }, version);
}
