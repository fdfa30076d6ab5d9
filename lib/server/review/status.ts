/**
 * The review picture of one analysis for its page: every revision with its state, submitter,
 * seal (hash, reviewer, time), decisions, and the review actions the caller may take now.
 */
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import { authorise, type Member } from "../access";
import { can } from "../permissions";
import { uuidOrNone } from "../samples";
import { availableActions, type ReviewAction, type RevisionState } from "./states";
import type { SealSignature } from "./signature";
import type { RevisionSnapshot } from "./snapshot";
import { pinnedContext } from "./context";

export interface ReviewStatus {
  analysisId: string;
  title: string;
  allowSelfApproval: boolean;
  canRevise: boolean;
  revisions: {
    id: string;
    number: number;
    state: RevisionState;
    version: number;
    basedOnId: string | null;
    submittedBy: { id: string; name: string } | null;
    submittedAt: string | null;
    seal: { contentHash: string; sealedBy: { id: string; name: string } | null; sealedAt: string; signature: SealSignature | null; contextNote: string | null } | null;
    decisions: { decision: string; comment: string; reviewer: { id: string; name: string } | null; at: string }[];
    actions: ReviewAction[];
  }[];
}

/** The signature and the context note as the snapshot holds them (shown beside the seal; Verify checks the snapshot). */
function sealFacts(snapshot: unknown): { signature: SealSignature | null; contextNote: string | null } {
  const s = snapshot as RevisionSnapshot | null;
  if (!s?.inputs) return { signature: null, contextNote: null };
  return { signature: s.signature ?? null, contextNote: pinnedContext(s).note };
}

export async function reviewStatus(db: Db, member: Member, analysisId: string): Promise<ReviewStatus> {
  authorise(member, "group.read");
  const a = await db.analysis.findFirst({
    where: { id: uuidOrNone(analysisId), groupId: member.group.id },
    include: { revisions: { orderBy: { number: "desc" }, include: { decisions: { orderBy: { at: "asc" } } } } },
  });
  if (!a) throw new NotFoundError("analysis");
  const ids = new Set<string>();
  for (const r of a.revisions) {
    if (r.submittedById) ids.add(r.submittedById);
    if (r.sealedById) ids.add(r.sealedById);
    for (const d of r.decisions) ids.add(d.reviewerId);
  }
  const users = new Map((await db.user.findMany({ where: { id: { in: [...ids] } }, select: { id: true, name: true } })).map((u) => [u.id, u]));
  const user = (id: string | null) => (id ? (users.get(id) ?? { id, name: "former member" }) : null);
  const hasDraft = a.revisions.some((r) => r.state === "open" || r.state === "in_review" || r.state === "returned");
  return {
    analysisId: a.id, title: a.title, allowSelfApproval: member.group.allowSelfApproval,
    canRevise: can(member.role, "analysis.write") && !hasDraft && a.revisions.some((r) => r.state === "sealed"),
    revisions: a.revisions.map((r) => ({
      id: r.id, number: r.number, state: r.state, version: r.version, basedOnId: r.basedOnId,
      submittedBy: user(r.submittedById), submittedAt: r.submittedAt?.toISOString() ?? null,
      seal: r.contentHash && r.sealedAt ? { contentHash: r.contentHash, sealedBy: user(r.sealedById), sealedAt: r.sealedAt.toISOString(), ...sealFacts(r.snapshot) } : null,
      decisions: r.decisions.map((d) => ({ decision: d.decision, comment: d.comment, reviewer: user(d.reviewerId), at: d.at.toISOString() })),
      actions: availableActions({ state: r.state, role: member.role, isSubmitter: r.submittedById === member.userId, allowSelfApproval: member.group.allowSelfApproval }),
    })),
  };
}
