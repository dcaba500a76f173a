/** Routes of share links: made by designers, opened by anyone holding the link (docs/api.md). */
import type { RequestHandler } from 'express';
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { route, type RouteDef } from '../http/route';
import type { Mailer } from '../services/mailer';
import { createShare, listShares, openShared, revokeShare } from '../services/shares';
import { Email, IdParams, PersonSchema } from './schemas';

const LibraryPin = z.object({ path: z.string().regex(/^[A-Za-z0-9_]+(\/[A-Za-z0-9_]+)*$/, 'must be a block path'), version: z.number().int().min(1) });

export function shareRoutes(ds: DataSource, mailer: Mailer, publicUrl: string, sharedLimiter: RequestHandler): RouteDef[] {
  return [
    route({
      method: 'post', path: '/netlists/:id/shares', tag: 'shares', access: 'signed-in', role: 'designer', status: 201,
      summary: 'Make a read-only link to the current revision (the token is in `url`, only in this answer)',
      params: IdParams,
      body: z.object({
        expiresAt: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 date-time' }).transform((s) => new Date(s)).optional(),
        notify: z.array(Email).max(20, 'at most 20 addresses').optional(),
      }),
      response: z.object({ id: z.string(), url: z.string(), version: z.number().int(), expiresAt: z.string().nullable(), createdAt: z.string(), notified: z.array(z.string()) }),
      errors: [403, 404],
      handle: ({ params, body, user }) => createShare(ds, mailer, publicUrl, user, params.id, body),
    }),
    route({
      method: 'get', path: '/netlists/:id/shares', tag: 'shares', access: 'signed-in', role: 'designer (own links; an admin: all)',
      summary: 'The netlist’s share links with their openings',
      params: IdParams,
      response: z.object({ items: z.array(z.object({ id: z.string(), version: z.number().int(), createdAt: z.string(), expiresAt: z.string().nullable(), revokedAt: z.string().nullable(), state: z.enum(['active', 'expired', 'revoked']), openCount: z.number().int(), lastOpenedAt: z.string().nullable(), createdBy: PersonSchema })) }),
      errors: [403, 404],
      handle: ({ params, user }) => listShares(ds, user.id, params.id),
    }),
    route({
      method: 'delete', path: '/shares/:id', tag: 'shares', access: 'signed-in', role: 'the link’s creator or an admin',
      summary: 'Revoke a share link', params: IdParams, errors: [403, 404],
      handle: async ({ params, user }) => void (await revokeShare(ds, user.id, params.id)),
    }),
    route({
      method: 'get', path: '/shared/:token', tag: 'shares', access: 'public',
      summary: 'What a share link shows (no sign-in); 404 share_not_found, share_expired or share_revoked',
      params: z.object({ token: z.string().max(64) }),
      before: [sharedLimiter],
      response: z.object({ name: z.string(), source: z.string(), version: z.number().int(), workspace: z.object({ name: z.string() }), author: z.object({ name: z.string() }), revisionCreatedAt: z.string(), sharedBy: z.object({ name: z.string() }), sharedAt: z.string(), expiresAt: z.string().nullable(), libraryPins: z.array(LibraryPin), library: z.array(LibraryPin.extend({ source: z.string() })) }),
      errors: [404, 429],
      handle: async ({ params, res }) => {
        // A shared page must not be kept by shared caches, and its address is a secret.
        res.setHeader('Cache-Control', 'no-store');
        res.setHeader('Referrer-Policy', 'no-referrer');
        return openShared(ds, params.token);
      },
    }),
  ];
}
