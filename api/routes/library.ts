/** Routes of the team block library (docs/api.md). Thin: zod here, rules in the services. */
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { BLOCK_STATES } from '../entities';
import { route, type RouteDef } from '../http/route';
import { resolveUse, retireVersion, reviewQueue, reviewVersion, submitVersion } from '../services/block-review';
import { addVersion, createBlock, editDraft, getBlock, listBlocks, readVersion } from '../services/blocks';
import type { Mailer } from '../services/mailer';
import { SlugParams, Source } from './schemas';

const Segment = z.string().regex(/^[a-z][a-z0-9_]{0,59}$/, 'must be lower case letters, digits and _');
const BlockParams = SlugParams.extend({ category: Segment, name: Segment });
const VersionParams = BlockParams.extend({ version: z.coerce.number().int().min(1) });
const pathOf = (p: { category: string; name: string }) => `${p.category}/${p.name}`;
const Tags = z.array(z.string().trim().min(1).max(40)).max(20);
const Check = z.object({ line: z.number().int().min(1), text: z.string().max(500), pass: z.boolean(), value: z.number().nullable().optional() });
const LineComment = z.object({ line: z.number().int().min(1), text: z.string().trim().min(1).max(4000) });

export function libraryRoutes(ds: DataSource, mailer: Mailer, publicUrl: string): RouteDef[] {
  const base = '/workspaces/:slug/blocks/:category/:name';
  return [
    route({
      method: 'get', path: '/workspaces/:slug/blocks', tag: 'library', access: 'signed-in', role: 'viewer',
      summary: 'The catalogue: search by text, filter by category, state (of any version) and tag',
      params: SlugParams,
      query: z.object({ q: z.string().max(200).optional(), category: Segment.optional(), state: z.enum(BLOCK_STATES).optional(), tag: z.string().max(40).optional() }),
      errors: [403, 404],
      handle: ({ params, query, user }) => listBlocks(ds, user.id, params.slug, query),
    }),
    route({
      method: 'post', path: '/workspaces/:slug/blocks', tag: 'library', access: 'signed-in', role: 'designer', status: 201,
      summary: 'Propose a new block: its version 1, a draft',
      params: SlugParams,
      body: z.object({ path: z.string().regex(/^[a-z][a-z0-9_]{0,39}\/[a-z][a-z0-9_]{0,59}$/, 'must be category/name in lower case'), source: Source, title: z.string().trim().max(120).optional(), summary: z.string().max(2000).optional(), tags: Tags.optional() }),
      errors: [403, 404, 409],
      handle: ({ params, body, user }) => createBlock(ds, user, params.slug, body),
    }),
    route({
      method: 'get', path: '/workspaces/:slug/review-queue', tag: 'library', access: 'signed-in', role: 'reviewer',
      summary: 'Versions waiting for review that you did not write, oldest first', params: SlugParams, errors: [403, 404],
      handle: ({ params, user }) => reviewQueue(ds, user.id, params.slug),
    }),
    route({
      method: 'get', path: base, tag: 'library', access: 'signed-in', role: 'viewer',
      summary: 'A block with its versions', params: BlockParams, errors: [403, 404],
      handle: ({ params, user }) => getBlock(ds, user.id, params.slug, pathOf(params)),
    }),
    route({
      method: 'post', path: `${base}/versions`, tag: 'library', access: 'signed-in', role: 'designer', status: 201,
      summary: 'Propose the next version of a block (a draft)', params: BlockParams, body: z.object({ source: Source }), errors: [403, 404],
      handle: ({ params, body, user }) => addVersion(ds, user, params.slug, pathOf(params), body),
    }),
    route({
      method: 'get', path: `${base}/versions/:version`, tag: 'library', access: 'signed-in', role: 'viewer',
      summary: 'One version: source, pins and params, the author’s checks, the review thread', params: VersionParams, errors: [403, 404],
      handle: ({ params, user }) => readVersion(ds, user.id, params.slug, pathOf(params), params.version),
    }),
    route({
      method: 'put', path: `${base}/versions/:version`, tag: 'library', access: 'signed-in', role: 'its author, before it is first submitted',
      summary: 'Edit a draft’s source; 409 version_frozen once it was submitted', params: VersionParams, body: z.object({ source: Source }), errors: [403, 404, 409],
      handle: ({ params, body, user }) => editDraft(ds, user, params.slug, pathOf(params), params.version, body),
    }),
    route({
      method: 'post', path: `${base}/versions/:version/submit`, tag: 'library', access: 'signed-in', role: 'its author (designer)',
      summary: 'Submit a draft for review with its checks as solved in the author’s browser; mails the reviewers',
      params: VersionParams, body: z.object({ checks: z.array(Check).max(500), note: z.string().max(4000).optional() }), errors: [403, 404, 409],
      handle: ({ params, body, user }) => submitVersion(ds, mailer, publicUrl, user, params.slug, pathOf(params), params.version, body),
    }),
    route({
      method: 'post', path: `${base}/versions/:version/review`, tag: 'library', access: 'signed-in', role: 'reviewer other than the author (comment: designer)',
      summary: 'Approve (→ vetted), send back (→ draft, with a reason) or comment, optionally on lines; mails the author a decision',
      params: VersionParams,
      body: z.object({ decision: z.enum(['approve', 'send_back', 'comment']), comment: z.string().max(4000).optional(), line: z.number().int().min(1).optional(), comments: z.array(LineComment).max(100).optional() }),
      errors: [403, 404, 409],
      handle: ({ params, body, user }) => reviewVersion(ds, mailer, publicUrl, user, params.slug, pathOf(params), params.version, body),
    }),
    route({
      method: 'post', path: `${base}/versions/:version/retire`, tag: 'library', access: 'signed-in', role: 'admin',
      summary: 'Retire a vetted version (netlists pinning it still resolve it, with a warning)', params: VersionParams, errors: [403, 404, 409],
      handle: ({ params, user }) => retireVersion(ds, user, params.slug, pathOf(params), params.version),
    }),
    route({
      method: 'get', path: '/workspaces/:slug/library/:category/:name/:version', tag: 'library', access: 'signed-in', role: 'viewer (drafts: their author and reviewers)',
      summary: 'Resolve `use category/name@version` for the bench: the source, its state and the newest vetted version',
      params: VersionParams, errors: [403, 404],
      handle: async ({ params, user, res }) => {
        // The source of a submitted version never changes, but its state does (vetted → retired) and
        // so does the newest vetted version: the bench must hear of that on its next ask.
        res.setHeader('Cache-Control', 'private, no-cache');
        return resolveUse(ds, user.id, params.slug, pathOf(params), params.version);
      },
    }),
  ];
}
