/**
 * Telling "PostgreSQL cannot be reached" apart from every other failure, so the API answers 503
 * (try again) instead of 500 (our bug) while the database is down or restarting.
 */

/** SQLSTATE classes and codes that mean the server is gone, going or not yet accepting. */
const UNAVAILABLE_SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300', '08000', '08001', '08003', '08004', '08006']);
const UNAVAILABLE_ERRNOS = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTCONN', 'EHOSTUNREACH']);
// "already released": TypeORM lets go of a transaction's connection when it drops; the next statement says so.
const UNAVAILABLE_MESSAGES = [/Connection terminated/i, /timeout exceeded when trying to connect/i, /Client has encountered a connection error/i, /Connection is not established/i, /already released/i, /Driver not Connected/i, /the database system is (starting up|shutting down)/i];

/** Whether `err` (from pg, TypeORM or connect-pg-simple) means the database is unavailable. */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && typeof e === 'object' && depth < 4; depth++) {
    const o = e as { code?: unknown; message?: unknown; driverError?: unknown; cause?: unknown };
    if (typeof o.code === 'string' && (UNAVAILABLE_SQLSTATES.has(o.code) || UNAVAILABLE_ERRNOS.has(o.code))) return true;
    if (typeof o.message === 'string' && UNAVAILABLE_MESSAGES.some((re) => re.test(o.message as string))) return true;
    e = o.driverError ?? o.cause;
  }
  return false;
}
