/**
 * The service layer's one error type: an HTTP status, a stable snake_case code and a sentence for
 * people. Services throw it; `api/middleware/error-handler.ts` turns it into the JSON shape.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
    /** Extra top-level members of the answer beside `error` (e.g. `current` on a stale save). */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (code: string, message: string, details?: unknown) => new HttpError(400, code, message, details);
export const forbidden = (message = 'Your role in this workspace does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'This item', code = 'not_found') => new HttpError(404, code, `${what} does not exist or is not visible to you.`);
export const conflict = (code: string, message: string, extra?: Record<string, unknown>) => new HttpError(409, code, message, undefined, extra);
