/**
 * A worker process's loop: fetch jobs of every kind from pg-boss (one at a time per kind),
 * run them, store progress and the result in JobRun. Guards that keep a job from being done
 * twice even when pg-boss hands it out again (a retry after an expiry, a crash between our
 * commit and pg-boss's completion):
 *  - a session advisory lock on the job id, held on a connection of its own while the job
 *    runs (released by PostgreSQL when the worker dies), so two attempts never overlap;
 *  - a job whose JobRun is already done is acknowledged without running again;
 *  - finishRun marks done only once (completions counts the times, the tests read it).
 * A worker killed mid-job leaves its job active; supervision in the surviving workers fails it
 * after expireInSeconds and pg-boss retries it (retryLimit).
 */
import pg from "pg";
import type PgBoss from "pg-boss";
import { hostname } from "node:os";
import { createDb } from "../db/client";
import { JOB_KINDS, startBoss, type JobKind } from "./queue";
import { closeJobPool, failAttempt, finishRun, jobPool, runById, setProgress, startAttempt } from "./runs";
import { runRefitSeries } from "./refitSeries";
import { runWindowScan, type WindowScanParams } from "./windowScan";
import type { JobContext } from "./context";

export interface WorkerOptions {
  url: string;
  /** Name recorded in each attempt (default host:pid). */
  name?: string;
  pauseMs?: number;
  maintenanceIntervalSeconds?: number;
  pollingIntervalSeconds?: number;
  log?: (line: string) => void;
}

interface JobData { jobId: string; groupId: string; actorId: string; [k: string]: unknown }

export interface RunningWorker {
  name: string;
  stop(): Promise<void>;
}

async function runKind(kind: JobKind, ctx: JobContext, data: JobData): Promise<{ result: unknown; message: string }> {
  if (kind === "refit-series") {
    const r = await runRefitSeries(ctx, { seriesId: String(data.seriesId) });
    return { result: r, message: `${r.revisionsRecomputed} revisions recomputed, ${r.sealedVerified} sealed verified, ${r.sealedProblems.length} sealed with problems` };
  }
  const r = await runWindowScan(ctx, data as unknown as WindowScanParams & JobData);
  return { result: r, message: `${r.cells.length} windows, plateau of ${r.plateauCells}` };
}

/** Start a worker on `url`; resolves once it is fetching. */
export async function startWorker(opts: WorkerOptions): Promise<RunningWorker> {
  const name = opts.name ?? `${hostname()}:${process.pid}`;
  const log = opts.log ?? ((l: string) => console.log(l));
  const db = createDb(opts.url, 4);
  const pool = jobPool(opts.url);
  const boss: PgBoss = await startBoss(opts.url, { supervise: true, maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds });
  const handle = (kind: JobKind) => async ([job]: PgBoss.JobWithMetadata<JobData>[]) => {
    const data = job!.data;
    const run = await runById(pool, data.jobId);
    if (!run || run.state === "done") return; // acknowledged: nothing (more) to do
    const lock = new pg.Client({ connectionString: opts.url, application_name: `heatbook-job-lock ${name}` });
    await lock.connect();
    try {
      const got = await lock.query("SELECT pg_try_advisory_lock(hashtext('heatbook-job'), hashtext($1)) AS ok", [data.jobId]);
      if (!got.rows[0].ok) throw new Error("the job is still running in another worker");
      await startAttempt(pool, data.jobId, name);
      log(`worker ${name}: ${kind} ${data.jobId} started (try ${job!.retryCount + 1})`);
      const pauseMs = opts.pauseMs ?? 0;
      const ctx: JobContext = {
        db, jobId: data.jobId, groupId: data.groupId, actorId: data.actorId,
        progress: (done, total, message) => setProgress(pool, data.jobId, done, total, message),
        pause: () => new Promise((r) => setTimeout(r, pauseMs)),
      };
      const { result, message } = await runKind(kind, ctx, data);
      const first = await finishRun(pool, data.jobId, result, message);
      log(`worker ${name}: ${kind} ${data.jobId} ${first ? "done" : "was already done"}: ${message}`);
    } catch (err) {
      await failAttempt(pool, data.jobId, (err as Error).message, job!.retryCount >= job!.retryLimit).catch(() => undefined);
      log(`worker ${name}: ${kind} ${data.jobId} failed: ${(err as Error).message}`);
      throw err;
    } finally {
      await lock.end().catch(() => undefined);
    }
  };
  for (const kind of JOB_KINDS)
    await boss.work<JobData>(kind, { batchSize: 1, includeMetadata: true, pollingIntervalSeconds: opts.pollingIntervalSeconds ?? 1 }, handle(kind));
  log(`worker ${name}: draining ${JOB_KINDS.join(", ")}`);
  return {
    name,
    async stop() {
      await boss.stop({ graceful: true, timeout: 30_000, wait: true });
      await closeJobPool(opts.url).catch(() => undefined);
      await db.$disconnect();
    },
  };
}
