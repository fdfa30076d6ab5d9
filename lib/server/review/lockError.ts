/**
 * The review-lock triggers (migration 20261202010000_review_locks) refuse with SQLSTATE HBL01
 * (sealed revision or what it used) or HBA01 (append-only audit trail). Through Prisma's pg
 * adapter the code arrives in `meta.driverAdapterError.cause.originalCode`; through `pg` in
 * `code`. These helpers turn such a refusal into a ConflictError (HTTP 409) with the
 * database's own message, which says what was refused and why.
 */
import { ConflictError } from "../../engine/errors";

const LOCK_CODES = new Set(["HBL01", "HBA01"]);

interface Shape {
  code?: unknown;
  message?: unknown;
  meta?: { driverAdapterError?: { cause?: { originalCode?: unknown; originalMessage?: unknown } } };
  cause?: unknown;
}

function lockCause(err: unknown): { code: string; message: string } | null {
  const e = err as Shape | null;
  if (!e || typeof e !== "object") return null;
  const cause = e.meta?.driverAdapterError?.cause;
  if (cause && typeof cause.originalCode === "string" && LOCK_CODES.has(cause.originalCode)) return { code: cause.originalCode, message: String(cause.originalMessage ?? "") };
  if (typeof e.code === "string" && LOCK_CODES.has(e.code)) return { code: e.code, message: String(e.message ?? "") };
  const m = typeof e.message === "string" ? e.message.match(/Code: `(HB[AL]01)`\. Message: `([^`]*)`/) : null;
  if (m) return { code: m[1]!, message: m[2]! };
  return e.cause ? lockCause(e.cause) : null;
}

/** Whether `err` is a refusal by one of the lock triggers. */
export function isLockViolation(err: unknown): boolean {
  return lockCause(err) !== null;
}

/** The lock refusal as a ConflictError, or `err` unchanged if it is something else. */
export function lockViolation(err: unknown): unknown {
  const c = lockCause(err);
  return c ? new ConflictError(`refused by the database: ${c.message}`, { code: c.code }) : err;
}
