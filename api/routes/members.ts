/** Routes of workspace members, invitations and the audit log (docs/api.md). */
import type { RequestHandler } from 'express';
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { route, type RouteDef } from '../http/route';
import { workspaceFor } from '../services/access';
import { auditPage } from '../services/audit';
import type { Mailer } from '../services/mailer';
import { changeRole, invite, listInvitations, listMembers, previewInvitation, removeMember, revokeInvitation } from '../services/members';
import { Email, Id, IdParams, PageQuery, PersonSchema, RoleSchema, SlugParams } from './schemas';

const Member = z.object({ userId: z.string(), name: z.string(), email: z.string(), role: RoleSchema, joinedAt: z.string() });
const Invitation = z.object({ id: z.string(), email: z.string(), role: RoleSchema, createdAt: z.string(), expiresAt: z.string(), invitedBy: PersonSchema });
const MemberParams = SlugParams.extend({ userId: Id });

export function memberRoutes(ds: DataSource, mailer: Mailer, publicUrl: string, lookupLimiter: RequestHandler): RouteDef[] {
  return [
    route({
      method: 'get', path: '/workspaces/:slug/members', tag: 'members', access: 'signed-in', role: 'viewer',
      summary: 'The workspace’s members and their roles', params: SlugParams, response: z.object({ items: z.array(Member) }), errors: [403, 404],
      handle: ({ params, user }) => listMembers(ds, user.id, params.slug),
    }),
    route({
      method: 'patch', path: '/workspaces/:slug/members/:userId', tag: 'members', access: 'signed-in', role: 'admin',
      summary: 'Change a member’s role (never leaving the workspace without an admin)',
      params: MemberParams, body: z.object({ role: RoleSchema }), response: Member, errors: [403, 404, 409],
      handle: ({ params, body, user }) => changeRole(ds, user.id, params.slug, params.userId, body.role),
    }),
    route({
      method: 'delete', path: '/workspaces/:slug/members/:userId', tag: 'members', access: 'signed-in', role: 'admin',
      summary: 'Remove a member (never the last admin)', params: MemberParams, errors: [403, 404, 409],
      handle: async ({ params, user }) => void (await removeMember(ds, user.id, params.slug, params.userId)),
    }),
    route({
      method: 'get', path: '/workspaces/:slug/invitations', tag: 'members', access: 'signed-in', role: 'admin',
      summary: 'Pending invitations', params: SlugParams, response: z.object({ items: z.array(Invitation) }), errors: [403, 404],
      handle: ({ params, user }) => listInvitations(ds, user.id, params.slug),
    }),
    route({
      method: 'post', path: '/workspaces/:slug/invitations', tag: 'members', access: 'signed-in', role: 'admin', status: 201,
      summary: 'Invite by e-mail (the single-use link goes by mail only)',
      params: SlugParams, body: z.object({ email: Email, role: RoleSchema }), response: Invitation.extend({ mailed: z.boolean() }), errors: [403, 404, 409],
      handle: ({ params, body, user }) => invite(ds, mailer, publicUrl, user, params.slug, body),
    }),
    route({
      method: 'delete', path: '/invitations/:id', tag: 'members', access: 'signed-in', role: 'admin',
      summary: 'Revoke a pending invitation', params: IdParams, errors: [403, 404, 409],
      handle: async ({ params, user }) => void (await revokeInvitation(ds, user.id, params.id)),
    }),
    route({
      method: 'get', path: '/invitations/:token', tag: 'members', access: 'public',
      summary: 'What an invitation link offers (no sign-in); 404 invitation_unavailable',
      params: z.object({ token: z.string().max(64) }),
      before: [lookupLimiter],
      response: z.object({ workspace: z.object({ slug: z.string(), name: z.string() }), email: z.string(), role: RoleSchema, invitedBy: z.object({ name: z.string() }), expiresAt: z.string() }),
      errors: [404, 429],
      handle: ({ params }) => previewInvitation(ds, params.token),
    }),
    route({
      method: 'get', path: '/workspaces/:slug/audit', tag: 'members', access: 'signed-in', role: 'admin',
      summary: 'The workspace’s audit log, newest first', params: SlugParams, query: z.object(PageQuery),
      response: z.object({ items: z.array(z.object({ id: z.string(), at: z.string(), actor: PersonSchema.nullable(), action: z.string(), targetType: z.string(), targetId: z.string().nullable(), details: z.record(z.string(), z.unknown()).nullable() })), total: z.number().int() }),
      errors: [403, 404],
      handle: async ({ params, query, user }) => {
        const ws = await workspaceFor(ds, params.slug, user.id, 'admin');
        return auditPage(ds, ws.id, query.page, Math.min(query.pageSize, 100));
      },
    }),
  ];
}
