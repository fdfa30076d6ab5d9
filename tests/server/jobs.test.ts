/**
 * Jobs through the route handlers (next-auth's session mocked) and one in-process worker:
 * enqueue rights (owner/analyst), 404 across groups, payload errors naming the field, a
 * refit-series job recomputing every open revision after a simulated engine upgrade while
 * the sealed revision stays byte-identical, and a large window scan with its progress.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { ageOpenSteps, makeSeriesFixture, type SeriesFixture } from "./jobsFixtures";
import type { Role } from "../../lib/server/permissions";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as jobsRoute from "../../app/api/groups/[slug]/jobs/route";
import * as jobRoute from "../../app/api/groups/[slug]/jobs/[id]/route";
import { startWorker, type RunningWorker, type JobView } from "../../lib/server/jobs";
import { ENGINE_VERSION } from "../../lib/engine/version";

let t: TestDatabase;
let f: SeriesFixture;
let other: GroupFixture;
let worker: RunningWorker | null = null;

async function call(as: Role | null, method: "GET" | "POST", path: string, body?: unknown, params: Record<string, string> = {}, group: GroupFixture = f) {
  session.userId = as ? group.members[as].userId : null;
  const req = new Request(`http://localhost/api/groups/${group.slug}/jobs${path}`, { method, headers: body ? { "content-type": "application/json" } : {}, ...(body ? { body: JSON.stringify(body) } : {}) });
  const handler = path ? jobRoute.GET : method === "GET" ? jobsRoute.GET : jobsRoute.POST;
  const res = await (handler as (r: Request, c: unknown) => Promise<Response>)(req, { params: Promise.resolve({ slug: group.slug, ...params }) });
  return { status: res.status, body: (await res.json()) as any };
}

async function waitFor(id: string, as: Role = "viewer"): Promise<JobView> {
  for (let i = 0; i < 600; i++) {
    const r = await call(as, "GET", `/${id}`, undefined, { id });
    if (r.body.job.state === "done" || r.body.job.state === "failed") return r.body.job;
    await new Promise((ok) => setTimeout(ok, 100));
  }
  throw new Error(`job ${id} did not finish`);
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeSeriesFixture(t.db, { samples: 3, sealFirst: true });
  other = await makeGroup(t.db, "Other jobs group");
}, 120_000);

afterAll(async () => {
  await worker?.stop();
  const { appQueue } = await import("../../lib/server/jobs");
  await (await appQueue()).stop({ graceful: false, wait: true });
  const { closeJobPool } = await import("../../lib/server/jobs");
  await closeJobPool(t.url);
  await t.drop();
}, 60_000);

describe("POST /api/groups/[slug]/jobs", () => {
  it("enqueue by a viewer or reviewer is refused with 403, signed out with 401", async () => {
    expect((await call("viewer", "POST", "", { kind: "refit-series", seriesId: f.seriesId })).status).toBe(403);
    expect((await call("reviewer", "POST", "", { kind: "refit-series", seriesId: f.seriesId })).status).toBe(403);
    expect((await call(null, "POST", "", { kind: "refit-series", seriesId: f.seriesId })).status).toBe(401);
  });

  it("enqueue of another group's series answers 404 and writes nothing", async () => {
    const r = await call("owner", "POST", "", { kind: "refit-series", seriesId: f.seriesId }, {}, other);
    expect(r.status).toBe(404);
    expect((await call("owner", "GET", "", undefined, {}, other)).body.jobs).toEqual([]);
  });

  it("a bad payload answers 422 naming the field", async () => {
    const r = await call("analyst", "POST", "", { kind: "window-scan", analysisId: f.analyses[1]!.analysisId, stepId: "nope" });
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("stepId");
    const k = await call("analyst", "POST", "", { kind: "compile-everything" });
    expect(k.status).toBe(422);
    expect(k.body.field).toBe("kind");
  });

  it("a window scan of a step that is not a fit is refused with 422", async () => {
    const step = await t.db.step.findFirstOrThrow({ where: { revisionId: f.analyses[1]!.revisionId, kind: "derive" } });
    const r = await call("analyst", "POST", "", { kind: "window-scan", analysisId: f.analyses[1]!.analysisId, stepId: step.id });
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("stepId");
  });
});

describe("refit-series and window-scan jobs drained by a worker", () => {
  it("refit-series recomputes every aged open revision and leaves the sealed one untouched", async () => {
    const aged = await ageOpenSteps(t.db, f);
    expect(aged).toBe(8);
    const sealedBefore = await t.db.step.findMany({ where: { revisionId: f.sealed!.revisionId }, orderBy: { position: "asc" } });
    const sealedRevBefore = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: f.sealed!.revisionId } });
    const queued = await call("analyst", "POST", "", { kind: "refit-series", seriesId: f.seriesId });
    expect(queued.status).toBe(202);
    expect(queued.body.job).toMatchObject({ kind: "refit-series", state: "queued", done: 0, total: 3 });
    worker = await startWorker({ url: t.url, name: "in-process", log: () => undefined, pollingIntervalSeconds: 0.5 });
    const job = await waitFor(queued.body.job.id);
    expect(job.state).toBe("done");
    expect(job).toMatchObject({ done: 3, total: 3, completions: 1 });
    expect(job.result).toMatchObject({ analyses: 3, revisionsRecomputed: 2, sealedVerified: 1, sealedProblems: [] });
    const open = await t.db.step.findMany({ where: { revisionId: { in: [f.analyses[1]!.revisionId, f.analyses[2]!.revisionId] } } });
    expect(open.every((s) => s.engineVersion === ENGINE_VERSION && s.inputHash !== "engine-before-upgrade")).toBe(true);
    const sealedAfter = await t.db.step.findMany({ where: { revisionId: f.sealed!.revisionId }, orderBy: { position: "asc" } });
    expect(sealedAfter).toEqual(sealedBefore);
    const sealedRevAfter = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: f.sealed!.revisionId } });
    expect(sealedRevAfter.contentHash).toBe(sealedRevBefore.contentHash);
    expect(sealedRevAfter.state).toBe("sealed");
  }, 120_000);

  it("a second refit of the same series finds everything fresh and rewrites nothing", async () => {
    const before = await t.db.step.findMany({ where: { revisionId: f.analyses[1]!.revisionId }, select: { id: true, computedAt: true } });
    const queued = await call("owner", "POST", "", { kind: "refit-series", seriesId: f.seriesId });
    const job = await waitFor(queued.body.job.id);
    expect(job.result).toMatchObject({ revisionsRecomputed: 0, revisionsAlreadyFresh: 2, sealedVerified: 1 });
    const after = await t.db.step.findMany({ where: { revisionId: f.analyses[1]!.revisionId }, select: { id: true, computedAt: true } });
    expect(after).toEqual(before);
  }, 120_000);

  it("window-scan fits a 30 × 30 grid of one fit step in chunks and reports a plateau", async () => {
    const a = f.analyses[2]!;
    const step = await t.db.step.findFirstOrThrow({ where: { revisionId: a.revisionId, kind: "fit" } });
    const stepBefore = await t.db.step.findUniqueOrThrow({ where: { id: step.id } });
    const queued = await call("analyst", "POST", "", { kind: "window-scan", analysisId: a.analysisId, stepId: step.id, gridSize: 30 });
    expect(queued.status).toBe(202);
    const job = await waitFor(queued.body.job.id);
    expect(job.state).toBe("done");
    expect(job.done).toBe(job.total);
    const r = job.result as { cells: { gamma: number | null; nPoints: number }[]; plateauCells: number; recommended: { gamma: number } | null };
    // 24 invented points: at most 24 distinct edges per axis, and every window holds ≥ 8 points.
    expect(r.cells.length).toBeGreaterThan(50);
    expect(r.cells.every((c) => c.nPoints >= 8)).toBe(true);
    expect(r.plateauCells).toBeGreaterThan(0);
    // The invented curve has no noise: γ = 1.3 mJ mol⁻¹ K⁻² exactly (the fixture's own value).
    expect(r.recommended!.gamma).toBeCloseTo(1.3e-3, 8);
    expect(await t.db.step.findUniqueOrThrow({ where: { id: step.id } })).toEqual(stepBefore);
  }, 120_000);

  it("GET of a job by a member of another group answers 404", async () => {
    const list = await call("viewer", "GET", "");
    expect(list.status).toBe(200);
    const id = list.body.jobs[0].id as string;
    expect((await call("viewer", "GET", `/${id}`, undefined, { id }, other)).status).toBe(404);
  });
});
