/**
 * The review state machine (pure table), exhaustively: every action × every state × every role
 * × submitter or not × self-approval on or off (400 requests), against the rules written out
 * independently below from the product brief.
 */
import { describe, it, expect } from "vitest";
import { availableActions, checkTransition, REVIEW_ACTIONS, type ReviewAction, type RevisionState } from "../../lib/server/review";
import { ROLES, type Role } from "../../lib/server/permissions";

const STATES: RevisionState[] = ["open", "in_review", "returned", "sealed", "replaced"];

// The allowed requests: action, from-state, roles, submitter ("*" either, "yes", "no"), self-approval ("*", "on").
const ALLOWED: [ReviewAction, RevisionState, Role[], "*" | "yes" | "no", "*" | "on"][] = [
  ["submit", "open", ["owner", "analyst"], "*", "*"],
  ["resubmit", "returned", ["owner", "analyst"], "*", "*"],
  ["withdraw", "in_review", ["owner", "analyst"], "yes", "*"],
  ["return", "in_review", ["owner", "reviewer"], "*", "*"],
  ["approve", "in_review", ["owner", "reviewer"], "no", "*"],
  ["approve", "in_review", ["owner", "reviewer"], "yes", "on"],
];
const TARGET: Record<ReviewAction, RevisionState> = { submit: "in_review", resubmit: "in_review", withdraw: "open", return: "returned", approve: "sealed" };

function allowed(action: ReviewAction, state: RevisionState, role: Role, isSubmitter: boolean, self: boolean): boolean {
  return ALLOWED.some(([a, s, roles, sub, sa]) => a === action && s === state && roles.includes(role) && (sub === "*" || (sub === "yes") === isSubmitter) && (sa === "*" || self));
}

describe("checkTransition", () => {
  const cases = REVIEW_ACTIONS.flatMap((action) => STATES.flatMap((state) => ROLES.flatMap((role) => [true, false].flatMap((isSubmitter) => [true, false].map((self) => ({ action, state, role, isSubmitter, self }))))));

  it("checkTransition over all 400 requests allows exactly the brief's transitions and moves to the right state", () => {
    expect(cases.length).toBe(400);
    let allowedCount = 0;
    for (const c of cases) {
      const v = checkTransition({ action: c.action, state: c.state, role: c.role, isSubmitter: c.isSubmitter, allowSelfApproval: c.self, comment: "please recheck the window" });
      const want = allowed(c.action, c.state, c.role, c.isSubmitter, c.self);
      expect(v.ok, JSON.stringify(c)).toBe(want);
      if (v.ok) { allowedCount++; expect(v.rule.to, JSON.stringify(c)).toBe(TARGET[c.action]); }
    }
    // submit 2 roles × 4, resubmit 2 × 4, withdraw 2 × 2, return 2 × 4, approve 2 × 2 + 2 × 1
    expect(allowedCount).toBe(8 + 8 + 4 + 8 + 6);
  });

  it("checkTransition refuses a role without the permission as forbidden, before looking at the state", () => {
    for (const c of cases.filter((c) => !allowed(c.action, c.state, c.role, c.isSubmitter, c.self))) {
      const v = checkTransition({ action: c.action, state: c.state, role: c.role, isSubmitter: c.isSubmitter, allowSelfApproval: c.self, comment: "x" });
      const roleOk = ALLOWED.some(([a, , roles]) => a === c.action && roles.includes(c.role));
      if (!roleOk) expect(v, JSON.stringify(c)).toMatchObject({ ok: false, kind: "forbidden" });
      else if (!ALLOWED.some(([a, s]) => a === c.action && s === c.state)) expect(v, JSON.stringify(c)).toMatchObject({ ok: false, kind: "conflict" });
      else expect(v, JSON.stringify(c)).toMatchObject({ ok: false, kind: "forbidden" });
    }
  });

  it("checkTransition return without a comment (or only spaces) is refused as input", () => {
    for (const comment of [undefined, null, "", "   "])
      expect(checkTransition({ action: "return", state: "in_review", role: "reviewer", isSubmitter: false, allowSelfApproval: false, comment })).toMatchObject({ ok: false, kind: "input" });
  });

  it("checkTransition approve by the submitter names self-approval in its reason", () => {
    const v = checkTransition({ action: "approve", state: "in_review", role: "owner", isSubmitter: true, allowSelfApproval: false });
    expect(v).toMatchObject({ ok: false, kind: "forbidden", reason: expect.stringMatching(/self-approval/) });
  });

  it("checkTransition never lets a request touch a sealed or replaced revision", () => {
    for (const c of cases.filter((c) => c.state === "sealed" || c.state === "replaced"))
      expect(checkTransition({ action: c.action, state: c.state, role: c.role, isSubmitter: c.isSubmitter, allowSelfApproval: c.self, comment: "x" }).ok).toBe(false);
  });

  it("availableActions lists what a member may do now", () => {
    expect(availableActions({ state: "in_review", role: "owner", isSubmitter: true, allowSelfApproval: false })).toEqual(["withdraw", "return"]);
    expect(availableActions({ state: "in_review", role: "reviewer", isSubmitter: false, allowSelfApproval: false })).toEqual(["return", "approve"]);
    expect(availableActions({ state: "open", role: "viewer", isSubmitter: false, allowSelfApproval: true })).toEqual([]);
    expect(availableActions({ state: "returned", role: "analyst", isSubmitter: true, allowSelfApproval: false })).toEqual(["resubmit"]);
  });
});
