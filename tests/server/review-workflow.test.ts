/**
 * Review transitions on a real database: every transition × every role (and the submitter
 * reviewing their own submission), with what each writes — state, version, decision, notices
 * to the right people, an audit event with before/after hashes — and what it refuses.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { reviewTransition, type ReviewAction, type RevisionState } from "../../lib/server/review";
import { updateGroupSettings } from "../../lib/server/groups";
import { memberOf } from "../../lib/server/access";
import { ROLES, type Role } from "../../lib/server/permissions";
import { verifyAuditChain } from "../../lib/server/audit";

let t: TestDatabase;
let f: ReviewFixture;
beforeAll(async () => { t = await freshDatabase(); f = await makeReviewFixture(t.db); });
afterAll(async () => { await t.drop(); });

async function version(revisionId: string): Promise<number> {
  return (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: revisionId } })).version;
}

async function act(role: Role, action: ReviewAction, r: { analysisId: string; revisionId: string }, comment?: string) {
  return reviewTransition(t.db, f.members[role], r.analysisId, r.revisionId, { action, version: await version(r.revisionId), ...(comment !== undefined ? { comment } : {}), ...(action === "approve" ? { ...SIGN, comment: comment || "checked the fit window and residuals" } : {}) });
}

/** A fresh revision brought to `state` the ordinary way (analyst submits, reviewer decides). */
async function revisionIn(state: RevisionState): Promise<{ analysisId: string; revisionId: string }> {
  const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, `in ${state}`);
  if (state === "open") return r;
  await act("analyst", "submit", r);
  if (state === "returned") await act("reviewer", "return", r, "check the window");
  if (state === "sealed") await act("reviewer", "approve", r);
  return r;
}

// action → from-state and the roles that may do it (the submitter is always the analyst here).
const RULES: { action: ReviewAction; from: RevisionState; to: RevisionState; roles: Role[] }[] = [
  { action: "submit", from: "open", to: "in_review", roles: ["owner", "analyst"] },
  { action: "withdraw", from: "in_review", to: "open", roles: ["analyst"] },
  { action: "return", from: "in_review", to: "returned", roles: ["owner", "reviewer"] },
  { action: "approve", from: "in_review", to: "sealed", roles: ["owner", "reviewer"] },
  { action: "resubmit", from: "returned", to: "in_review", roles: ["owner", "analyst"] },
];

describe("reviewTransition, every transition × every role", () => {
  for (const rule of RULES)
    for (const role of ROLES) {
      const may = rule.roles.includes(role);
      it(`reviewTransition ${rule.action} by ${role} from ${rule.from} is ${may ? "allowed" : "refused"}`, async () => {
        const r = await revisionIn(rule.from);
        const before = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
        const audits = await t.db.auditEvent.count();
        const p = act(role, rule.action, r, "please look at the T5 term");
        if (!may) {
          await expect(p).rejects.toMatchObject({ name: "ForbiddenError" });
          const after = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
          expect([after.state, after.version]).toEqual([before.state, before.version]);
          expect(await t.db.auditEvent.count()).toBe(audits);
          return;
        }
        const res = await p;
        const after = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
        expect([res.state, after.state, after.version]).toEqual([rule.to, rule.to, before.version + 1]);
        const ev = await t.db.auditEvent.findFirstOrThrow({ where: { objectId: r.revisionId, action: `revision.${rule.action}` }, orderBy: { id: "desc" } });
        expect(ev.actorId).toBe(f.members[role].userId);
        expect(ev.beforeHash).toMatch(/^[0-9a-f]{64}$/);
        expect(ev.afterHash).toMatch(/^[0-9a-f]{64}$/);
        expect(ev.afterHash).not.toBe(ev.beforeHash);
        const decisions = await t.db.reviewDecision.findMany({ where: { revisionId: r.revisionId, reviewerId: f.members[role].userId } });
        expect(decisions.length).toBe(rule.action === "return" || rule.action === "approve" ? 1 : 0);
        if (rule.action === "approve") expect(after.contentHash).toBe(ev.afterHash);
      });
    }
});

describe("reviewTransition, wrong state and stale version", () => {
  it("reviewTransition of each action from every other state is refused as a conflict", async () => {
    const all: RevisionState[] = ["open", "in_review", "returned", "sealed"];
    const revs = Object.fromEntries(await Promise.all(all.map(async (s) => [s, await revisionIn(s)] as const)));
    for (const rule of RULES)
      for (const s of all.filter((s) => s !== rule.from)) {
        const role = rule.action === "withdraw" ? "analyst" : rule.roles[rule.roles.length - 1]!;
        await expect(act(role, rule.action, revs[s]!, "x"), `${rule.action} from ${s}`).rejects.toMatchObject({ name: "ConflictError" });
      }
  });

  it("reviewTransition with a version older than the revision's is refused and changes nothing", async () => {
    const r = await revisionIn("open");
    const v = await version(r.revisionId);
    await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: v });
    await expect(reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: v, ...SIGN, comment: "ok" })).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/changed meanwhile/) });
    expect((await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).state).toBe("in_review");
  });

  it("reviewTransition return without a comment is refused naming the comment field", async () => {
    const r = await revisionIn("in_review");
    await expect(act("reviewer", "return", r, "  ")).rejects.toMatchObject({ name: "InputError", field: "comment" });
  });

  it("reviewTransition withdraw by an analyst who did not submit is refused", async () => {
    const r = await revisionIn("open");
    await act("owner", "submit", r);
    await expect(act("analyst", "withdraw", r)).rejects.toMatchObject({ name: "ForbiddenError", message: expect.stringMatching(/only the member who submitted/) });
    expect((await act("owner", "withdraw", r)).state).toBe("open");
  });

  it("reviewTransition on another group's revision is not found", async () => {
    const r = await revisionIn("in_review");
    const other = await makeReviewFixture(t.db);
    await expect(reviewTransition(t.db, other.members.owner, r.analysisId, r.revisionId, { action: "approve", version: 2, ...SIGN, comment: "ok" })).rejects.toMatchObject({ name: "NotFoundError" });
  });

  it("reviewTransition submit of a chain with a failing step is refused naming the step", async () => {
    const r = await revisionIn("open");
    await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, [{ id: "", kind: "data", config: { measurementIds: [f.measurementId], tMinK: 50 } }]);
    await expect(act("analyst", "submit", r)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/step 1 \(data\) failed: no points are left/) });
  });
});

describe("reviewTransition, the submitter as reviewer", () => {
  it("reviewTransition approve by the owner of their own submission is refused unless the group allows self-approval", async () => {
    const r = await revisionIn("open");
    await act("owner", "submit", r);
    await expect(act("owner", "approve", r)).rejects.toMatchObject({ name: "ForbiddenError", message: expect.stringMatching(/self-approval/) });
    await expect(updateGroupSettings(t.db, f.members.reviewer, { allowSelfApproval: true })).rejects.toMatchObject({ name: "ForbiddenError" });
    await updateGroupSettings(t.db, f.members.owner, { allowSelfApproval: true });
    try {
      const owner = await memberOf(t.db, f.members.owner.userId, f.slug);
      const res = await reviewTransition(t.db, owner, r.analysisId, r.revisionId, { action: "approve", version: await version(r.revisionId), ...SIGN, comment: "ok" });
      expect(res.state).toBe("sealed");
    } finally {
      await updateGroupSettings(t.db, f.members.owner, { allowSelfApproval: false });
    }
  });
});

describe("reviewTransition notices", () => {
  it("submit notices every reviewer and owner but not the submitter; return and approve notice the submitter", async () => {
    const r = await revisionIn("open");
    const since = new Date();
    await act("analyst", "submit", r);
    const requested = await t.db.notice.findMany({ where: { kind: "review.requested", createdAt: { gte: since }, link: { contains: r.revisionId } } });
    expect(requested.map((n) => n.userId).sort()).toEqual([f.members.owner.userId, f.members.reviewer.userId].sort());
    await act("reviewer", "return", r, "fit window reaches past Θ_D/15");
    const returned = await t.db.notice.findMany({ where: { kind: "review.returned", link: { contains: r.revisionId } } });
    expect(returned.map((n) => n.userId)).toEqual([f.members.analyst.userId]);
    expect(returned[0]!.message).toMatch(/Θ_D\/15/);
    await act("analyst", "resubmit", r);
    await act("owner", "approve", r);
    const approved = await t.db.notice.findMany({ where: { kind: "review.approved", link: { contains: r.revisionId } } });
    expect(approved.map((n) => n.userId)).toEqual([f.members.analyst.userId]);
  });

  it("the audit chain verifies after all these transitions", async () => {
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: true, firstBrokenId: null });
  });
});
