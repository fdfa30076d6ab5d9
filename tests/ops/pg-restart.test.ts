/**
 * PostgreSQL restarted under a running app: while it is down, API requests fail cleanly with
 * 503 and a message saying the database is not reachable (lib/server/http.ts), the server
 * process stays up; once PostgreSQL is back the same server answers 200 again and its
 * LISTEN connection has reconnected (a change reaches a new event stream) — no app restart.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement, until, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { openEvents } from "./sse";
import { fullChain, writeSteps } from "../server/reviewFixtures";

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
  await app?.kill("SIGTERM");
  await d?.close();
});

describe("PostgreSQL restart under a running next start", () => {
  it("requests answer 503 with a message while it is down and 200 again after, from the same process", async () => {
    const { cookie } = await signIn(app.base, f.analyst.email);
    const notebook = `${app.base}/api/groups/${f.slug}/analyses/${analysisId}`;
    const samples = `${app.base}/api/groups/${f.slug}/samples`;
    expect((await fetch(notebook, { headers: { cookie } })).status).toBe(200);
    const stream = await openEvents(`${app.base}/api/groups/${f.slug}/events`, cookie);
    stream.close();

    await d.stop();
    const down: { status: number; error: string }[] = [];
    for (const url of [notebook, samples, notebook]) {
      const r = await fetch(url, { headers: { cookie } });
      down.push({ status: r.status, error: ((await r.json()) as { error: string }).error });
    }
    for (const r of down) {
      if (r.status !== 503) console.log(`answered ${r.status} while PostgreSQL was down; server log:\n${app.output.join("").slice(-3000)}`);
      expect(r.status).toBe(503);
      expect(r.error).toMatch(/database is not reachable/);
    }
    expect(app.child.exitCode).toBeNull();

    await d.start();
    await until("the notebook to answer 200 again", async () => (await fetch(notebook, { headers: { cookie } })).status === 200, 90);
    expect((await fetch(samples, { headers: { cookie } })).status).toBe(200);
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
});
