/**
 * PostgreSQL restarted under a running app: while it is down, API requests fail cleanly with
 * 503 and a message saying the database is not reachable (lib/server/http.ts), the server
 * process stays up; once PostgreSQL is back the same server answers 200 again and its
 * LISTEN connection has reconnected (a change reaches a new event stream) — no app restart.
 * A job worker running through the restart stays up and drains a job enqueued after it.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { spawn } from "node:child_process";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement, until, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { openEvents } from "./sse";
import { fullChain, writeSteps } from "../server/reviewFixtures";
import { appQueue, closeJobPool, enqueueJob, jobPool, runById } from "../../lib/server/jobs";

let d: OpsDatabase;
let f: OpsFixture;
let app: AppServer;
let analysisId: string;

beforeAll(async () => {
  d = await opsDatabase("pgrestart");
  f = await opsFixture(d.db, "pgr");
  const m = await storeMeasurement(d.db, f, 300);
  const an = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title: "restart", createdById: f.analyst.userId } });
  const rev = await d.db.analysisRevision.create({ data: { analysisId: an.id, number: 1, createdById: f.analyst.userId } });
  await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(m, 12));
  analysisId = an.id;
  app = await startApp(d.url);
});

afterAll(async () => {
  await (await appQueue().catch(() => null))?.stop({ graceful: false, wait: true });
  await closeJobPool(d.url).catch(() => undefined);
  await app?.kill("SIGTERM");
  await d?.close();
});

describe("PostgreSQL restart under a running next start", () => {
  it("requests answer 503 with a message while it is down and 200 again after, from the same process", async () => {
    const { cookie } = await signIn(app.base, f.analyst.email);
    const notebook = `${app.base}/api/groups/${f.slug}/analyses/${analysisId}`;
    const samples = `${app.base}/api/groups/${f.slug}/samples`;
    const ready = `${app.base}/api/health?db=1`;
    expect((await fetch(notebook, { headers: { cookie } })).status).toBe(200);
    expect(await (await fetch(ready)).json()).toEqual({ status: "ok", database: "ok" });
    const stream = await openEvents(`${app.base}/api/groups/${f.slug}/events`, cookie);
    stream.close();

    await d.stop();
    const down: { status: number; error: string }[] = [];
    try {
      for (const url of [notebook, samples, ready, notebook]) {
        const r = await fetch(url, { headers: { cookie } });
        down.push({ status: r.status, error: ((await r.json()) as { error: string }).error });
      }
      // Liveness does not ask the database: a load balancer keeps the instance while it is down.
      expect(await (await fetch(`${app.base}/api/health`)).json()).toEqual({ status: "ok" });
    } finally {
      await d.start();
    }
    for (const r of down) {
      if (r.status !== 503) console.log(`answered ${r.status} while PostgreSQL was down; server log:\n${app.output.join("").slice(-3000)}`);
      expect(r.status).toBe(503);
      expect(r.error).toMatch(/database is not reachable/);
    }
    expect(app.child.exitCode).toBeNull();

    await until("the notebook to answer 200 again", async () => (await fetch(notebook, { headers: { cookie } })).status === 200, 90);
    expect((await fetch(samples, { headers: { cookie } })).status).toBe(200);
    expect((await fetch(ready)).status).toBe(200);
    expect(app.child.exitCode).toBeNull();

    // Live updates work again: a change after the restart reaches a stream opened after it.
    const again = await openEvents(`${app.base}/api/groups/${f.slug}/events?analysisId=${analysisId}`, cookie);
    try {
      const res = await fetch(notebook, { method: "PATCH", headers: { cookie, "content-type": "application/json", origin: app.base }, body: JSON.stringify({ title: "restart (renamed after the database came back)" }) });
      expect(res.status).toBe(200);
      await until("the rename event", async () => again.events.find((e) => e.kind === "analysis"), 60);
    } finally {
      again.close();
    }
  });

  it("a job worker running through a PostgreSQL restart stays up and drains a job sent after it", async () => {
    process.env.DATABASE_URL = d.url;
    const log: string[] = [];
    const worker = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--name", "restart-worker"], { env: { ...process.env, DATABASE_URL: d.url }, stdio: ["ignore", "pipe", "pipe"] });
    worker.stdout!.on("data", (c) => log.push(String(c)));
    worker.stderr!.on("data", (c) => log.push(String(c)));
    try {
      await until("the worker to start", async () => log.join("").includes("draining"), 60);
      await d.stop();
      await new Promise((ok) => setTimeout(ok, 3000));
      await d.start();
      expect(worker.exitCode, log.join("")).toBeNull();
      const seriesId = (await d.db.series.create({ data: { groupId: f.analyst.group.id, name: "after restart", members: { create: [{ sampleId: f.sampleId }] } } })).id;
      const job = await until("the job to be accepted", async () => enqueueJob(d.db, f.analyst, { kind: "refit-series", seriesId }), 60);
      const done = await until("the job to be drained", async () => {
        const r = await runById(jobPool(d.url), job.id);
        return r && (r.state === "done" || r.state === "failed") ? r : null;
      }, 90).catch((err) => { throw new Error(`${(err as Error).message}; worker log: ${log.join("")}`); });
      expect(done.state).toBe("done");
      expect(worker.exitCode).toBeNull();
    } finally {
      if (worker.exitCode === null && worker.signalCode === null) {
        const exited = new Promise((ok) => worker.once("exit", ok));
        worker.kill("SIGTERM");
        await exited;
      }
    }
  });
});
