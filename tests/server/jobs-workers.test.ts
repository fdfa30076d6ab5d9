/**
 * Two real worker processes (`scripts/worker.ts`, spawned with child_process) drain one queue
 * of refit-series jobs; one is killed with SIGKILL in the middle of a job. Checked afterwards:
 * every job is done, each exactly once (JobRun.completions = 1 and pg-boss completed it), the
 * killed worker's job was retried by the survivor after its expiry, and no other job ran twice.
 * Jobs are slowed with --pause-ms so one is surely mid-way when the kill comes; the expiry is
 * short (HEATBOOK_JOB_EXPIRE_SECONDS) so the retry comes within seconds. No timing assertions.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { spawn, type ChildProcess } from "node:child_process";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeSeriesFixture, ageOpenSteps, type SeriesFixture } from "./jobsFixtures";

vi.mock("next-auth", () => ({ getServerSession: async () => null, default: () => null }));

import { ENGINE_VERSION } from "../../lib/engine/version";
import { appQueue, closeJobPool, enqueueJob, jobPool, runById, type JobView } from "../../lib/server/jobs";

const JOBS = 6;
let t: TestDatabase;
let f: SeriesFixture;
const children: ChildProcess[] = [];
const logs: Record<string, string[]> = {};

function spawnWorker(name: string): ChildProcess {
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--name", name, "--pause-ms", "400", "--maintenance-seconds", "1"], {
    env: { ...process.env, DATABASE_URL: t.url },
    stdio: ["ignore", "pipe", "pipe"],
  });
  logs[name] = [];
  child.stdout!.on("data", (d) => logs[name]!.push(String(d)));
  child.stderr!.on("data", (d) => logs[name]!.push(String(d)));
  children.push(child);
  return child;
}

async function runs(): Promise<JobView[]> {
  const { rows } = await jobPool(t.url).query(`SELECT "id" FROM "JobRun" ORDER BY "createdAt"`);
  return Promise.all(rows.map(async (r: { id: string }) => (await runById(jobPool(t.url), r.id))!));
}

async function until<T>(what: string, probe: () => Promise<T | null | undefined | false>, seconds = 150): Promise<T> {
  for (let i = 0; i < seconds * 5; i++) {
    const v = await probe();
    if (v) return v;
    await new Promise((ok) => setTimeout(ok, 200));
  }
  throw new Error(`timed out waiting for ${what}; worker logs: ${JSON.stringify(logs)}`);
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  // The expiry is set when a job is sent (here) — short, so the killed worker's job comes back soon.
  Object.assign(process.env, { HEATBOOK_JOB_EXPIRE_SECONDS: "8", HEATBOOK_JOB_RETRY_DELAY_SECONDS: "1", HEATBOOK_JOB_RETRIES: "3" });
  f = await makeSeriesFixture(t.db, { samples: 5 });
}, 120_000);

afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill("SIGTERM");
  await Promise.all(children.map((c) => (c.exitCode === null && c.signalCode === null ? new Promise((ok) => c.once("exit", ok)) : null)));
  await (await appQueue()).stop({ graceful: false, wait: true });
  await closeJobPool(t.url);
  await t.drop();
}, 90_000);

describe("npm run worker × 2 on one queue", () => {
  it("drains every job exactly once when one worker is killed with SIGKILL mid-job", async () => {
    await ageOpenSteps(t.db, f);
    const queued: string[] = [];
    for (let k = 0; k < JOBS; k++) queued.push((await enqueueJob(t.db, f.members.analyst, { kind: "refit-series", seriesId: f.seriesId })).id);
    const a = spawnWorker("worker-a");
    spawnWorker("worker-b");
    // Wait until worker-a is early in a job (≥ 3 analyses × 400 ms still to go), then kill it without warning.
    const victim = await until("worker-a mid-job", async () => {
      const { rows } = await jobPool(t.url).query(`SELECT "id", "done", "total" FROM "JobRun" WHERE "state" = 'running' AND "done" >= 1 AND "done" <= "total" - 3 AND "attempts"->-1->>'worker' = 'worker-a'`);
      return rows[0] as { id: string } | undefined;
    });
    a.kill("SIGKILL");
    await new Promise((ok) => a.once("exit", ok));
    expect((await runById(jobPool(t.url), victim.id))!.state).toBe("running");
    const all = await until("every job done", async () => {
      const r = await runs();
      return r.length === JOBS && r.every((j) => j.state === "done" || j.state === "failed") ? r : null;
    });
    expect(all.map((j) => j.state)).toEqual(Array(JOBS).fill("done"));
    expect(all.map((j) => j.completions)).toEqual(Array(JOBS).fill(1));
    const killed = all.find((j) => j.id === victim.id)!;
    expect(killed.attempts.map((x) => x.worker)).toEqual(["worker-a", "worker-b"]);
    for (const j of all.filter((x) => x.id !== victim.id)) expect(j.attempts.length).toBe(1);
    // Both workers took part, and pg-boss itself holds every job as completed.
    expect(new Set(all.flatMap((j) => j.attempts.map((x) => x.worker)))).toEqual(new Set(["worker-a", "worker-b"]));
    // pg-boss marks its row completed after our handler returns (after our done mark): wait for it.
    const rows = await until("pg-boss holds every job as completed", async () => {
      const r = (await jobPool(t.url).query(`SELECT id::text, state::text FROM pgboss.job WHERE id = ANY($1::uuid[])`, [queued])).rows as { state: string }[];
      return r.length === JOBS && r.every((x) => x.state === "completed" || x.state === "failed") ? r : null;
    }, 60);
    expect(rows.map((r) => r.state)).toEqual(Array(JOBS).fill("completed"));
    // Nothing was lost: every aged step of every analysis is computed by today's engine.
    const steps = await t.db.step.findMany({ where: { revisionId: { in: f.analyses.map((x) => x.revisionId) } } });
    expect(steps.length).toBe(20);
    expect(steps.filter((s) => s.engineVersion !== ENGINE_VERSION || s.inputHash === "engine-before-upgrade")).toEqual([]);
  }, 240_000);
});
