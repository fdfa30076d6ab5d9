/**
 * Per-token rate limit for /api/v1: a token bucket kept in PostgreSQL, so it holds across every
 * app instance (N instances allow the same rate as one) and survives restarts.
 *
 * Each token has a bucket of `capacity` requests that refills at `refillPerSecond`; a request
 * takes one, and an empty bucket answers 429 with Retry-After (seconds until one is back).
 * One statement per request: an INSERT … ON CONFLICT DO UPDATE on the token's row computes the
 * refill, takes a request if there is one, and returns the result; PostgreSQL's row lock makes
 * parallel requests (from any instance) take turns, so the bucket is never overdrawn. The time
 * is the database's clock (`clock_timestamp()`), one clock for all instances.
 * Defaults: 120 requests burst, 2 per second sustained; HEATBOOK_API_BURST and
 * HEATBOOK_API_RATE_PER_MINUTE override them. README "Scaling out" has the measured cost.
 */
import type { Db } from "../db/client";
import { sqlRows } from "../db/client";

export interface BucketOptions {
  readonly capacity: number;
  readonly refillPerSecond: number;
}

export interface TakeResult {
  readonly allowed: boolean;
  readonly limit: number;
  readonly remaining: number;
  /** Whole seconds until the next request would be allowed (0 when allowed). */
  readonly retryAfterSeconds: number;
}

export interface RateLimiter {
  take(key: string): Promise<TakeResult>;
}

// $1 key, $2 capacity, $3 refill per second, $4 the time (NULL: the database's clock). On an
// existing row, LEVEL is the bucket after refill up to EXCLUDED."at" (this request's time),
// before taking; the VALUES row is a fresh, full bucket less this request.
const LEVEL = `LEAST($2::float8, b."tokens" + GREATEST(0, EXTRACT(EPOCH FROM (EXCLUDED."at" - b."at")))::float8 * $3::float8)`;
const TAKE_SQL = `
INSERT INTO "ApiRateBucket" AS b ("key", "tokens", "at", "allowed") VALUES ($1, $2::float8 - 1, COALESCE($4::timestamptz, clock_timestamp()), true)
ON CONFLICT ("key") DO UPDATE SET
  "tokens" = CASE WHEN ${LEVEL} >= 1 THEN ${LEVEL} - 1 ELSE ${LEVEL} END,
  "at" = GREATEST(b."at", EXCLUDED."at"),
  "allowed" = ${LEVEL} >= 1
RETURNING b."tokens" AS "tokens", b."allowed" AS "allowed"`;

/** The shared limiter: one bucket row per key in ApiRateBucket. */
export class PgTokenBucketLimiter implements RateLimiter {
  /** `now` (tests) replaces the database's clock. */
  constructor(private readonly db: Db, readonly options: BucketOptions, private readonly now?: () => number) {}

  async take(key: string): Promise<TakeResult> {
    const { capacity, refillPerSecond } = this.options;
    const at = this.now ? new Date(this.now()).toISOString() : null;
    const [row] = await sqlRows<{ tokens: number; allowed: boolean }>(this.db, TAKE_SQL, [key, capacity, refillPerSecond, at]);
    const tokens = Number(row!.tokens);
    if (row!.allowed) return { allowed: true, limit: capacity, remaining: Math.floor(tokens), retryAfterSeconds: 0 };
    return { allowed: false, limit: capacity, remaining: 0, retryAfterSeconds: Math.max(1, Math.ceil((1 - tokens) / refillPerSecond)) };
  }
}

function envNumber(name: string, fallback: number): number {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v > 0 ? v : fallback;
}

export function apiLimitOptions(): BucketOptions {
  return { capacity: envNumber("HEATBOOK_API_BURST", 120), refillPerSecond: envNumber("HEATBOOK_API_RATE_PER_MINUTE", 120) / 60 };
}

let override: RateLimiter | undefined;
const byDb = new WeakMap<Db, RateLimiter>();

/** The limiter used by the v1 handlers (over the app's database). */
export function apiLimiter(db: Db): RateLimiter {
  if (override) return override;
  let l = byDb.get(db);
  if (!l) byDb.set(db, (l = new PgTokenBucketLimiter(db, apiLimitOptions())));
  return l;
}

/** Replace the limiter (tests); undefined goes back to the shared PostgreSQL one. */
export function setApiLimiter(limiter: RateLimiter | undefined): void {
  override = limiter;
}
