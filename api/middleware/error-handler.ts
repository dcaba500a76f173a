import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';

/** An error with an HTTP status and a stable code, thrown by services and routes. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

/** 404 for any /api path no router answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.originalUrl.split("?")[0]}.`));
};

/**
 * The one place errors become responses: `{ error: { code, message, details? } }`.
 * Unexpected errors are logged with the request and answered without internals.
 */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({ error: { code: 'invalid_request', message: 'The request does not have the expected shape.', details: err.issues } });
    return;
  }
  // body-parser marks malformed JSON and oversized bodies with a status.
  const status = typeof err?.status === 'number' && err.status >= 400 && err.status < 500 ? err.status : 500;
  if (status < 500) {
    res.status(status).json({ error: { code: err.type ?? 'bad_request', message: err.message ?? 'Bad request.' } });
    return;
  }
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged.' } });
};
