/**
 * Rate limits (express-rate-limit) with their counters in PostgreSQL, so every API instance
 * counts together and no instance keeps per-user state in memory.
 */
import type { RequestHandler } from 'express';
import { rateLimit, type IncrementResponse, type Options, type Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { HttpError } from '../services/http-error';

/** express-rate-limit's store over the `rate_limit_hits` table (fixed windows). */
export class PostgresRateStore implements Store {
  private windowMs = 60_000;
  prefix: string;

  constructor(
    private readonly ds: DataSource,
    prefix: string,
  ) {
    this.prefix = `${prefix}:`;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const rows: { hits: number; reset_at: Date }[] = await this.ds.query(
      `INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES ($1, 1, now() + $2 * interval '1 millisecond')
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit_hits.reset_at <= now() THEN 1 ELSE rate_limit_hits.hits + 1 END,
         reset_at = CASE WHEN rate_limit_hits.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limit_hits.reset_at END
       RETURNING hits, reset_at`,
      [this.prefix + key, this.windowMs],
    );
    // Old windows are cleared now and then, by whichever request happens by.
    if (Math.random() < 0.01) void this.ds.query(`DELETE FROM rate_limit_hits WHERE reset_at < now() - interval '1 hour'`).catch(() => undefined);
    return { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.ds.query(`UPDATE rate_limit_hits SET hits = greatest(hits - 1, 0) WHERE key = $1`, [this.prefix + key]);
  }

  async resetKey(key: string): Promise<void> {
    await this.ds.query(`DELETE FROM rate_limit_hits WHERE key = $1`, [this.prefix + key]);
  }
}

/** A per-client-address limit of `perMinute` requests, answered with 429 in our error shape. */
export function perMinuteLimit(ds: DataSource, name: string, perMinute: number, what: string): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit: perMinute,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateStore(ds, name),
    passOnStoreError: false,
    handler: (_req, _res, next) => next(new HttpError(429, 'rate_limited', `Too many ${what} from this address; wait a minute and try again.`)),
  });
}
