import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { isDatabaseUnavailable } from '../services/database-errors';
import { HttpError } from '../services/http-error';

/** 404 for any /api path no route answers (the method table answers 405 before this). */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

/** Field-level problems from zod, as `[{ path, message }]`. */
export function zodDetails(err: ZodError): { path: string; message: string }[] {
  return err.issues.map((i) => ({ path: i.path.join('.') || '(body)', message: i.message }));
}

/** body-parser's and multer's own errors, mapped to our codes (their types are never published). */
const CLIENT_ERRORS: Record<string, { code: string; message: string }> = {
  'entity.parse.failed': { code: 'malformed_json', message: 'The request body is not valid JSON.' },
  'entity.too.large': { code: 'body_too_large', message: 'The request body is larger than the server accepts.' },
  'encoding.unsupported': { code: 'unsupported_encoding', message: 'The request body uses an encoding the server does not read.' },
  'charset.unsupported': { code: 'unsupported_charset', message: 'The request body uses a character set the server does not read.' },
  'request.aborted': { code: 'request_aborted', message: 'The request was aborted before its body arrived.' },
};

let lastOutageLog = 0;

/**
 * The one place errors become responses: `{ error: { code, message, details? } }`.
 * A database outage is 503 (logged at most every 10 s); unexpected errors are logged with the
 * request and answered without internals.
 */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) {
    req.log?.error({ err }, 'error after the answer started');
    res.end();
    return;
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details !== undefined ? { details: err.details } : {}) }, ...err.extra });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({ error: { code: 'invalid_request', message: 'Some fields of the request are not valid.', details: zodDetails(err) } });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    if (Date.now() - lastOutageLog > 10_000) {
      lastOutageLog = Date.now();
      req.log?.warn({ reason: (err as Error)?.message }, 'database unavailable: answering 503');
    }
    res.setHeader('Retry-After', '5');
    res.status(503).json({ error: { code: 'database_unavailable', message: 'The team server cannot reach its database right now; try again in a few seconds. Your work in the bench is not affected.' } });
    return;
  }
  const status = typeof err?.status === 'number' && err.status >= 400 && err.status < 500 ? err.status : 500;
  if (status < 500) {
    const known = CLIENT_ERRORS[err.type as string];
    res.status(status).json({ error: known ?? { code: 'bad_request', message: 'The request could not be read.' } });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged.' } });
};
