import { sql } from 'drizzle-orm';
import { rateLimit, type ClientRateLimitInfo, type Options, type Store } from 'express-rate-limit';
import type { Request } from 'express';
import type { Database } from '../db/client';
import { AppError } from './errors';

/**
 * express-rate-limit store in PostgreSQL, so every app instance counts the
 * same hits. One upsert per hit: a window that has ended starts again at 1.
 */
export class PostgresRateLimitStore implements Store {
  private windowMs = 60_000;
  localKeys = false;

  constructor(
    private readonly db: Database,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private key(key: string) {
    return `${this.prefix}:${key}`;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const result = await this.db.execute<{ hits: number; reset_at: Date }>(sql`
      INSERT INTO rate_limits (key, hits, reset_at)
      VALUES (${this.key(key)}, 1, now() + ${this.windowMs} * interval '1 millisecond')
      ON CONFLICT (key) DO UPDATE SET
        hits = CASE WHEN rate_limits.reset_at <= now() THEN 1 ELSE rate_limits.hits + 1 END,
        reset_at = CASE WHEN rate_limits.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limits.reset_at END
      RETURNING hits, reset_at`);
    const row = result.rows[0];
    return { totalHits: Number(row.hits), resetTime: new Date(row.reset_at) };
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const result = await this.db.execute<{ hits: number; reset_at: Date }>(
      sql`SELECT hits, reset_at FROM rate_limits WHERE key = ${this.key(key)} AND reset_at > now()`,
    );
    const row = result.rows[0];
    return row ? { totalHits: Number(row.hits), resetTime: new Date(row.reset_at) } : undefined;
  }

  async decrement(key: string) {
    await this.db.execute(sql`UPDATE rate_limits SET hits = greatest(hits - 1, 0) WHERE key = ${this.key(key)}`);
  }

  async resetKey(key: string) {
    await this.db.execute(sql`DELETE FROM rate_limits WHERE key = ${this.key(key)}`);
  }
}

export interface LimiterOptions {
  db: Database;
  name: string;
  windowMs: number;
  limit: number;
  message: string;
  keyGenerator?: (req: Request) => string;
  skipSuccessfulRequests?: boolean;
}

/** A limiter that answers 429 in the API's error shape. */
export function createLimiter(options: LimiterOptions) {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PostgresRateLimitStore(options.db, options.name),
    skipSuccessfulRequests: options.skipSuccessfulRequests ?? false,
    ...(options.keyGenerator ? { keyGenerator: options.keyGenerator } : {}),
    handler: (_req, _res, next) => next(new AppError('too_many_attempts', options.message, 429)),
  });
}
