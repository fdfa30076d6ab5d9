/**
 * Jobs through the built app: a refit of a series is enqueued over HTTP on `next start`
 * (pg-boss bundled into the route), drained by a real `npm run worker` process, and its
 * progress read back over HTTP until it is done — the path the jobs panel polls.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { spawn, type ChildProcess } from "node:child_process";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement, until, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { fullChain, writeSteps } from "../server/reviewFixtures";

let d: OpsDatabase;
let f: OpsFixture;
let app: AppServer;
let worker: ChildProcess;
let seriesId: string;
const workerLog: string[] = [];

beforeAll(async () => {
  d = await opsDatabase("jobs");
  f = await opsFixture(d.db, "jobs");
  const m = await storeMeasurement(d.db, f, 200);
  for (let k = 0; k < 3; k++) {
    const a = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title: `job ${k}`, createdById: f.analyst.userId } });
    const rev = await d.db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: f.analyst.userId } });
    await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(m, 12));
  }
  await d.db.step.updateMany({ data: { inputHash: "before-upgrade" } });
  seriesId = (await d.db.series.create({ data: { groupId: f.analyst.group.id, name: "jobs series", members: { create: [{ sampleId: f.sampleId }] } } })).id;
  app = await startApp(d.url);
  worker = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--name", "ops-worker"], { env: { ...process.env, DATABASE_URL: d.url }, stdio: ["ignore", "pipe", "pipe"] });
  worker.stdout!.on("data", (c) => workerLog.push(String(c)));
  worker.stderr!.on("data", (c) => workerLog.push(String(c)));
});

afterAll(async () => {
  if (worker && worker.exitCode === null) {
    const exited = new Promise((ok) => worker.once("exit", ok));
    worker.kill("SIGTERM");
    await exited;
  }
  await app?.kill("SIGTERM");
  await d?.close();
});

describe("jobs on the built app", () => {
  it("POST /jobs on next start enqueues a refit that a worker process drains; GET shows it done", async () => {
    const { cookie } = await signIn(app.base, f.analyst.email);
    const res = await fetch(`${app.base}/api/groups/${f.slug}/jobs`, { method: "POST", headers: { cookie, "content-type": "application/json", origin: app.base }, body: JSON.stringify({ kind: "refit-series", seriesId }) });
    expect(res.status).toBe(202);
    const { job } = (await res.json()) as { job: { id: string; total: number } };
    expect(job.total).toBe(3);
    const done = await until("the job to finish", async () => {
      const r = await fetch(`${app.base}/api/groups/${f.slug}/jobs/${job.id}`, { headers: { cookie } });
      const j = ((await r.json()) as { job: { state: string; done: number; total: number; result: { revisionsRecomputed: number } } }).job;
      return j.state === "done" || j.state === "failed" ? j : null;
    }).catch((err) => { throw new Error(`${(err as Error).message}; worker log: ${workerLog.join("")}; app log: ${app.output.join("").slice(-2000)}`); });
    expect(done).toMatchObject({ state: "done", done: 3, total: 3, result: { revisionsRecomputed: 3 } });
    const list = await fetch(`${app.base}/api/groups/${f.slug}/jobs`, { headers: { cookie } });
    expect(((await list.json()) as { jobs: { id: string }[] }).jobs.map((j) => j.id)).toContain(job.id);
  });
});
