/**
 * Revising a sealed analysis: a new open revision based on the sealed one with its steps
 * copied; approving it replaces the old one (kept, immutable); the diff names the changed
 * configuration fields and how γ, β, Θ_D moved with their uncertainties.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { diffRevisions, reviewTransition, reviseSealed, reviewStatus, verifyRevision, awaitingMyReview, sentBackToMe, type ReviewAction } from "../../lib/server/review";
import { updateStep } from "../../lib/server/notebook";
import type { Role } from "../../lib/server/permissions";

let t: TestDatabase;
let f: ReviewFixture;
let first: { analysisId: string; revisionId: string };
let second: { revisionId: string };

async function act(role: Role, action: ReviewAction, r: { analysisId: string; revisionId: string }, comment?: string) {
  const v = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).version;
  return reviewTransition(t.db, f.members[role], r.analysisId, r.revisionId, { action, version: v, ...(comment ? { comment } : {}), ...(action === "approve" ? { ...SIGN, comment: comment ?? "checked the fit window and residuals" } : {}) });
}

beforeAll(async () => {
  t = await freshDatabase();
  f = await makeReviewFixture(t.db);
  first = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "series member");
  await writeSteps(t.db, f.groupId, f.sampleId, first.revisionId, fullChain(f.measurementId, 6));
  await act("analyst", "submit", first);
  await act("reviewer", "approve", first);
});
afterAll(async () => { await t.drop(); });

describe("reviseSealed", () => {
  it("reviseSealed creates revision 2, open, based on the sealed one, with the steps copied and computed", async () => {
    const n = await reviseSealed(t.db, f.members.analyst, first.analysisId);
    second = n;
    expect(n).toMatchObject({ number: 2, basedOnId: first.revisionId, steps: 4 });
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: n.revisionId }, include: { steps: { orderBy: { position: "asc" } } } });
    const old = await t.db.step.findMany({ where: { revisionId: first.revisionId }, orderBy: { position: "asc" } });
    expect(rev.state).toBe("open");
    expect(rev.steps.map((s) => [s.kind, s.config])).toEqual(old.map((s) => [s.kind, s.config]));
    expect(rev.steps.every((s) => s.output !== null && (s.output as { ok: boolean }).ok)).toBe(true);
    expect(rev.steps.map((s) => s.inputHash)).toEqual(old.map((s) => s.inputHash));
  });

  it("reviseSealed while revision 2 is still open is refused; a reviewer may not revise", async () => {
    await expect(reviseSealed(t.db, f.members.owner, first.analysisId)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/revision 2/) });
    await expect(reviseSealed(t.db, f.members.reviewer, first.analysisId)).rejects.toMatchObject({ name: "ForbiddenError" });
  });

  it("reviseSealed of an analysis with no sealed revision is refused", async () => {
    const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "never sealed");
    await expect(reviseSealed(t.db, f.members.analyst, r.analysisId)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/still being edited/) });
  });
});

describe("queues through a return and a fix", () => {
  it("awaitingMyReview lists the submitted revision 2 for the reviewer, not the analyst who submitted it; sentBackToMe shows the return", async () => {
    const step = await t.db.step.findFirstOrThrow({ where: { revisionId: second.revisionId, kind: "fit" } });
    await updateStep(t.db, f.members.analyst, first.analysisId, step.id, { version: step.version, config: { model: "sommerfeld", tMaxK: 7.5, compare: [] } });
    const r = { analysisId: first.analysisId, revisionId: second.revisionId };
    await act("analyst", "submit", r);
    expect((await awaitingMyReview(t.db, f.members.reviewer.userId)).map((q) => q.revisionId)).toContain(second.revisionId);
    expect((await awaitingMyReview(t.db, f.members.analyst.userId)).length).toBe(0);
    expect((await awaitingMyReview(t.db, f.members.viewer.userId)).length).toBe(0);
    await act("reviewer", "return", r, "extend the window to 7.5 K only with the T5 term");
    const back = await sentBackToMe(t.db, f.members.analyst.userId, f.groupId);
    expect(back).toEqual([expect.objectContaining({ revisionId: second.revisionId, comment: "extend the window to 7.5 K only with the T5 term", number: 2 })]);
    expect((await awaitingMyReview(t.db, f.members.reviewer.userId)).map((q) => q.revisionId)).not.toContain(second.revisionId);
  });

  it("approving revision 2 marks revision 1 replaced, kept and still verifiable", async () => {
    const r = { analysisId: first.analysisId, revisionId: second.revisionId };
    await act("analyst", "resubmit", r);
    const res = await act("reviewer", "approve", r);
    expect(res.replacedRevisionIds).toEqual([first.revisionId]);
    const old = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: first.revisionId } });
    expect(old.state).toBe("replaced");
    expect((await verifyRevision(t.db, f.members.viewer, first.analysisId, first.revisionId)).ok).toBe(true);
    const ev = await t.db.auditEvent.findFirstOrThrow({ where: { objectId: first.revisionId, action: "revision.replace" } });
    expect(ev.detail).toMatchObject({ replacedBy: second.revisionId });
    const status = await reviewStatus(t.db, f.members.analyst, first.analysisId);
    expect(status.revisions.map((x) => [x.number, x.state])).toEqual([[2, "sealed"], [1, "replaced"]]);
    expect(status.canRevise).toBe(true);
  });
});

describe("diffRevisions", () => {
  it("diffRevisions names the changed fit window and moves γ, β and Θ_D with their uncertainties", async () => {
    const d = await diffRevisions(t.db, f.members.viewer, first.revisionId, second.revisionId);
    expect(d.a.number).toBe(1);
    expect(d.b.number).toBe(2);
    const fit = d.steps.find((s) => s.kind === "fit")!;
    expect(fit.status).toBe("changed");
    expect(fit.changes).toEqual([{ path: "tMaxK", from: 6, to: 7.5 }]);
    expect(d.steps.filter((s) => s.kind !== "fit").every((s) => s.status === "unchanged")).toBe(true);
    const gamma = d.results.find((r) => r.key === "fit#1:gamma")!;
    expect(gamma.from!.stdError).toBeGreaterThan(0);
    expect(gamma.to!.stdError).toBeGreaterThan(0);
    // the invented curve is exactly γT + βT³ (to 8 digits), so γ barely moves: far below 1σ
    expect(Math.abs(gamma.change!)).toBeLessThan(gamma.from!.stdError!);
    expect(Math.abs(gamma.to!.value - 1.3e-3)).toBeLessThan(1e-7); // 1.3 mJ mol⁻¹ K⁻² in SI, invented
    const theta = d.results.find((r) => r.key === "derive#1:thetaD")!;
    expect(theta.unit).toBe("K");
    expect(theta.from!.value).toBeGreaterThan(0);
    expect(d.results.find((r) => r.key === "derive#1:gamma")!.unit).toBe("mJ mol^-1 K^-2");
  });

  it("diffRevisions of revisions of different analyses is refused", async () => {
    const other = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "other");
    await expect(diffRevisions(t.db, f.members.viewer, first.revisionId, other.revisionId)).rejects.toMatchObject({ name: "InputError" });
  });
});
