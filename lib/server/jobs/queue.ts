/**
 * The job queue: pg-boss (10.x, the newest line that runs on Node 20) in its own PostgreSQL
 * schema "pgboss", which pg-boss creates and migrates on start — as the database OWNER, in the
 * start-up step (lib/server/db/prepare.ts), with every queue created there too, since the
 * runtime role may not create tables; the app and workers then find it ready. The app only sends
 * (no supervision); `npm run worker` processes fetch with SKIP LOCKED, so each job goes to
 * one worker at a time, and supervise: an active job whose worker died is failed after its
 * expiry and retried by another worker.
 */
import PgBoss from "pg-boss";

/** The job kinds and their queue names. */
export const JOB_KINDS = ["refit-series", "window-scan"] as const;
export type JobKind = (typeof JOB_KINDS)[number];

export interface QueueSettings {
  /** Seconds a job may stay active before supervision fails it (and retries it). */
  expireInSeconds: number;
  retryLimit: number;
  retryDelaySeconds: number;
}

/** From the environment: HEATBOOK_JOB_EXPIRE_SECONDS (default 900), HEATBOOK_JOB_RETRIES (3). */
export function queueSettings(env: NodeJS.ProcessEnv = process.env): QueueSettings {
  const num = (name: string, fallback: number) => {
    const v = Number(env[name] ?? fallback);
    if (!Number.isFinite(v) || v < 0) throw new Error(`invalid ${name}: ${env[name]} (a non-negative number is expected)`);
    return v;
  };
  return { expireInSeconds: Math.max(1, num("HEATBOOK_JOB_EXPIRE_SECONDS", 900)), retryLimit: num("HEATBOOK_JOB_RETRIES", 3), retryDelaySeconds: num("HEATBOOK_JOB_RETRY_DELAY_SECONDS", 2) };
}

export interface BossOptions {
  /** Run maintenance (expire dead workers' jobs) in this process. */
  supervise: boolean;
  maintenanceIntervalSeconds?: number;
}

/** A started pg-boss on `url` with every job queue created. */
export async function startBoss(url: string, opts: BossOptions): Promise<PgBoss> {
  const boss = new PgBoss({
    connectionString: url,
    // Workers fetch, supervise and complete; the app only sends.
    max: opts.supervise ? 4 : 2,
    application_name: opts.supervise ? "heatbook-worker" : "heatbook-app",
    supervise: opts.supervise,
    schedule: false,
    migrate: true,
    maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds ?? 30,
  });
  boss.on("error", (err) => console.error("job queue:", (err as Error).message));
  await boss.start();
  const s = queueSettings();
  for (const name of JOB_KINDS) {
    if (await boss.getQueue(name)) continue;
    try {
      await boss.createQueue(name, { name, expireInSeconds: s.expireInSeconds, retryLimit: s.retryLimit, retryDelay: s.retryDelaySeconds });
    } catch (err) {
      // Two processes starting at once: the other one created it.
      if (!(await boss.getQueue(name))) throw err;
    }
  }
  return boss;
}

let appBoss: Promise<PgBoss> | null = null;

/** The app process's sender (started once, no supervision). */
export function appQueue(): Promise<PgBoss> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set");
  appBoss ??= startBoss(url, { supervise: false }).catch((err) => {
    appBoss = null;
    throw err;
  });
  return appBoss;
}
