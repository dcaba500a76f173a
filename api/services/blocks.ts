/**
 * The block library's catalogue and versions: list and read blocks, propose a block or a new
 * version, edit a draft that was never submitted. Review transitions live in block-review.ts.
 */
import type { DataSource, EntityManager } from 'typeorm';
import { roleAtLeast, type BlockState, type CheckOutcome, type DocumentedName, type Role } from '../entities';
import { workspaceFor } from './access';
import { audit } from './audit';
import { readBlockSource } from './block-source';
import { conflict, forbidden, HttpError } from './http-error';
import { checkSource } from './netlists';
import type { Person, WorkspaceRole } from './users';

export interface BlockSummary {
  id: string;
  path: string;
  category: string;
  title: string;
  summary: string;
  tags: string[];
  /** The newest version of any state. */
  latest: { version: number; state: BlockState };
  /** The newest vetted version, if any: what a netlist should pin. */
  vetted: number | null;
  versions: number;
  updatedAt: string;
}

export interface VersionSummary {
  version: number;
  state: BlockState;
  author: Person;
  createdAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
  decidedBy: Person | null;
  retiredAt: string | null;
}

export interface ReviewEntry {
  id: string;
  author: Person;
  kind: string;
  comment: string;
  line: number | null;
  createdAt: string;
}

export interface VersionView extends VersionSummary {
  path: string;
  title: string;
  source: string;
  pins: DocumentedName[];
  params: DocumentedName[];
  checks: CheckOutcome[] | null;
  reviews: ReviewEntry[];
  /** What the caller may do with it now (the server refuses the rest anyway). */
  can: { edit: boolean; submit: boolean; review: boolean; retire: boolean };
}

export interface CatalogueQuery {
  q?: string;
  /** One block by its exact path. */
  path?: string;
  category?: string;
  state?: BlockState;
  tag?: string;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

/** A block of the workspace by path, locked for a write when asked; 404 when absent. */
export async function blockByPath(m: EntityManager | DataSource, workspaceId: string, path: string, lock = false): Promise<{ id: string; path: string; title: string }> {
  const rows: { id: string; path: string; title: string }[] = await m.query(
    `SELECT id, path, title FROM blocks WHERE workspace_id = $1 AND path = $2${lock ? ' FOR UPDATE' : ''}`,
    [workspaceId, path],
  );
  if (!rows[0]) throw new HttpError(404, 'block_not_found', `The library has no block \`${path}\`.`);
  return rows[0];
}

export async function listBlocks(ds: DataSource, userId: string, slug: string, q: CatalogueQuery): Promise<{ items: BlockSummary[]; total: number }> {
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  const items = await catalogueRows(ds, ws.id, q);
  return { total: items.length, items };
}

/** The catalogue rows of a workspace that match `q` (one statement). */
async function catalogueRows(ds: DataSource, workspaceId: string, q: CatalogueQuery): Promise<BlockSummary[]> {
  const like = `%${(q.q ?? '').trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const rows: { id: string; path: string; category: string; title: string; summary: string; tags: string[]; latest_version: number; latest_state: BlockState; vetted: number | null; versions: number; updated_at: Date }[] = await ds.query(
    `SELECT b.id, b.path, b.category, b.title, b.summary, b.tags,
            l.version AS latest_version, l.state AS latest_state,
            (SELECT max(version) FROM block_versions v WHERE v.block_id = b.id AND v.state = 'vetted') AS vetted,
            (SELECT count(*)::int FROM block_versions v WHERE v.block_id = b.id) AS versions,
            greatest(b.created_at, l.created_at, l.submitted_at, l.decided_at, l.retired_at) AS updated_at
     FROM blocks b
     JOIN LATERAL (SELECT * FROM block_versions v WHERE v.block_id = b.id ORDER BY version DESC LIMIT 1) l ON true
     WHERE b.workspace_id = $1
       AND ($2 = '%%' OR b.path ILIKE $2 OR b.title ILIKE $2 OR b.summary ILIKE $2)
       AND ($3::text IS NULL OR b.category = $3)
       AND ($4::text IS NULL OR EXISTS (SELECT 1 FROM block_versions v WHERE v.block_id = b.id AND v.state = $4))
       AND ($5::text IS NULL OR $5 = ANY (b.tags))
       AND ($6::text IS NULL OR b.path = $6)
     ORDER BY b.path`,
    [workspaceId, like, q.category ?? null, q.state ?? null, q.tag ?? null, q.path ?? null],
  );
  return rows.map((r) => ({
    id: r.id, path: r.path, category: r.category, title: r.title, summary: r.summary, tags: r.tags,
    latest: { version: r.latest_version, state: r.latest_state }, vetted: r.vetted, versions: r.versions, updatedAt: iso(r.updated_at)!,
  }));
}

interface VersionRow {
  id: string;
  version: number;
  state: BlockState;
  source: string;
  pins: DocumentedName[];
  params: DocumentedName[];
  checks: CheckOutcome[] | null;
  author_id: string;
  author_name: string;
  author_email: string;
  created_at: Date;
  submitted_at: Date | null;
  decided_at: Date | null;
  decided_by: string | null;
  decider_name: string | null;
  decider_email: string | null;
  retired_at: Date | null;
}

const VERSION_SELECT = `SELECT v.id, v.version, v.state, v.source, v.pins, v.params, v.checks, v.author_id,
    a.display_name AS author_name, a.email AS author_email, v.created_at, v.submitted_at, v.decided_at,
    v.decided_by, d.display_name AS decider_name, d.email AS decider_email, v.retired_at
  FROM block_versions v JOIN users a ON a.id = v.author_id LEFT JOIN users d ON d.id = v.decided_by`;

function versionSummary(r: VersionRow): VersionSummary {
  return {
    version: r.version,
    state: r.state,
    author: { id: r.author_id, name: r.author_name, email: r.author_email },
    createdAt: iso(r.created_at)!,
    submittedAt: iso(r.submitted_at),
    decidedAt: iso(r.decided_at),
    decidedBy: r.decided_by ? { id: r.decided_by, name: r.decider_name ?? '', email: r.decider_email ?? '' } : null,
    retiredAt: iso(r.retired_at),
  };
}

export async function getBlock(ds: DataSource, userId: string, slug: string, path: string): Promise<BlockSummary & { versionsList: VersionSummary[] }> {
  // Three statements: the membership, the block's catalogue row, its versions.
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  const [summary] = await catalogueRows(ds, ws.id, { path });
  if (!summary) throw new HttpError(404, 'block_not_found', `The library has no block \`${path}\`.`);
  const rows: VersionRow[] = await ds.query(`${VERSION_SELECT} WHERE v.block_id = $1 ORDER BY v.version DESC`, [summary.id]);
  return { ...summary, versionsList: rows.map(versionSummary) };
}

/** The rights of `role` held by `userId` over a version in `state` written by `authorId`. */
export function versionRights(role: Role, userId: string, v: { state: BlockState; authorId: string; submitted: boolean }) {
  const author = v.authorId === userId;
  return {
    edit: author && v.state === 'draft' && !v.submitted && roleAtLeast(role, 'designer'),
    submit: author && v.state === 'draft' && roleAtLeast(role, 'designer'),
    review: !author && v.state === 'in_review' && roleAtLeast(role, 'reviewer'),
    retire: v.state === 'vetted' && roleAtLeast(role, 'admin'),
  };
}

/** One version with its source, checks and review thread. */
export async function getVersion(m: EntityManager | DataSource, ws: WorkspaceRole, userId: string, path: string, version: number): Promise<VersionView> {
  const block = await blockByPath(m, ws.id, path);
  const rows: VersionRow[] = await m.query(`${VERSION_SELECT} WHERE v.block_id = $1 AND v.version = $2`, [block.id, version]);
  const r = rows[0];
  if (!r) throw new HttpError(404, 'version_not_found', `\`${path}\` has no version ${version}.`);
  const reviews: { id: string; author_id: string; name: string; email: string; kind: string; comment: string; line: number | null; created_at: Date }[] = await m.query(
    `SELECT r.id, r.author_id, u.display_name AS name, u.email, r.kind, r.comment, r.line, r.created_at
     FROM reviews r JOIN users u ON u.id = r.author_id WHERE r.block_version_id = $1 ORDER BY r.created_at, r.id`,
    [r.id],
  );
  return {
    ...versionSummary(r),
    path,
    title: block.title,
    source: r.source,
    pins: r.pins,
    params: r.params,
    checks: r.checks,
    reviews: reviews.map((x) => ({ id: x.id, author: { id: x.author_id, name: x.name, email: x.email }, kind: x.kind, comment: x.comment, line: x.line, createdAt: iso(x.created_at)! })),
    can: versionRights(ws.role, userId, { state: r.state, authorId: r.author_id, submitted: !!r.submitted_at }),
  };
}

export async function readVersion(ds: DataSource, userId: string, slug: string, path: string, version: number): Promise<VersionView> {
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  return getVersion(ds, ws, userId, path, version);
}

/** Proposes a new block: its first version, a draft of the caller's. */
export async function createBlock(ds: DataSource, actor: Person, slug: string, body: { path: string; source: string; title?: string; summary?: string; tags?: string[] }): Promise<VersionView> {
  checkSource(body.source);
  const facts = readBlockSource(body.path, body.source);
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'designer');
    const exists: unknown[] = await m.query(`SELECT 1 FROM blocks WHERE workspace_id = $1 AND path = $2`, [ws.id, body.path]);
    if (exists.length) throw conflict('block_exists', `\`${body.path}\` already exists: propose a new version of it instead.`);
    const title = body.title?.trim() || facts.title || body.path.split('/')[1];
    const [block] = await m.query(
      `INSERT INTO blocks (workspace_id, path, title, summary, tags, created_by) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
      [ws.id, body.path, title.slice(0, 120), (body.summary ?? facts.summary ?? '').slice(0, 2000), body.tags ?? facts.tags, actor.id],
    );
    await insertVersion(m, block.id, 1, body.source, facts, actor.id);
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'block.create', targetType: 'block', targetId: block.id, details: { path: body.path } });
    return getVersion(m, ws, actor.id, body.path, 1);
  });
}

async function insertVersion(m: EntityManager, blockId: string, version: number, source: string, facts: ReturnType<typeof readBlockSource>, authorId: string): Promise<void> {
  await m.query(
    `INSERT INTO block_versions (block_id, version, source, pins, params, author_id) VALUES ($1, $2, $3, $4, $5, $6)`,
    [blockId, version, source, JSON.stringify(facts.pins), JSON.stringify(facts.params), authorId],
  );
}

/** Proposes the next version of a block (a draft of the caller's, numbered after the newest). */
export async function addVersion(ds: DataSource, actor: Person, slug: string, path: string, body: { source: string }): Promise<VersionView> {
  checkSource(body.source);
  const facts = readBlockSource(path, body.source);
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'designer');
    const block = await blockByPath(m, ws.id, path, true);
    const [{ next }] = await m.query(`SELECT coalesce(max(version), 0) + 1 AS next FROM block_versions WHERE block_id = $1`, [block.id]);
    await insertVersion(m, block.id, next, body.source, facts, actor.id);
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'block.new_version', targetType: 'block', targetId: block.id, details: { path, version: next } });
    return getVersion(m, ws, actor.id, path, next);
  });
}

/** Changes a draft's source: its author only, and only before it was ever submitted. */
export async function editDraft(ds: DataSource, actor: Person, slug: string, path: string, version: number, body: { source: string }): Promise<VersionView> {
  checkSource(body.source);
  const facts = readBlockSource(path, body.source);
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'designer');
    const v = await lockVersion(m, ws.id, path, version);
    if (v.author_id !== actor.id) throw forbidden('Only its author edits a draft.');
    if (v.submitted_at) throw conflict('version_frozen', `Version ${version} of \`${path}\` was submitted: its source never changes. Propose a new version instead.`);
    await m.query(`UPDATE block_versions SET source = $2, pins = $3, params = $4 WHERE id = $1`, [v.id, body.source, JSON.stringify(facts.pins), JSON.stringify(facts.params)]);
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'block.edit_draft', targetType: 'block_version', targetId: v.id, details: { path, version } });
    return getVersion(m, ws, actor.id, path, version);
  });
}

/** A version row locked for a transition. */
export async function lockVersion(m: EntityManager, workspaceId: string, path: string, version: number): Promise<{ id: string; block_id: string; state: BlockState; author_id: string; submitted_at: Date | null; title: string }> {
  const rows: { id: string; block_id: string; state: BlockState; author_id: string; submitted_at: Date | null; title: string }[] = await m.query(
    `SELECT v.id, v.block_id, v.state, v.author_id, v.submitted_at, b.title FROM block_versions v JOIN blocks b ON b.id = v.block_id
     WHERE b.workspace_id = $1 AND b.path = $2 AND v.version = $3 FOR UPDATE OF v`,
    [workspaceId, path, version],
  );
  if (!rows[0]) throw new HttpError(404, 'version_not_found', `\`${path}\` has no version ${version}.`);
  return rows[0];
}
