/**
 * Who may do what, decided on the server for every route: a user's role in a workspace, and the
 * netlist rules (a private netlist is its owner's alone; designers write; owners and admins delete).
 */
import type { DataSource, EntityManager } from 'typeorm';
import { roleAtLeast, type Role } from '../entities';
import { forbidden, HttpError } from './http-error';
import type { WorkspaceRole } from './users';

/** The workspace `slug` with the user's role in it; 404 when it does not exist, 403 when not a member. */
export async function workspaceFor(ds: DataSource | EntityManager, slug: string, userId: string, needed: Role): Promise<WorkspaceRole> {
  const rows: (Omit<WorkspaceRole, 'role'> & { role: Role | null })[] = await ds.query(
    `SELECT w.id, w.slug, w.name, m.role FROM workspaces w
     LEFT JOIN memberships m ON m.workspace_id = w.id AND m.user_id = $2 WHERE w.slug = $1`,
    [slug, userId],
  );
  const ws = rows[0];
  if (!ws) throw new HttpError(404, 'workspace_not_found', `There is no workspace "${slug}".`);
  if (!ws.role) throw new HttpError(403, 'not_a_member', `You are not a member of ${ws.name}.`);
  if (!roleAtLeast(ws.role, needed)) throw forbidden(`This needs the ${needed} role in ${ws.name}; yours is ${ws.role}.`);
  return ws as WorkspaceRole;
}

/** What a user may do with one netlist, given their role and the netlist's owner and visibility. */
export interface NetlistRights {
  role: Role;
  read: boolean;
  write: boolean;
  delete: boolean;
  /** Change visibility: the owner only. */
  own: boolean;
}

export function netlistRights(role: Role | null, userId: string, netlist: { ownerId: string; visibility: string }): NetlistRights | undefined {
  if (!role) return undefined;
  const own = netlist.ownerId === userId;
  const read = own || netlist.visibility === 'workspace';
  if (!read) return undefined;
  const designer = roleAtLeast(role, 'designer');
  return { role, read, own, write: designer, delete: (own && designer) || roleAtLeast(role, 'admin') };
}
