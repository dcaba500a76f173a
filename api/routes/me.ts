/** Who is signed in, public settings, health, and the API's own description. */
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { route, type RouteDef } from '../http/route';
import { databaseHealth } from '../services/health';
import { workspacesOf } from '../services/users';
import { PersonSchema, RoleSchema } from './schemas';

export function meRoutes(ds: DataSource, settings: { devInboxUrl: string | null }, openApi: () => unknown): RouteDef[] {
  return [
    route({
      method: 'get', path: '/me', tag: 'session', access: 'signed-in',
      summary: 'The signed-in user and their workspaces with roles (401 when signed out)',
      response: z.object({ user: PersonSchema, workspaces: z.array(z.object({ slug: z.string(), name: z.string(), role: RoleSchema })) }),
      handle: async ({ user, res }) => {
        res.setHeader('Cache-Control', 'no-store');
        const workspaces = await workspacesOf(ds, user.id);
        return { user, workspaces: workspaces.map(({ slug, name, role }) => ({ slug, name, role })) };
      },
    }),
    route({
      method: 'get', path: '/settings', tag: 'session', access: 'public',
      summary: 'Public settings of this server (the development mail inbox, when in use)',
      response: z.object({ devInboxUrl: z.string().nullable() }),
      handle: async () => settings,
    }),
    route({
      method: 'get', path: '/health', tag: 'operations', access: 'public',
      summary: 'Liveness and a database round trip (503 when the database is down)',
      handle: async ({ res }) => {
        const health = await databaseHealth(ds);
        res.status(health.database === 'ok' ? 200 : 503).json({ status: health.database === 'ok' ? 'ok' : 'degraded', ...health });
      },
    }),
    route({
      method: 'get', path: '/openapi.json', tag: 'operations', access: 'public',
      summary: 'This document',
      handle: async () => openApi(),
    }),
  ];
}
