/**
 * The review state machine as a pure table. A revision moves
 *
 *   open ──submit──▶ in_review ──approve──▶ sealed ──(a newer revision is approved)──▶ replaced
 *     ▲                 │  │
 *     └────withdraw─────┘  └──return (comment)──▶ returned ──resubmit──▶ in_review
 *
 * `checkTransition` decides one request from the caller's role (the role table in
 * permissions.ts), whether the caller submitted the revision, and the group's self-approval
 * setting. It never throws; the server turns a refusal into ForbiddenError / ConflictError /
 * InputError by its `kind`.
 */
import { can, type Action, type Role } from "../permissions";

export type RevisionState = "open" | "in_review" | "returned" | "sealed" | "replaced";
export type ReviewAction = "submit" | "withdraw" | "return" | "approve" | "resubmit";

export interface TransitionRule {
  action: ReviewAction;
  from: RevisionState;
  to: RevisionState;
  permission: Action;
  /** Only the member who submitted the revision may do it. */
  submitterOnly: boolean;
  /** The submitter may not do it, unless the group allows self-approval. */
  notOwnSubmission: boolean;
  commentRequired: boolean;
  /** Recorded as a ReviewDecision (and noticed to the submitter). */
  decision: boolean;
}

export const TRANSITIONS: readonly TransitionRule[] = [
  { action: "submit", from: "open", to: "in_review", permission: "analysis.submit", submitterOnly: false, notOwnSubmission: false, commentRequired: false, decision: false },
  { action: "withdraw", from: "in_review", to: "open", permission: "analysis.submit", submitterOnly: true, notOwnSubmission: false, commentRequired: false, decision: false },
  { action: "return", from: "in_review", to: "returned", permission: "analysis.review", submitterOnly: false, notOwnSubmission: false, commentRequired: true, decision: true },
  { action: "approve", from: "in_review", to: "sealed", permission: "analysis.review", submitterOnly: false, notOwnSubmission: true, commentRequired: false, decision: true },
  { action: "resubmit", from: "returned", to: "in_review", permission: "analysis.submit", submitterOnly: false, notOwnSubmission: false, commentRequired: false, decision: false },
];

/** The one transition nobody requests: approving a newer revision replaces the sealed one. */
export const SUPERSEDE = { from: "sealed", to: "replaced" } as const;

export const REVIEW_ACTIONS: readonly ReviewAction[] = TRANSITIONS.map((t) => t.action);

export interface TransitionRequest {
  action: ReviewAction;
  state: RevisionState;
  role: Role;
  isSubmitter: boolean;
  allowSelfApproval: boolean;
  comment?: string | null;
}

export type TransitionVerdict =
  | { ok: true; rule: TransitionRule }
  | { ok: false; kind: "forbidden" | "conflict" | "input"; reason: string };

const STATE_WORDS: Record<RevisionState, string> = {
  open: "open for editing",
  in_review: "in review",
  returned: "returned for changes",
  sealed: "sealed",
  replaced: "replaced by a newer revision",
};

/** Decide a request against the table. Order: known action → role → state → who → comment. */
export function checkTransition(req: TransitionRequest): TransitionVerdict {
  const rule = TRANSITIONS.find((t) => t.action === req.action);
  if (!rule) return { ok: false, kind: "input", reason: `invalid action: ${JSON.stringify(req.action)}` };
  if (!can(req.role, rule.permission)) return { ok: false, kind: "forbidden", reason: `a ${req.role} may not ${req.action} (needs ${rule.permission})` };
  if (req.state !== rule.from)
    return { ok: false, kind: "conflict", reason: `cannot ${req.action} a revision that is ${STATE_WORDS[req.state]} (only one that is ${STATE_WORDS[rule.from]})` };
  if (rule.submitterOnly && !req.isSubmitter) return { ok: false, kind: "forbidden", reason: `only the member who submitted it may ${req.action} it` };
  if (rule.notOwnSubmission && req.isSubmitter && !req.allowSelfApproval)
    return { ok: false, kind: "forbidden", reason: "you submitted this revision: another reviewer must approve it (the group does not allow self-approval)" };
  if (rule.commentRequired && !(req.comment ?? "").trim()) return { ok: false, kind: "input", reason: "say what needs changing: a comment is required" };
  return { ok: true, rule };
}

/** The actions a member could take on a revision now (for buttons; the server re-checks). */
export function availableActions(req: Omit<TransitionRequest, "action" | "comment">): ReviewAction[] {
  return REVIEW_ACTIONS.filter((action) => {
    const v = checkTransition({ ...req, action, comment: "x" });
    return v.ok;
  });
}
