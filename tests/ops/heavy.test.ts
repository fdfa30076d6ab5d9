/**
 * Against a real `next start` (the built app, so the worker threads load the engine as in
 * production): a notebook whose fit step is slow (the pool's test hook blocks the worker thread,
 * as a heavy fit would; HEATBOOK_TEST_HOOKS=1) does not hold up other clients — /api/health and
 * another notebook answer while it computes — and the step, over its budget, ends as the
 * failure "stopped after 3 s: time budget", which the next open does not compute again.
 * And a chunked 200 MB upload is refused with 413 while the server's memory grows by far less
 * than 200 MB (it was +284 MB when the body was buffered whole).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { readFileSync } from "node:fs";
import { request } from "node:http";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { fullChain, writeSteps } from "../server/reviewFixtures";

let d: OpsDatabase;
let f: OpsFixture;
let app: AppServer;
let cookie: string;
const ids = { slow: "", other: "" };

async function analysis(m: string, title: string): Promise<string> {
  const an = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title, createdById: f.analyst.userId } });
  const rev = await d.db.analysisRevision.create({ data: { analysisId: an.id, number: 1, createdById: f.analyst.userId } });
  await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(m, 12));
  return an.id;
}

beforeAll(async () => {
  d = await opsDatabase("heavy");
  f = await opsFixture(d.db, "heavy");
  const m = await storeMeasurement(d.db, f, 400);
  ids.slow = await analysis(m, "slow fit");
  ids.other = await analysis(m, "other notebook");
  // The slow step: the raw config carries the test hook (60 s, far over the 3 s budget).
  const fit = await d.db.step.findFirstOrThrow({ where: { revision: { analysisId: ids.slow }, kind: "fit" } });
  await d.db.step.update({ where: { id: fit.id }, data: { config: { ...(fit.config as object), __testSlowMs: 60_000 }, version: { increment: 1 } } });
  process.env.HEATBOOK_TEST_HOOKS = "1";
  process.env.HEATBOOK_COMPUTE_BUDGET_MS = "3000";
  app = await startApp(d.url);
  cookie = (await signIn(app.base, f.analyst.email)).cookie;
});

afterAll(async () => {
  await app?.kill("SIGTERM");
  await d?.close();
});

const rssMiB = (pid: number) => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))![1]) / 1024;

async function timed(url: string, headers: Record<string, string> = {}): Promise<{ status: number; ms: number; at: number; body: string }> {
  const t0 = performance.now();
  const r = await fetch(url, { headers });
  const body = await r.text();
  return { status: r.status, ms: performance.now() - t0, at: performance.now(), body };
}

describe("heavy work off the request thread", () => {
  it("GET of a notebook with a slow fit step leaves /api/health and another notebook fast, and ends the step at its 3 s budget", async () => {
    const nb = (id: string) => `${app.base}/api/groups/${f.slug}/analyses/${id}`;
    // Warm both routes (first compilation of each route, the pool's first worker).
    await timed(nb(ids.other), { cookie });
    await timed(`${app.base}/api/health`);
    const slow = timed(nb(ids.slow), { cookie });
    await new Promise((ok) => setTimeout(ok, 300));
    const others: Awaited<ReturnType<typeof timed>>[] = [];
    for (let i = 0; i < 5; i++) {
      others.push(await timed(`${app.base}/api/health`));
      others.push(await timed(nb(ids.other), { cookie }));
    }
    const s = await slow;
    expect(others.every((o) => o.status === 200)).toBe(true);
    // Every other request was answered while the slow one computed (ordering), each well under
    // the 3 s the slow step blocked its worker (generous margin: 1.5 s on a shared machine).
    expect(others.every((o) => o.at < s.at)).toBe(true);
    expect(Math.max(...others.map((o) => o.ms))).toBeLessThan(1500);
    expect(s.status).toBe(200);
    const steps = (JSON.parse(s.body) as { notebook: { steps: { kind: string; output: { ok: boolean; error: string | null } }[] } }).notebook.steps;
    expect(steps.find((x) => x.kind === "fit")!.output).toMatchObject({ ok: false, error: "stopped after 3 s: time budget" });
    expect(steps.find((x) => x.kind === "data")!.output.ok).toBe(true);
    expect(s.ms).toBeGreaterThan(2900);

    // The next open finds the stop stored with its input hash: nothing is computed again.
    const before = await d.db.step.findMany({ where: { revision: { analysisId: ids.slow } }, select: { computedAt: true }, orderBy: { position: "asc" } });
    const again = await timed(nb(ids.slow), { cookie });
    expect(again.status).toBe(200);
    expect(again.ms).toBeLessThan(2500);
    expect(await d.db.step.findMany({ where: { revision: { analysisId: ids.slow } }, select: { computedAt: true }, orderBy: { position: "asc" } })).toEqual(before);
  });
});

/** POST `total` bytes in 64 KiB chunks (no Content-Length), sampling the server's RSS meanwhile. */
function chunkedUpload(url: URL, headers: Record<string, string>, total: number, pid: number): Promise<{ status: number | null; body: string; sent: number; peakRssMiB: number }> {
  return new Promise((resolve) => {
    let peak = rssMiB(pid);
    const sampler = setInterval(() => { try { peak = Math.max(peak, rssMiB(pid)); } catch { /* exited */ } }, 50);
    let sent = 0;
    let status: number | null = null;
    let body = "";
    let finished = false;
    const finish = () => {
      if (finished) return;
      finished = true;
      clearInterval(sampler);
      resolve({ status, body, sent, peakRssMiB: peak });
    };
    const req = request(url, { method: "POST", headers: { ...headers, "transfer-encoding": "chunked" } }, (res) => {
      status = res.statusCode ?? null;
      res.setEncoding("utf8");
      res.on("data", (c) => { body += c; });
      res.on("end", () => { req.destroy(); finish(); });
    });
    req.on("error", () => setTimeout(finish, 200));
    const chunk = Buffer.alloc(64 * 1024, 0x31);
    const pump = () => {
      while (sent < total && status === null && !finished) {
        sent += chunk.byteLength;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (sent >= total) req.end();
    };
    pump();
  });
}

describe("streamed upload limit", () => {
  it("a chunked 200 MB multipart upload is refused with 413 and the server's RSS grows by less than 100 MiB", async () => {
    const pid = app.child.pid!;
    const before = rssMiB(pid);
    const url = new URL(`${app.base}/api/groups/${f.slug}/samples/${f.sampleId}/measurements`);
    const r = await chunkedUpload(url, { cookie, "content-type": "multipart/form-data; boundary=----heatbook" }, 200 * 1000 * 1000, pid);
    expect(r.status).toBe(413);
    expect(JSON.parse(r.body)).toEqual({ error: "the upload is larger than 20 MiB", field: "file" });
    // The server stopped reading at the limit: the client could not push the whole 200 MB.
    expect(r.sent).toBeLessThan(200 * 1000 * 1000);
    expect(r.peakRssMiB - before).toBeLessThan(100);
    // Still serving.
    expect((await fetch(`${app.base}/api/health`)).status).toBe(200);
  });
});
