/**
 * The API as one table of routes. Each route names its method, path, the role it needs (checked
 * in its service), its zod schemas for params, query and body, and its answer. From this one table
 * come: the Express router (validation at the edge), the 404/405 gate that runs before any body
 * is read, and the OpenAPI document.
 */
import type { Request, RequestHandler, Response, Router } from 'express';
import { Router as createRouter } from 'express';
import { match } from 'path-to-regexp';
import { z, type ZodType } from 'zod';
import { HttpError } from '../services/http-error';
import { currentUser, type SignedInUser } from '../services/users';
import type { DataSource } from 'typeorm';

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteContext<P, Q, B> {
  req: Request;
  res: Response;
  params: P;
  query: Q;
  body: B;
  /** The signed-in user (always set on `signed-in` routes). */
  user: SignedInUser;
}

export interface RouteDef<P = unknown, Q = unknown, B = unknown> {
  method: Method;
  /** Express path below `/api`, e.g. `/netlists/:id`. */
  path: string;
  summary: string;
  tag: string;
  /** `public` routes need no session; all others answer 401 `signed_out` without one. */
  access: 'public' | 'signed-in';
  /** Who may call it, in words, for the OpenAPI document (the service enforces it). */
  role?: string;
  params?: ZodType<P>;
  query?: ZodType<Q>;
  body?: ZodType<B>;
  /** Status of a successful answer; 204 routes return nothing. */
  status?: number;
  response?: ZodType;
  /** Error statuses the route may answer with, for the document. */
  errors?: number[];
  /** Middleware run after the session check and before validation (rate limits, uploads). */
  before?: RequestHandler[];
  /** Returns the answer's body, or nothing when it wrote the response itself (a file). */
  handle(ctx: RouteContext<P, Q, B>): Promise<unknown>;
}

/** Declares a route with its types inferred from its schemas. */
export function route<P = Record<string, never>, Q = Record<string, never>, B = undefined>(def: RouteDef<P, Q, B>): RouteDef {
  return def as unknown as RouteDef;
}

/** The router of a route table (under `/api`). */
export function routerOf(ds: DataSource, routes: RouteDef[]): Router {
  const router = createRouter();
  for (const r of routes) {
    router[r.method](r.path, async (req, res, next) => {
      try {
        const user = await currentUser(ds, req);
        if (r.access === 'signed-in' && !user) throw new HttpError(401, 'signed_out', 'Sign in to do this.');
        for (const mw of r.before ?? []) {
          await new Promise<void>((resolve, reject) => mw(req, res, (err?: unknown) => (err ? reject(err) : resolve())));
          if (res.headersSent) return;
        }
        const params = parseWith(r.params, req.params, 'params');
        const query = parseWith(r.query, req.query, 'query');
        const body = parseWith(r.body, req.body, 'body');
        const answer = await r.handle({ req, res, params, query, body, user: user! });
        if (res.headersSent) return;
        const status = r.status ?? (answer === undefined ? 204 : 200);
        if (status === 204 || answer === undefined) res.status(status).end();
        else res.status(status).json(answer);
      } catch (err) {
        next(err);
      }
    });
  }
  return router;
}

function parseWith(schema: ZodType | undefined, value: unknown, where: string): never {
  if (!schema) return value as never;
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data as never;
  const details = parsed.error.issues.map((i) => ({ path: [where, ...i.path].join('.'), message: i.message }));
  throw new HttpError(400, 'invalid_request', `Some fields of the request ${where === 'body' ? 'body' : where} are not valid.`, details);
}

/**
 * Answers 404 (no such path) or 405 (path exists, method does not, with `Allow`) before anything
 * reads the body, so a wrong request never costs a parse.
 */
export function methodGate(routes: RouteDef[]): RequestHandler {
  const compiled = routes.map((r) => ({ method: r.method.toUpperCase(), test: match(r.path, { decode: false }) }));
  return (req, res, next) => {
    const hits = compiled.filter((c) => c.test(req.path));
    if (hits.length === 0) {
      next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.originalUrl.split('?')[0]}.`));
      return;
    }
    const allowed = [...new Set(hits.map((h) => h.method))];
    if (allowed.includes('GET')) allowed.push('HEAD');
    if (allowed.includes(req.method)) return next();
    res.setHeader('Allow', allowed.join(', '));
    next(new HttpError(405, 'method_not_allowed', `${req.method} is not allowed on ${req.path}; use ${allowed.join(', ')}.`));
  };
}

export const ErrorBody = z.object({
  error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }),
});
