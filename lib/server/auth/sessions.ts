/**
 * Server-side sessions. Signing in creates a Session row; the next-auth JWT cookie carries only
 * its id (`sid`) beside the user id. Every request checks the row (lib/server/session.ts, and in
 * the same statement as the membership on the hot path, lib/server/handler.ts): a session is
 * live while it has not been ended, is younger than its absolute lifetime and was used within
 * the idle timeout. Use refreshes `lastSeenAt` at most once a minute (so reads do not all become
 * writes; the idle timeout is exact to that minute).
 *
 * HEATBOOK_SESSION_IDLE_MINUTES (default 120) and HEATBOOK_SESSION_MAX_HOURS (default 12).
 */
import { randomUUID } from "node:crypto";
import type { Db } from "../db/client";
import { sqlRows } from "../db/client";
import { uuidOrNone } from "../ids";

/** Seconds between two refreshes of lastSeenAt. */
export const TOUCH_RESOLUTION_S = 60;

function envNumber(name: string, fallback: number): number {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v > 0 ? v : fallback;
}

export function sessionPolicy(): { idleSeconds: number; maxSeconds: number } {
  return { idleSeconds: Math.round(envNumber("HEATBOOK_SESSION_IDLE_MINUTES", 120) * 60), maxSeconds: Math.round(envNumber("HEATBOOK_SESSION_MAX_HOURS", 12) * 3600) };
}

let clock: () => number = Date.now;

/** The time sessions are judged by (tests move it). */
export function sessionNow(): Date {
  return new Date(clock());
}

/** Replace the session clock (tests); undefined restores Date.now. */
export function setSessionClock(fn: (() => number) | undefined): void {
  clock = fn ?? Date.now;
}

export interface SessionInfo {
  id: string;
  createdAt: string;
  lastSeenAt: string;
  expiresAt: string;
  userAgent: string;
}

/** Start a session for the user; returns its id (to go into the JWT). */
export async function createSession(db: Db, userId: string, userAgent = ""): Promise<string> {
  const now = sessionNow();
  const id = randomUUID();
  await db.session.create({ data: { id, userId, createdAt: now, lastSeenAt: now, expiresAt: new Date(now.getTime() + sessionPolicy().maxSeconds * 1000), userAgent: userAgent.slice(0, 300) } });
  return id;
}

/**
 * SQL and values for "the live session with id $k and its user" as a CTE body; parameters are
 * numbered from `first`. Used alone (liveSessionUser) and inside the membership statement.
 */
export function liveSessionSql(first: number): { sql: string; values: (sid: string) => unknown[] } {
  const [sid, now, idle, touch] = [first, first + 1, first + 2, first + 3].map((n) => `$${n}`);
  return {
    sql: `sess AS (SELECT "id", "userId" FROM "Session" WHERE "id" = ${sid}::uuid AND "endedAt" IS NULL
            AND "expiresAt" > ${now}::timestamptz AND "lastSeenAt" > ${now}::timestamptz - make_interval(secs => ${idle}::int)),
          touch AS (UPDATE "Session" SET "lastSeenAt" = ${now}::timestamptz WHERE "id" = (SELECT "id" FROM sess)
            AND "lastSeenAt" < ${now}::timestamptz - make_interval(secs => ${touch}::int) RETURNING 1)`,
    values: (id: string) => [uuidOrNone(id), sessionNow().toISOString(), sessionPolicy().idleSeconds, TOUCH_RESOLUTION_S],
  };
}

/** The user id of a live session (refreshing its last use), or null. One statement. */
export async function liveSessionUser(db: Db, sessionId: string): Promise<string | null> {
  const live = liveSessionSql(1);
  const [row] = await sqlRows<{ userId: string | null }>(db, `WITH ${live.sql} SELECT (SELECT "userId"::text FROM sess) AS "userId"`, live.values(sessionId));
  return row?.userId ?? null;
}

/** The user row of a live session (refreshing its last use), or null. One statement. */
export async function liveSessionUserRow(db: Db, sessionId: string): Promise<{ id: string; email: string; name: string } | null> {
  const live = liveSessionSql(1);
  const [row] = await sqlRows<{ id: string; email: string; name: string }>(
    db, `WITH ${live.sql} SELECT u."id"::text AS "id", u."email", u."name" FROM sess JOIN "User" u ON u."id" = sess."userId"`, live.values(sessionId),
  );
  return row ?? null;
}

/** End one session (sign-out). Idempotent. */
export async function endSession(db: Db, sessionId: string, reason = "signed out"): Promise<void> {
  await db.session.updateMany({ where: { id: uuidOrNone(sessionId), endedAt: null }, data: { endedAt: sessionNow(), endReason: reason } });
}

/** End every live session of the user ("sign out everywhere"); returns how many were ended. */
export async function endAllSessions(db: Db, userId: string, reason = "signed out everywhere"): Promise<number> {
  const r = await db.session.updateMany({ where: { userId, endedAt: null }, data: { endedAt: sessionNow(), endReason: reason } });
  return r.count;
}

/** The user's live sessions, most recently used first. */
export async function listLiveSessions(db: Db, userId: string): Promise<SessionInfo[]> {
  const now = sessionNow();
  const { idleSeconds } = sessionPolicy();
  const rows = await db.session.findMany({
    where: { userId, endedAt: null, expiresAt: { gt: now }, lastSeenAt: { gt: new Date(now.getTime() - idleSeconds * 1000) } },
    orderBy: { lastSeenAt: "desc" },
  });
  return rows.map((s) => ({ id: s.id, createdAt: s.createdAt.toISOString(), lastSeenAt: s.lastSeenAt.toISOString(), expiresAt: s.expiresAt.toISOString(), userAgent: s.userAgent }));
}
