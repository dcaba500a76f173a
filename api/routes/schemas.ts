/**
 * Shared zod schemas of the API's edge (one definition per vocabulary: roles and visibilities come
 * from the entities).
 */
import { z } from 'zod';
import { ROLES, VISIBILITIES } from '../entities';

export const Id = z.uuid({ error: 'must be an id (UUID)' });
export const IdParams = z.object({ id: Id });
export const SlugParams = z.object({ slug: z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, 'must be a workspace slug') });
export const RoleSchema = z.enum(ROLES);
export const VisibilitySchema = z.enum(VISIBILITIES);
export const NetlistName = z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters');
/** The byte limit is checked in the service (413); this bounds the characters before that. */
export const Source = z.string().max(256 * 1024, 'must be at most 256 kB');
export const Email = z.email({ error: 'must be an e-mail address' }).max(254);
export const PageQuery = {
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
};

export const PersonSchema = z.object({ id: z.string(), name: z.string(), email: z.string() });
export const NetlistSummarySchema = z.object({
  id: z.string(),
  workspace: z.string(),
  name: z.string(),
  visibility: VisibilitySchema,
  version: z.number().int(),
  size: z.number().int(),
  owner: PersonSchema,
  updatedBy: PersonSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  deletedAt: z.string().nullable(),
  canWrite: z.boolean(),
  canDelete: z.boolean(),
});
export const NetlistSchema = NetlistSummarySchema.extend({ source: z.string() });
export const RevisionSchema = z.object({ version: z.number().int(), author: PersonSchema, createdAt: z.string(), size: z.number().int(), restoredFrom: z.number().int().nullable() });
