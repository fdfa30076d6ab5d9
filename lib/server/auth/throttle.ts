/**
 * Sign-in throttling: exponential back-off per key, counted under a row lock.
 *
 * Keys of one attempt (a "client" is a browser that proved an earlier sign-in to this account
 * with its device cookie, else the client address when a proxy we trust gives it, else
 * "unidentified"):
 *  - account + client: 5 failures free, then each failure makes this client wait 30 s, 1 min,
 *    2 min, … up to 1 h before its next attempt at this account;
 *  - client address (when known): 30 failures free over all accounts, then the same back-off;
 *  - all unidentified clients together (no device cookie, no trusted address): 100 failures free
 *    over all accounts, then the same back-off. This bounds guessing across many accounts when
 *    the app cannot tell clients apart.
 * A key's failures are forgotten after 24 h without a failure. A correct password from a client
 * whose keys are not waiting is accepted, whatever other clients did: a stranger can only make
 * his own client (or, with no proxy, the unidentified clients of that account) wait.
 *
 * Attempts are counted BEFORE the password is checked ("reserve"): in one transaction the keys'
 * rows are locked (SELECT … FOR UPDATE), a waiting key refuses the attempt, otherwise every key
 * counts one failure. A correct password then takes the failure back ("settle"). So N parallel
 * guesses check at most the allowance, never N.
 */
import type { Db } from "../db/client";

export interface BackoffRule {
  readonly free: number;
  readonly baseDelayMs: number;
  readonly maxDelayMs: number;
  readonly forgetAfterMs: number;
}

const rule = (free: number): BackoffRule => ({ free, baseDelayMs: 30_000, maxDelayMs: 3_600_000, forgetAfterMs: 24 * 3_600_000 });
export const THROTTLE = { accountClient: rule(5), address: rule(30), unidentified: rule(100) } as const;

/** Who is signing in, as far as the app can tell. */
export interface SignInClient {
  /** Client address from a trusted proxy, or null. */
  readonly address: string | null;
  /** Device id from a valid device cookie for THIS account, or null. */
  readonly deviceId: string | null;
}

export const UNIDENTIFIED: SignInClient = { address: null, deviceId: null };

interface KeyedRule {
  readonly key: string;
  readonly rule: BackoffRule;
  /** On success: reset the key (account + client) or only take this attempt back (shared keys). */
  readonly onSuccess: "reset" | "undo";
}

export function throttleKeys(email: string, client: SignInClient): KeyedRule[] {
  const who = client.deviceId ? `device:${client.deviceId}` : client.address ? `address:${client.address}` : "unidentified";
  const keys: KeyedRule[] = [{ key: `account:${email}|${who}`, rule: THROTTLE.accountClient, onSuccess: "reset" }];
  if (client.address) keys.push({ key: `address:${client.address}`, rule: THROTTLE.address, onSuccess: "undo" });
  else if (!client.deviceId) keys.push({ key: "unidentified", rule: THROTTLE.unidentified, onSuccess: "undo" });
  return keys;
}

/** The wait after the n-th counted failure of a key (0 while free). */
export function backoffMs(r: BackoffRule, failures: number): number {
  if (failures < r.free) return 0;
  return Math.min(r.maxDelayMs, r.baseDelayMs * 2 ** Math.min(30, failures - r.free));
}

export type Reservation = { ok: true; keys: KeyedRule[] } | { ok: false; retryAfterMs: number };

type Row = { key: string; failures: number; blockedUntil: Date | null; lastFailureAt: Date | null };

/** Count this attempt as a failure on every key, unless one of them is waiting (then count nothing). */
export async function reserveAttempt(db: Db, email: string, client: SignInClient, now = new Date()): Promise<Reservation> {
  const keys = throttleKeys(email, client);
  const names = keys.map((k) => k.key).sort();
  return db.$transaction(async (tx) => {
    await tx.$executeRawUnsafe(`INSERT INTO "SignInThrottle" ("key") SELECT unnest($1::text[]) ON CONFLICT ("key") DO NOTHING`, names);
    const rows = await tx.$queryRawUnsafe<Row[]>(`SELECT "key", "failures", "blockedUntil", "lastFailureAt" FROM "SignInThrottle" WHERE "key" = ANY($1::text[]) ORDER BY "key" FOR UPDATE`, names);
    const byKey = new Map(rows.map((r) => [r.key, r]));
    let wait = 0;
    const next: { key: string; failures: number; blockedUntil: Date | null }[] = [];
    for (const k of keys) {
      const r = byKey.get(k.key)!;
      const stale = !r.lastFailureAt || now.getTime() - r.lastFailureAt.getTime() > k.rule.forgetAfterMs;
      const failures = stale ? 0 : r.failures;
      if (!stale && r.blockedUntil && r.blockedUntil > now) wait = Math.max(wait, r.blockedUntil.getTime() - now.getTime());
      const delay = backoffMs(k.rule, failures + 1);
      next.push({ key: k.key, failures: failures + 1, blockedUntil: delay > 0 ? new Date(now.getTime() + delay) : null });
    }
    if (wait > 0) return { ok: false, retryAfterMs: wait } as const;
    await tx.$executeRawUnsafe(
      `UPDATE "SignInThrottle" t SET "failures" = v.f, "blockedUntil" = v.b, "lastFailureAt" = $4
       FROM unnest($1::text[], $2::int[], $3::timestamptz[]) AS v(k, f, b) WHERE t."key" = v.k`,
      next.map((n) => n.key), next.map((n) => n.failures), next.map((n) => n.blockedUntil), now,
    );
    return { ok: true, keys } as const;
  }, { maxWait: 30_000, timeout: 30_000 });
}

/** After a correct password: reset the account + client key, take the attempt back from shared keys. */
export async function settleSuccess(db: Db, reservation: { keys: KeyedRule[] }): Promise<void> {
  const reset = reservation.keys.filter((k) => k.onSuccess === "reset").map((k) => k.key);
  const undo = reservation.keys.filter((k) => k.onSuccess === "undo");
  if (reset.length) await db.$executeRawUnsafe(`DELETE FROM "SignInThrottle" WHERE "key" = ANY($1::text[])`, reset);
  for (const k of undo) {
    await db.$executeRawUnsafe(
      `UPDATE "SignInThrottle" SET "failures" = GREATEST(0, "failures" - 1),
         "blockedUntil" = CASE WHEN "failures" - 1 < $2 THEN NULL ELSE "blockedUntil" END WHERE "key" = $1`,
      k.key, k.rule.free,
    );
  }
}
