/** Routes of team netlists and their revisions (docs/api.md). Thin: zod here, rules in the services. */
import multer from 'multer';
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { route, type RouteDef } from '../http/route';
import { MAX_UPLOAD_FILES, uploadNetlists } from '../services/netlist-upload';
import { createNetlist, deleteNetlist, getNetlist, getRevision, listNetlists, listRevisions, MAX_SOURCE_BYTES, restoreNetlist, restoreRevision, saveNetlist, updateNetlist } from '../services/netlists';
import { HttpError } from '../services/http-error';
import { IdParams, NetlistName, NetlistSchema, NetlistSummarySchema, PageQuery, RevisionSchema, SlugParams, Source, VisibilitySchema } from './schemas';
import type { RequestHandler } from 'express';

const VersionParams = IdParams.extend({ version: z.coerce.number().int().min(1) });

/** multer in memory with our limits; its errors become ours (it never names the field limits well). */
function uploadFiles(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_SOURCE_BYTES, files: MAX_UPLOAD_FILES, fields: 5, parts: MAX_UPLOAD_FILES + 5 } }).array('files', MAX_UPLOAD_FILES);
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) return next(new HttpError(415, 'not_multipart', 'Upload .nwl files as multipart/form-data in the field "files".'));
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      const e = err as { code?: string; field?: string };
      if (e.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'upload_refused', 'A file is larger than a netlist may be; nothing was stored.', [{ file: e.field ?? 'files', code: 'too_large', message: `Each file may be at most ${MAX_SOURCE_BYTES / 1024} kB.` }]));
      if (e.code === 'LIMIT_FILE_COUNT' || e.code === 'LIMIT_PART_COUNT') return next(new HttpError(413, 'too_many_files', `Upload at most ${MAX_UPLOAD_FILES} files at once.`));
      if (e.code === 'LIMIT_UNEXPECTED_FILE') return next(new HttpError(400, 'wrong_field', 'Send the files in the form field "files".'));
      next(new HttpError(400, 'malformed_upload', 'The upload could not be read as multipart/form-data.'));
    });
  };
}

export function netlistRoutes(ds: DataSource): RouteDef[] {
  return [
    route({
      method: 'get', path: '/workspaces/:slug/netlists', tag: 'netlists', access: 'signed-in', role: 'viewer',
      summary: 'List the workspace netlists visible to you (sort, filter, page; or the deleted ones still restorable)',
      params: SlugParams,
      query: z.object({
        q: z.string().max(200).optional(),
        sort: z.enum(['name', 'updatedAt', 'size', 'owner']).default('updatedAt'),
        order: z.enum(['asc', 'desc']).default('desc'),
        deleted: z.enum(['true', 'false']).default('false').transform((v) => v === 'true'),
        ...PageQuery,
      }),
      response: z.object({ items: z.array(NetlistSummarySchema), total: z.number().int() }),
      errors: [403, 404],
      handle: ({ params, query, user }) => listNetlists(ds, user.id, params.slug, query),
    }),
    route({
      method: 'post', path: '/workspaces/:slug/netlists', tag: 'netlists', access: 'signed-in', role: 'designer', status: 201,
      summary: 'Create a netlist (its first revision)',
      params: SlugParams,
      body: z.object({ name: NetlistName, source: Source, visibility: VisibilitySchema.optional() }),
      response: NetlistSchema,
      errors: [403, 404, 413],
      handle: ({ params, body, user }) => createNetlist(ds, user.id, params.slug, body),
    }),
    route({
      method: 'post', path: '/workspaces/:slug/netlists/upload', tag: 'netlists', access: 'signed-in', role: 'designer', status: 201,
      summary: 'Upload .nwl files (multipart field "files"); all stored or none',
      params: SlugParams,
      before: [uploadFiles()],
      response: z.object({ items: z.array(NetlistSummarySchema) }),
      errors: [403, 404, 413, 415],
      handle: ({ req, params, user }) => uploadNetlists(ds, user.id, params.slug, (req.files as Express.Multer.File[] | undefined) ?? []),
    }),
    route({
      method: 'get', path: '/netlists/:id', tag: 'netlists', access: 'signed-in', role: 'viewer',
      summary: 'Read a netlist with its current text', params: IdParams, response: NetlistSchema, errors: [404],
      handle: ({ params, user }) => getNetlist(ds, user.id, params.id),
    }),
    route({
      method: 'put', path: '/netlists/:id', tag: 'netlists', access: 'signed-in', role: 'designer',
      summary: 'Save new text as the next revision; 409 stale (with the current copy) when baseVersion is not current',
      params: IdParams,
      body: z.object({ source: Source, baseVersion: z.number().int().min(1), name: NetlistName.optional() }),
      response: NetlistSummarySchema,
      errors: [403, 404, 409, 413],
      handle: ({ params, body, user }) => saveNetlist(ds, user.id, params.id, body),
    }),
    route({
      method: 'patch', path: '/netlists/:id', tag: 'netlists', access: 'signed-in', role: 'designer (visibility: the owner)',
      summary: 'Rename or change visibility (no new revision)',
      params: IdParams,
      body: z.object({ name: NetlistName.optional(), visibility: VisibilitySchema.optional() }).refine((b) => b.name !== undefined || b.visibility !== undefined, 'give a name or a visibility'),
      response: NetlistSummarySchema,
      errors: [403, 404],
      handle: ({ params, body, user }) => updateNetlist(ds, user.id, params.id, body),
    }),
    route({
      method: 'delete', path: '/netlists/:id', tag: 'netlists', access: 'signed-in', role: 'its owner or an admin',
      summary: 'Delete (restorable for 30 days)', params: IdParams, errors: [403, 404],
      handle: async ({ params, user }) => void (await deleteNetlist(ds, user.id, params.id)),
    }),
    route({
      method: 'post', path: '/netlists/:id/restore', tag: 'netlists', access: 'signed-in', role: 'its owner or an admin',
      summary: 'Restore a deleted netlist', params: IdParams, response: NetlistSummarySchema, errors: [403, 404, 409],
      handle: ({ params, user }) => restoreNetlist(ds, user.id, params.id),
    }),
    route({
      method: 'get', path: '/netlists/:id/revisions', tag: 'revisions', access: 'signed-in', role: 'viewer',
      summary: 'Every saved revision, newest first', params: IdParams, response: z.object({ items: z.array(RevisionSchema) }), errors: [404],
      handle: ({ params, user }) => listRevisions(ds, user.id, params.id),
    }),
    route({
      method: 'get', path: '/netlists/:id/revisions/:version', tag: 'revisions', access: 'signed-in', role: 'viewer',
      summary: 'One revision with its text', params: VersionParams, response: RevisionSchema.extend({ source: z.string(), name: z.string() }), errors: [404],
      handle: ({ params, user }) => getRevision(ds, user.id, params.id, params.version),
    }),
    route({
      method: 'get', path: '/netlists/:id/revisions/:version/file', tag: 'revisions', access: 'signed-in', role: 'viewer',
      summary: 'Download one revision as a .nwl file', params: VersionParams, errors: [404],
      handle: async ({ params, user, res }) => {
        const rev = await getRevision(ds, user.id, params.id, params.version);
        const base = rev.name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'netlist';
        res.attachment(`${base}-v${rev.version}.nwl`);
        // After attachment(), which would guess octet-stream from the unknown extension.
        res.setHeader('Content-Type', 'text/plain; charset=utf-8');
        res.send(rev.source);
      },
    }),
    route({
      method: 'post', path: '/netlists/:id/revisions/:version/restore', tag: 'revisions', access: 'signed-in', role: 'designer',
      summary: 'Save an old revision’s text as the next revision; 409 stale as for a save',
      params: VersionParams, body: z.object({ baseVersion: z.number().int().min(1) }), response: NetlistSummarySchema, errors: [403, 404, 409],
      handle: ({ params, body, user }) => restoreRevision(ds, user.id, params.id, params.version, body.baseVersion),
    }),
  ];
}
