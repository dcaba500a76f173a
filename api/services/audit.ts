/**
 * The audit log: every write, in the same transaction as the write, so the log never claims what
 * did not happen nor misses what did.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { Person } from './users';

export interface AuditRecord {
  workspaceId: string | null;
  actorId: string | null;
  /** `noun.verb`, e.g. `netlist.save`. */
  action: string;
  targetType: string;
  targetId?: string | null;
  details?: Record<string, unknown>;
}

export async function audit(m: EntityManager | DataSource, r: AuditRecord): Promise<void> {
  await m.query(
    `INSERT INTO audit_log (workspace_id, actor_id, action, target_type, target_id, details) VALUES ($1, $2, $3, $4, $5, $6)`,
    [r.workspaceId, r.actorId, r.action, r.targetType, r.targetId ?? null, r.details ? JSON.stringify(r.details) : null],
  );
}

export interface AuditView {
  id: string;
  at: string;
  actor: Person | null;
  action: string;
  targetType: string;
  targetId: string | null;
  details: Record<string, unknown> | null;
}

/** A workspace's log, newest first. */
export async function auditPage(ds: DataSource, workspaceId: string, page: number, pageSize: number): Promise<{ items: AuditView[]; total: number }> {
  const rows: (Omit<AuditView, 'actor'> & { actor_id: string | null; actor_name: string | null; actor_email: string | null; total: string })[] = await ds.query(
    `SELECT a.id::text, a.at, a.action, a.target_type AS "targetType", a.target_id AS "targetId", a.details,
            a.actor_id, u.display_name AS actor_name, u.email AS actor_email, count(*) OVER () AS total
     FROM audit_log a LEFT JOIN users u ON u.id = a.actor_id
     WHERE a.workspace_id = $1 ORDER BY a.at DESC, a.id DESC LIMIT $2 OFFSET $3`,
    [workspaceId, pageSize, page * pageSize],
  );
  const total = rows[0] ? Number(rows[0].total) : Number((await ds.query(`SELECT count(*) AS n FROM audit_log WHERE workspace_id = $1`, [workspaceId]))[0].n);
  return {
    total,
    items: rows.map((r) => ({
      id: r.id,
      at: new Date(r.at).toISOString(),
      actor: r.actor_id ? { id: r.actor_id, name: r.actor_name ?? '', email: r.actor_email ?? '' } : null,
      action: r.action,
      targetType: r.targetType,
      targetId: r.targetId,
      details: r.details,
    })),
  };
}
