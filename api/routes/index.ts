/** Every API route, in one table (the order only matters for the OpenAPI document). */
import type { RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import type { RouteDef } from '../http/route';
import type { Mailer } from '../services/mailer';
import { libraryRoutes } from './library';
import { meRoutes } from './me';
import { memberRoutes } from './members';
import { netlistRoutes } from './netlists';
import { shareRoutes } from './shares';

export interface ApiRouteDeps {
  ds: DataSource;
  mailer: Mailer;
  publicUrl: string;
  devInboxUrl: string | null;
  /** Rate limit for link lookups that need no sign-in (shared netlists, invitations). */
  lookupLimiter: RequestHandler;
  openApi: () => unknown;
}

export function apiRoutes(d: ApiRouteDeps): RouteDef[] {
  return [
    ...meRoutes(d.ds, { devInboxUrl: d.devInboxUrl }, d.openApi),
    ...netlistRoutes(d.ds),
    ...shareRoutes(d.ds, d.mailer, d.publicUrl, d.lookupLimiter),
    ...memberRoutes(d.ds, d.mailer, d.publicUrl, d.lookupLimiter),
    ...libraryRoutes(d.ds, d.mailer, d.publicUrl),
  ];
}
