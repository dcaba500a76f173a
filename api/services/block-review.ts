/**
 * The review of block versions: submit (author), approve or send back (a reviewer who is not the
 * author), comment (any designer and up, optionally on a line), retire (admins), the queue, and
 * resolving `use path@version` for the bench. Every transition is audited and mailed.
 */
import type { DataSource } from 'typeorm';
import { roleAtLeast, type BlockState, type CheckOutcome } from '../entities';
import { workspaceFor } from './access';
import { audit } from './audit';
import { blockByPath, getVersion, lockVersion, type VersionView } from './blocks';
import { conflict, forbidden, HttpError } from './http-error';
import { reviewDecisionMail, reviewRequestMail } from './mail-templates';
import type { Mailer } from './mailer';
import type { Person } from './users';

const STATE_WORDS: Record<BlockState, string> = { draft: 'a draft', in_review: 'in review', vetted: 'vetted', retired: 'retired' };

function illegal(path: string, version: number, state: BlockState, wanted: string): HttpError {
  return conflict('illegal_transition', `Version ${version} of \`${path}\` is ${STATE_WORDS[state]}; ${wanted}.`);
}

/** Where a version's page is in the app. */
export function versionUrl(publicUrl: string, slug: string, path: string, version: number): string {
  return `${publicUrl}/w/${slug}/library/${path}/${version}`;
}

/** Author: draft → in review, with the checks as solved in their browser; mails the reviewers. */
export async function submitVersion(ds: DataSource, mailer: Mailer, publicUrl: string, actor: Person, slug: string, path: string, version: number, body: { checks: CheckOutcome[]; note?: string }): Promise<VersionView & { mailed: string[] }> {
  const { view, ws } = await ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'designer');
    const v = await lockVersion(m, ws.id, path, version);
    if (v.author_id !== actor.id) throw forbidden('Only its author submits a version.');
    if (v.state !== 'draft') throw illegal(path, version, v.state, 'only a draft can be submitted');
    // The checks are kept from the first submission: a version resubmitted after being sent back is unchanged.
    if (v.submitted_at) await m.query(`UPDATE block_versions SET state = 'in_review' WHERE id = $1`, [v.id]);
    else await m.query(`UPDATE block_versions SET state = 'in_review', submitted_at = now(), checks = $2 WHERE id = $1`, [v.id, JSON.stringify(body.checks)]);
    await m.query(`INSERT INTO reviews (block_version_id, author_id, kind, comment) VALUES ($1, $2, 'submit', $3)`, [v.id, actor.id, body.note ?? '']);
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'block.submit', targetType: 'block_version', targetId: v.id, details: { path, version, checks: body.checks.length, failing: body.checks.filter((c) => !c.pass).length } });
    return { view: await getVersion(m, ws, actor.id, path, version), ws };
  });
  const reviewers: { email: string }[] = await ds.query(
    `SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.workspace_id = $1 AND m.role IN ('reviewer', 'admin') AND u.id <> $2 ORDER BY u.email`,
    [ws.id, actor.id],
  );
  const mailed: string[] = [];
  for (const r of reviewers) {
    const sent = await mailer.send(reviewRequestMail({ to: r.email, author: actor.name, path, version, title: view.title, workspace: ws.name, url: versionUrl(publicUrl, slug, path, version) }));
    if (sent) mailed.push(r.email);
  }
  return { ...view, mailed };
}

export type Decision = 'approve' | 'send_back' | 'comment';

/**
 * A review entry: `approve` (in review → vetted) and `send_back` (in review → draft, with a reason)
 * by a reviewer who is not the author; `comment` by any designer and up, in any state.
 */
export async function reviewVersion(ds: DataSource, mailer: Mailer, publicUrl: string, actor: Person, slug: string, path: string, version: number, body: { decision: Decision; comment?: string; line?: number; comments?: { line: number; text: string }[] }): Promise<VersionView> {
  const { view, authorEmail } = await ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, body.decision === 'comment' ? 'designer' : 'reviewer');
    const v = await lockVersion(m, ws.id, path, version);
    if (body.decision !== 'comment') {
      if (v.author_id === actor.id) throw forbidden('A version is vetted or sent back by a reviewer other than its author.');
      if (v.state !== 'in_review') throw illegal(path, version, v.state, `only a version in review can be ${body.decision === 'approve' ? 'approved' : 'sent back'}`);
      if (body.decision === 'send_back' && !body.comment?.trim() && !body.comments?.length) throw new HttpError(400, 'reason_required', 'Say why it goes back: a comment, or a comment on a line.');
      const next = body.decision === 'approve' ? 'vetted' : 'draft';
      await m.query(`UPDATE block_versions SET state = $2, decided_at = now(), decided_by = $3 WHERE id = $1`, [v.id, next, actor.id]);
    }
    for (const c of body.comments ?? []) {
      await m.query(`INSERT INTO reviews (block_version_id, author_id, kind, comment, line) VALUES ($1, $2, 'comment', $3, $4)`, [v.id, actor.id, c.text, c.line]);
    }
    if (body.decision !== 'comment' || body.comment?.trim()) {
      await m.query(`INSERT INTO reviews (block_version_id, author_id, kind, comment, line) VALUES ($1, $2, $3, $4, $5)`, [v.id, actor.id, body.decision, body.comment?.trim() ?? '', body.line ?? null]);
    }
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: `block.${body.decision}`, targetType: 'block_version', targetId: v.id, details: { path, version, ...(body.comment ? { comment: body.comment.slice(0, 200) } : {}) } });
    const [author] = await m.query(`SELECT email FROM users WHERE id = $1`, [v.author_id]);
    return { view: await getVersion(m, ws, actor.id, path, version), authorEmail: author.email as string };
  });
  if (body.decision !== 'comment') {
    await mailer.send(reviewDecisionMail({ to: authorEmail, reviewer: actor.name, path, version, decision: body.decision, comment: body.comment?.trim() ?? '', url: versionUrl(publicUrl, slug, path, version) }));
  }
  return view;
}

/** Admins: vetted → retired (netlists that pin it still resolve it, with a warning). */
export async function retireVersion(ds: DataSource, actor: Person, slug: string, path: string, version: number): Promise<VersionView> {
  return ds.transaction(async (m) => {
    const ws = await workspaceFor(m, slug, actor.id, 'admin');
    const v = await lockVersion(m, ws.id, path, version);
    if (v.state !== 'vetted') throw illegal(path, version, v.state, 'only a vetted version can be retired');
    await m.query(`UPDATE block_versions SET state = 'retired', retired_at = now(), retired_by = $2 WHERE id = $1`, [v.id, actor.id]);
    await audit(m, { workspaceId: ws.id, actorId: actor.id, action: 'block.retire', targetType: 'block_version', targetId: v.id, details: { path, version } });
    return getVersion(m, ws, actor.id, path, version);
  });
}

export interface QueueItem {
  path: string;
  title: string;
  version: number;
  author: Person;
  submittedAt: string;
  checks: { total: number; failing: number };
}

/** Reviewers: the versions waiting for review that they did not write, oldest first. */
export async function reviewQueue(ds: DataSource, userId: string, slug: string): Promise<{ items: QueueItem[] }> {
  const ws = await workspaceFor(ds, slug, userId, 'reviewer');
  const rows: { path: string; title: string; version: number; author_id: string; name: string; email: string; submitted_at: Date; checks: CheckOutcome[] | null }[] = await ds.query(
    `SELECT b.path, b.title, v.version, v.author_id, u.display_name AS name, u.email, v.submitted_at, v.checks
     FROM block_versions v JOIN blocks b ON b.id = v.block_id JOIN users u ON u.id = v.author_id
     WHERE b.workspace_id = $1 AND v.state = 'in_review' AND v.author_id <> $2 ORDER BY v.submitted_at`,
    [ws.id, userId],
  );
  return {
    items: rows.map((r) => ({
      path: r.path, title: r.title, version: r.version, author: { id: r.author_id, name: r.name, email: r.email },
      submittedAt: new Date(r.submitted_at).toISOString(),
      checks: { total: r.checks?.length ?? 0, failing: r.checks?.filter((c) => !c.pass).length ?? 0 },
    })),
  };
}

/**
 * `use path@version` for the bench: the source of a vetted or retired version to anyone in the
 * workspace, and of a draft or one in review to its author and to reviewers (to try it before it
 * is vetted); with the newest vetted version, so the bench can say when a newer one exists.
 */
export async function resolveUse(ds: DataSource, userId: string, slug: string, path: string, version: number): Promise<{ path: string; version: number; state: BlockState; source: string; newestVetted: number | null }> {
  const ws = await workspaceFor(ds, slug, userId, 'viewer');
  const block = await blockByPath(ds, ws.id, path);
  const rows: { state: BlockState; source: string; author_id: string; newest: number | null }[] = await ds.query(
    `SELECT v.state, v.source, v.author_id,
            (SELECT max(version) FROM block_versions x WHERE x.block_id = v.block_id AND x.state = 'vetted') AS newest
     FROM block_versions v WHERE v.block_id = $1 AND v.version = $2`,
    [block.id, version],
  );
  const r = rows[0];
  const open = r && (r.state === 'vetted' || r.state === 'retired' || r.author_id === userId || roleAtLeast(ws.role, 'reviewer'));
  if (!r || !open) throw new HttpError(404, 'version_not_found', `\`${path}\` has no version ${version} you can use.`);
  return { path, version, state: r.state, source: r.source, newestVetted: r.newest };
}
