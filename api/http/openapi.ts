/**
 * The OpenAPI 3.1 document of the API, built from the route table's zod schemas (zod's own JSON
 * Schema export), so the document cannot drift from what the server validates.
 */
import { z, type ZodType } from 'zod';
import { ErrorBody, type RouteDef } from './route';

const STATUS_TEXT: Record<number, string> = {
  200: 'OK', 201: 'Created', 204: 'No content', 400: 'Invalid request (field-level details)', 401: 'Not signed in',
  403: 'Forbidden (role, or a missing X-XSRF-TOKEN on a write)', 404: 'Not found or not visible to you', 409: 'Conflict',
  413: 'Too large', 415: 'Unsupported media type', 429: 'Too many requests', 503: 'Database unavailable',
};

function schemaOf(s: ZodType): Record<string, unknown> {
  const json = z.toJSONSchema(s, { io: 'input', unrepresentable: 'any' }) as Record<string, unknown>;
  delete json.$schema;
  return json;
}

/** Path and query parameters from an object schema. */
function parameters(s: ZodType | undefined, where: 'path' | 'query'): unknown[] {
  if (!s) return [];
  const json = schemaOf(s) as { properties?: Record<string, unknown>; required?: string[] };
  return Object.entries(json.properties ?? {}).map(([name, schema]) => ({
    name,
    in: where,
    required: where === 'path' || (json.required ?? []).includes(name),
    schema,
  }));
}

export function openApiDocument(routes: RouteDef[], version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const r of routes) {
    const path = `/api${r.path.replace(/:(\w+)/g, '{$1}')}`;
    const ok = r.status ?? (r.response ? 200 : 204);
    const responses: Record<string, unknown> = {
      [ok]: { description: STATUS_TEXT[ok] ?? 'OK', ...(r.response ? { content: { 'application/json': { schema: schemaOf(r.response) } } } : {}) },
    };
    const errors = new Set([...(r.errors ?? []), ...(r.params || r.query || r.body ? [400] : []), ...(r.access === 'signed-in' ? [401] : []), 503]);
    if (r.method !== 'get') errors.add(403);
    for (const status of [...errors].sort()) {
      responses[status] = { description: STATUS_TEXT[status] ?? 'Error', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } };
    }
    const upload = r.path.endsWith('/upload');
    (paths[path] ??= {})[r.method] = {
      tags: [r.tag],
      summary: r.summary,
      ...(r.role ? { description: `Who may call it: ${r.role}.` } : {}),
      ...(r.access === 'signed-in' ? { security: [{ session: [] }] } : { security: [] }),
      parameters: [...parameters(r.params, 'path'), ...parameters(r.query, 'query')],
      ...(r.body ? { requestBody: { required: true, content: { 'application/json': { schema: schemaOf(r.body) } } } } : {}),
      ...(upload ? { requestBody: { required: true, content: { 'multipart/form-data': { schema: { type: 'object', properties: { files: { type: 'array', items: { type: 'string', format: 'binary' } } } } } } } } : {}),
      responses,
    };
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Nodewright team server',
      version,
      description: 'Team netlists with revisions, share links, members and invitations. Writes need the X-XSRF-TOKEN header equal to the XSRF-TOKEN cookie. Sign-in: GET /auth/sign-in?next=PATH; sign-out: POST /auth/sign-out.',
    },
    servers: [{ url: '/' }],
    components: {
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'nodewright.sid' } },
      schemas: { Error: schemaOf(ErrorBody) },
    },
    paths,
  };
}
