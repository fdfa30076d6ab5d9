/**
 * Per-token rate limit for /api/v1: a token bucket kept IN MEMORY, PER PROCESS.
 *
 * Each token has a bucket of `capacity` requests that refills at `refillPerSecond`; a request
 * takes one, and an empty bucket answers 429 with Retry-After (seconds until one is back).
 * Consequence of keeping it in memory: with N app instances behind a load balancer a token may
 * make up to N× the rate, and a restart refills every bucket. That is the intended trade-off
 * (no database write per request); a strict cluster-wide limit would move the bucket into a
 * PostgreSQL row updated with one `UPDATE … RETURNING` per request.
 * Defaults: 120 requests burst, 2 per second sustained; HEATBOOK_API_BURST and
 * HEATBOOK_API_RATE_PER_MINUTE override them.
 */

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

interface Bucket {
  tokens: number;
  at: number;
}

const MAX_KEYS = 10_000;

export class TokenBucketLimiter {
  private readonly buckets = new Map<string, Bucket>();
  constructor(readonly options: BucketOptions, private readonly now: () => number = Date.now) {}

  /** Take one request from `key`'s bucket. */
  take(key: string): TakeResult {
    const { capacity, refillPerSecond } = this.options;
    const t = this.now();
    const b = this.buckets.get(key) ?? { tokens: capacity, at: t };
    b.tokens = Math.min(capacity, b.tokens + ((t - b.at) / 1000) * refillPerSecond);
    b.at = t;
    this.buckets.set(key, b);
    if (this.buckets.size > MAX_KEYS) this.prune(t);
    if (b.tokens >= 1) {
      b.tokens -= 1;
      return { allowed: true, limit: capacity, remaining: Math.floor(b.tokens), retryAfterSeconds: 0 };
    }
    return { allowed: false, limit: capacity, remaining: 0, retryAfterSeconds: Math.max(1, Math.ceil((1 - b.tokens) / refillPerSecond)) };
  }

  /** Drop buckets that have refilled completely (they are equivalent to a fresh one). */
  private prune(t: number): void {
    const { capacity, refillPerSecond } = this.options;
    for (const [k, b] of this.buckets) if (b.tokens + ((t - b.at) / 1000) * refillPerSecond >= capacity) this.buckets.delete(k);
  }
}

function envNumber(name: string, fallback: number): number {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v > 0 ? v : fallback;
}

let shared: TokenBucketLimiter | undefined;

/** The process-wide limiter used by the v1 handlers. */
export function apiLimiter(): TokenBucketLimiter {
  shared ??= new TokenBucketLimiter({ capacity: envNumber("HEATBOOK_API_BURST", 120), refillPerSecond: envNumber("HEATBOOK_API_RATE_PER_MINUTE", 120) / 60 });
  return shared;
}

/** Replace the process-wide limiter (tests). */
export function setApiLimiter(limiter: TokenBucketLimiter | undefined): void {
  shared = limiter;
}
