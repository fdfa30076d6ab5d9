/**
 * The review, notices and audit route handlers, called as Next calls them with a signed-in user
 * (next-auth's session mocked): the whole flow analyst submits → reviewer returns → analyst
 * resubmits → reviewer approves → verify → revise → diff, and every write route refusing to
 * touch the sealed revision (409), plus owner-only audit routes.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import type { Role } from "../../lib/server/permissions";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as review from "../../app/api/groups/[slug]/analyses/[id]/review/route";
import * as revise from "../../app/api/groups/[slug]/analyses/[id]/review/revise/route";
import * as verify from "../../app/api/groups/[slug]/analyses/[id]/review/verify/route";
import * as diff from "../../app/api/groups/[slug]/analyses/[id]/review/diff/route";
import * as notices from "../../app/api/groups/[slug]/notices/route";
import * as notice from "../../app/api/groups/[slug]/notices/[id]/route";
import * as queue from "../../app/api/groups/[slug]/notices/queue/route";
import * as auditVerify from "../../app/api/groups/[slug]/audit/verify/route";
import * as audit from "../../app/api/groups/[slug]/audit/route";
import * as steps from "../../app/api/groups/[slug]/analyses/[id]/steps/route";
import * as step from "../../app/api/groups/[slug]/analyses/[id]/steps/[stepId]/route";

type Handler = (req: Request, ctx: { params: Promise<any> }) => Promise<Response>;

let t: TestDatabase;
let f: ReviewFixture;
let r: { analysisId: string; revisionId: string };

async function call(as: Role | null, handler: Handler, params: Record<string, string>, opts: { method?: string; json?: unknown; query?: string } = {}) {
  session.userId = as ? f.members[as].userId : null;
  const method = opts.method ?? (opts.json !== undefined ? "POST" : "GET");
  const req = new Request(`http://localhost/api/x${opts.query ?? ""}`, { method, headers: { "content-type": "application/json" }, ...(opts.json !== undefined ? { body: JSON.stringify(opts.json) } : {}) });
  const res = await handler(req, { params: Promise.resolve({ slug: f.slug, ...params }) });
  return { status: res.status, body: (await res.json()) as any };
}

async function act(as: Role, action: string, comment?: string) {
  const v = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).version;
  return call(as, review.POST, { id: r.analysisId }, { json: { revisionId: r.revisionId, action, version: v, ...(comment ? { comment } : {}), ...(action === "approve" ? { ...SIGN, comment: comment ?? "checked the fit window and residuals" } : {}) } });
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeReviewFixture(t.db);
  r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "route flow");
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
});
afterAll(async () => { await t.drop(); });

describe("review routes, the whole flow", () => {
  it("POST review without a session is 401, by a viewer 403, with a bad action 422", async () => {
    expect((await call(null, review.POST, { id: r.analysisId }, { json: { revisionId: r.revisionId, action: "submit", version: 1 } })).status).toBe(401);
    expect((await act("viewer", "submit")).status).toBe(403);
    expect((await act("analyst", "seal")).status).toBe(422);
  });

  it("analyst submits, reviewer asks for changes, analyst resubmits, reviewer approves", async () => {
    expect((await act("analyst", "submit")).body.transition.state).toBe("in_review");
    const q = await call("reviewer", queue.GET, {});
    expect(q.body.awaitingMyReview.map((x: any) => x.revisionId)).toEqual([r.revisionId]);
    expect((await act("reviewer", "return")).status).toBe(422);
    expect((await act("reviewer", "return", "show the T5 comparison")).body.transition.state).toBe("returned");
    const back = await call("analyst", queue.GET, {});
    expect(back.body.sentBackToMe[0]).toMatchObject({ revisionId: r.revisionId, comment: "show the T5 comparison" });
    expect((await act("analyst", "resubmit")).body.transition.state).toBe("in_review");
    const ok = await act("reviewer", "approve");
    expect(ok.status).toBe(200);
    expect(ok.body.transition).toMatchObject({ state: "sealed", contentHash: expect.stringMatching(/^[0-9a-f]{64}$/) });
  });

  it("GET review shows the seal with hash, reviewer and time, and no actions left", async () => {
    const s = await call("viewer", review.GET, { id: r.analysisId });
    const rev = s.body.review.revisions[0];
    expect(rev.state).toBe("sealed");
    expect(rev.seal).toMatchObject({ contentHash: expect.stringMatching(/^[0-9a-f]{64}$/), sealedBy: { id: f.members.reviewer.userId } });
    expect(rev.actions).toEqual([]);
    expect(rev.decisions.map((d: any) => d.decision)).toEqual(["returned", "approved"]);
  });

  it("GET verify passes for the sealed revision and says so per step", async () => {
    const v = await call("viewer", verify.GET, { id: r.analysisId }, { query: `?revision=${r.revisionId}` });
    expect(v.status).toBe(200);
    expect(v.body.verification.ok).toBe(true);
    expect(v.body.verification.steps.map((s: any) => s.outcome)).toEqual(["identical", "identical", "identical", "identical"]);
    expect((await call("viewer", verify.GET, { id: r.analysisId })).status).toBe(422);
  });

  it("every write route refuses to change the sealed revision (409) and the steps stay as sealed", async () => {
    const before = await t.db.step.findMany({ where: { revisionId: r.revisionId }, orderBy: { position: "asc" } });
    const fit = before.find((s) => s.kind === "fit")!;
    const rv = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).version;
    expect((await call("owner", step.PATCH, { id: r.analysisId, stepId: fit.id }, { method: "PATCH", json: { version: fit.version, config: { model: "sommerfeld", tMaxK: 9 } } })).status).toBe(409);
    expect((await call("owner", step.DELETE, { id: r.analysisId, stepId: fit.id }, { method: "DELETE", query: `?revisionVersion=${rv}` })).status).toBe(409);
    expect((await call("owner", step.POST, { id: r.analysisId, stepId: fit.id }, { json: { action: "move", position: 0, revisionVersion: rv } })).status).toBe(409);
    expect((await call("owner", steps.POST, { id: r.analysisId }, { json: { revisionId: r.revisionId, revisionVersion: rv, kind: "note" } })).status).toBe(409);
    for (const action of ["submit", "withdraw", "return", "approve", "resubmit"]) expect((await act("owner", action, "x")).status, action).toBe(409);
    const after = await t.db.step.findMany({ where: { revisionId: r.revisionId }, orderBy: { position: "asc" } });
    expect(after).toEqual(before);
  });

  it("POST revise makes revision 2; GET diff from 1 to 2 lists four unchanged steps", async () => {
    expect((await call("reviewer", revise.POST, { id: r.analysisId }, { json: {} })).status).toBe(403);
    const n = await call("analyst", revise.POST, { id: r.analysisId }, { json: {} });
    expect(n.status).toBe(201);
    expect(n.body.revision).toMatchObject({ number: 2, basedOnId: r.revisionId });
    expect((await call("analyst", revise.POST, { id: r.analysisId }, { json: {} })).status).toBe(409);
    const d = await call("viewer", diff.GET, { id: r.analysisId }, { query: `?a=${r.revisionId}&b=${n.body.revision.revisionId}` });
    expect(d.status).toBe(200);
    expect(d.body.diff.steps.map((s: any) => s.status)).toEqual(["unchanged", "unchanged", "unchanged", "unchanged"]);
    expect(d.body.diff.results.find((x: any) => x.key === "fit#1:gamma").change).toBe(0);
    const other = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "other");
    expect((await call("viewer", diff.GET, { id: other.analysisId }, { query: `?a=${r.revisionId}&b=${n.body.revision.revisionId}` })).status).toBe(404);
  });
});

describe("notice routes", () => {
  it("GET notices lists mine with an unread count; PATCH marks one read and unread; POST read-all clears them", async () => {
    const mine = await call("analyst", notices.GET, {});
    expect(mine.body.notices.map((n: any) => n.kind)).toEqual(expect.arrayContaining(["review.returned", "review.approved"]));
    expect(mine.body.unread).toBe(mine.body.notices.length);
    const id = mine.body.notices[0].id;
    expect((await call("analyst", notice.PATCH, { id }, { method: "PATCH", json: { read: true } })).body.notice.read).toBe(true);
    expect((await call("analyst", notices.GET, {}, { query: "?unread=1" })).body.notices.map((n: any) => n.id)).not.toContain(id);
    expect((await call("analyst", notice.PATCH, { id }, { method: "PATCH", json: { read: false } })).body.notice.read).toBe(false);
    expect((await call("reviewer", notice.PATCH, { id }, { method: "PATCH", json: { read: true } })).status).toBe(404);
    expect((await call("analyst", notices.POST, {}, { json: { action: "read-all" } })).body.marked).toBe(mine.body.notices.length);
    expect((await call("analyst", notices.GET, {})).body.unread).toBe(0);
  });
});

describe("audit routes", () => {
  it("GET audit/verify is for owners only and reports an intact chain", async () => {
    for (const role of ["analyst", "reviewer", "viewer"] as const) expect((await call(role, auditVerify.GET, {})).status).toBe(403);
    const v = await call("owner", auditVerify.GET, {});
    expect(v.body.chain).toMatchObject({ ok: true, firstBrokenId: null });
    expect(v.body.chain.checked).toBeGreaterThan(5);
  });

  it("GET audit lists the group's events newest first for owners, with the review actions", async () => {
    expect((await call("viewer", audit.GET, {})).status).toBe(403);
    const a = await call("owner", audit.GET, {}, { query: "?take=50" });
    const actions = a.body.events.map((e: any) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["revision.submit", "revision.return", "revision.resubmit", "revision.approve", "revision.revise"]));
    const ids = a.body.events.map((e: any) => Number(e.id));
    expect(ids).toEqual([...ids].sort((x, y) => y - x));
  });
});
