/**
 * JobRun rows: what the app shows about a job (state, progress done/total, message, result,
 * error, the attempts that ran it). Written over plain `pg` so the row and the queue entry can
 * share one transaction (enqueue.ts); read by the status routes and the jobs panel.
 */
import pg from "pg";
import type { JobKind } from "./queue";

export type JobState = "queued" | "running" | "done" | "failed";

export interface JobAttempt {
  worker: string;
  startedAt: string;
}

/** A job as the app shows it (plain, JSON-safe). */
export interface JobView {
  id: string;
  kind: JobKind;
  params: Record<string, unknown>;
  state: JobState;
  done: number;
  total: number;
  message: string;
  result: unknown;
  error: string | null;
  attempts: JobAttempt[];
  completions: number;
  createdById: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

type Queryable = Pick<pg.Pool, "query"> | pg.PoolClient;

const pools = new Map<string, pg.Pool>();

/** A small pool for job bookkeeping, one per connection string per process. */
export function jobPool(url = process.env.DATABASE_URL): pg.Pool {
  if (!url) throw new Error("DATABASE_URL is not set");
  let pool = pools.get(url);
  if (!pool) {
    pool = new pg.Pool({ connectionString: url, max: 3, application_name: "heatbook-jobs" });
    pool.on("error", () => undefined); // an idle client lost with the server; the next query reconnects
    pools.set(url, pool);
  }
  return pool;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

function toView(r: Record<string, unknown>): JobView {
  return {
    id: r.id as string, kind: r.kind as JobKind, params: r.params as Record<string, unknown>, state: r.state as JobState,
    done: r.done as number, total: r.total as number, message: r.message as string, result: r.result ?? null, error: (r.error as string | null) ?? null,
    attempts: r.attempts as JobAttempt[], completions: r.completions as number, createdById: (r.createdById as string | null) ?? null,
    createdAt: iso(r.createdAt as Date)!, startedAt: iso(r.startedAt as Date | null), finishedAt: iso(r.finishedAt as Date | null),
  };
}

export async function insertRun(q: Queryable, run: { id: string; groupId: string; kind: JobKind; params: object; createdById: string; total: number }): Promise<void> {
  await q.query(`INSERT INTO "JobRun" ("id","groupId","kind","params","createdById","total") VALUES ($1,$2,$3,$4,$5,$6)`, [run.id, run.groupId, run.kind, JSON.stringify(run.params), run.createdById, run.total]);
}

/** One job of a group, or null. */
export async function getRun(q: Queryable, groupId: string, id: string): Promise<JobView | null> {
  const { rows } = await q.query(`SELECT * FROM "JobRun" WHERE "id" = $1 AND "groupId" = $2`, [id, groupId]);
  return rows[0] ? toView(rows[0]) : null;
}

/** The newest jobs of a group. */
export async function listRuns(q: Queryable, groupId: string, limit = 20): Promise<JobView[]> {
  const { rows } = await q.query(`SELECT * FROM "JobRun" WHERE "groupId" = $1 ORDER BY "createdAt" DESC LIMIT $2`, [groupId, limit]);
  return rows.map(toView);
}

/** A job by id whatever its group (the worker's view). */
export async function runById(q: Queryable, id: string): Promise<JobView | null> {
  const { rows } = await q.query(`SELECT * FROM "JobRun" WHERE "id" = $1`, [id]);
  return rows[0] ? toView(rows[0]) : null;
}

/** Record that `worker` starts an attempt; progress restarts from zero. */
export async function startAttempt(q: Queryable, id: string, worker: string): Promise<void> {
  const attempt = JSON.stringify([{ worker, startedAt: new Date().toISOString() }]);
  await q.query(
    `UPDATE "JobRun" SET "state" = 'running', "done" = 0, "error" = NULL, "attempts" = "attempts" || $2::jsonb,
       "startedAt" = COALESCE("startedAt", now()), "updatedAt" = now() WHERE "id" = $1 AND "state" <> 'done'`,
    [id, attempt],
  );
}

export async function setProgress(q: Queryable, id: string, done: number, total: number, message: string): Promise<void> {
  await q.query(`UPDATE "JobRun" SET "done" = $2, "total" = $3, "message" = $4, "updatedAt" = now() WHERE "id" = $1 AND "state" = 'running'`, [id, done, total, message]);
}

/** Mark done once: returns false when the job was already done (nothing is changed then). */
export async function finishRun(q: Queryable, id: string, result: unknown, message: string): Promise<boolean> {
  const r = await q.query(
    `UPDATE "JobRun" SET "state" = 'done', "done" = "total", "result" = $2, "message" = $3, "completions" = "completions" + 1,
       "finishedAt" = now(), "updatedAt" = now() WHERE "id" = $1 AND "state" <> 'done'`,
    [id, JSON.stringify(result), message],
  );
  return r.rowCount === 1;
}

/** A failed attempt: 'failed' when no retry is left, otherwise back to 'queued'. */
export async function failAttempt(q: Queryable, id: string, error: string, final: boolean): Promise<void> {
  await q.query(
    `UPDATE "JobRun" SET "state" = $3, "error" = $2, "finishedAt" = CASE WHEN $3 = 'failed' THEN now() ELSE NULL END, "updatedAt" = now()
       WHERE "id" = $1 AND "state" <> 'done'`,
    [id, error.slice(0, 2000), final ? "failed" : "queued"],
  );
}

/** End the bookkeeping pool of `url` (a stopping worker); a later jobPool(url) opens a new one. */
export async function closeJobPool(url: string): Promise<void> {
  const pool = pools.get(url);
  pools.delete(url);
  await pool?.end();
}
