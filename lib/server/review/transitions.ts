/**
 * Review transitions on the server: submit, withdraw, return (ask for changes), approve,
 * resubmit. Each one, in one transaction: locks the revision row (FOR UPDATE), checks the
 * caller's expected version (optimistic concurrency), decides by the pure table in states.ts,
 * writes the new state, a ReviewDecision (return, approve), notices, and an audit event with
 * before/after hashes. Approval also seals (snapshot + content hash) and replaces the
 * analysis's previously sealed revision.
 *
 * Approval is a signature (signature.ts): it needs a meaning, a note (the comment), the
 * signer's password (or a fresh institutional sign-in) checked in the same request before any
 * write, and every open discussion thread of the analysis resolved or acknowledged by id. The
 * signature is sealed into the snapshot and recorded in the audit event.
 */
import { z } from "zod";
import type { Db } from "../db/client";
import { ConflictError, ForbiddenError, InputError, NotFoundError } from "../../engine/errors";
import { recordAudit } from "../audit";
import type { Member } from "../access";
import { can } from "../permissions";
import { parseInput } from "../validate";
import { contentHash } from "../hash";
import { uuidOrNone } from "../samples";
import { computeRevisionSteps } from "../notebook/compute";
import { notify } from "../notebook/events";
import { inputHashes, loadContext } from "../notebook/context";
import type { StepSpec } from "../../engine/notebook";
import { checkTransition, REVIEW_ACTIONS, type ReviewAction, type RevisionState, type TransitionRule } from "./states";
import { buildSnapshot, readinessProblems } from "./snapshot";
import { checkSignerIdentity, MEANING_KEYS, openThreads, requireAcknowledged, SIGNATURE_MEANINGS, type SealSignature, type SignerSession } from "./signature";
import { sendNotices, type Tx } from "./notices";
import { supersedeSealed } from "./supersede";
import { lockViolation } from "./lockError";

export const transitionSchema = z.object({
  action: z.enum(REVIEW_ACTIONS as [ReviewAction, ...ReviewAction[]]),
  /** The revision version the caller saw; a newer one means someone else acted first. */
  version: z.number().int().positive(),
  comment: z.string().max(20_000).optional(),
  /** approve: what the signature means (signature.ts SIGNATURE_MEANINGS). */
  meaning: z.enum(MEANING_KEYS).optional(),
  /** approve: the signer's password, checked before anything is written; never stored. */
  password: z.string().max(200).optional(),
  /** approve: the open threads the signer acknowledges. */
  acknowledgedThreadIds: z.array(z.string().max(64)).max(500).default([]),
});

export interface TransitionResult {
  revisionId: string;
  number: number;
  from: RevisionState;
  state: RevisionState;
  version: number;
  contentHash: string | null;
  decisionId: string | null;
  replacedRevisionIds: string[];
}

interface LockedRow {
  id: string;
  number: number;
  state: RevisionState;
  version: number;
  basedOnId: string | null;
  submittedById: string | null;
  submittedAt: Date | null;
}

async function lockRevision(tx: Tx, id: string): Promise<LockedRow> {
  const rows = await tx.$queryRaw<LockedRow[]>`SELECT id::text AS id, number, state::text AS state, version, "basedOnId"::text AS "basedOnId", "submittedById"::text AS "submittedById", "submittedAt" FROM "AnalysisRevision" WHERE id = ${id}::uuid FOR UPDATE`;
  if (!rows[0]) throw new NotFoundError("revision");
  return rows[0];
}

/** Hash of what a state change is about: the revision's state and version and its chain of steps. */
async function stateHash(tx: Tx, rev: { id: string; state: string; version: number }): Promise<string> {
  const steps = await tx.step.findMany({ where: { revisionId: rev.id }, orderBy: { position: "asc" }, select: { id: true, position: true, kind: true, config: true, inputHash: true } });
  return contentHash({ revisionId: rev.id, state: rev.state, version: rev.version, steps });
}

function refuse(kind: "forbidden" | "conflict" | "input", reason: string): never {
  if (kind === "forbidden") throw new ForbiddenError(reason);
  if (kind === "conflict") throw new ConflictError(reason);
  throw new InputError(reason, { field: reason.includes("comment") ? "comment" : "action" });
}

async function reviewers(tx: Tx, groupId: string): Promise<string[]> {
  const ms = await tx.membership.findMany({ where: { groupId }, select: { userId: true, role: true } });
  return ms.filter((m) => can(m.role, "analysis.review")).map((m) => m.userId);
}

/** Submitting needs a chain that computes: no step stale or failed. */
async function checkSubmittable(tx: Tx, groupId: string, sampleId: string, rev: LockedRow): Promise<void> {
  const rows = await tx.step.findMany({ where: { revisionId: rev.id }, orderBy: { position: "asc" } });
  const specs: StepSpec[] = rows.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  const ctx = await loadContext(tx as unknown as Db, groupId, sampleId, specs);
  const problems = readinessProblems(rows, inputHashes(specs, ctx));
  if (problems.length) throw new ConflictError(`cannot submit revision ${rev.number}: ${problems.join("; ")}`, { problems });
}

/**
 * Apply one review action to a revision of an analysis in the member's group.
 * Throws NotFoundError (not in the group), ForbiddenError (role, own submission),
 * ConflictError (wrong state, stale version, stale or failed steps), InputError (bad payload,
 * missing comment).
 */
export async function reviewTransition(db: Db, member: Member, analysisId: string, revisionId: string, input: unknown, session: SignerSession = {}): Promise<TransitionResult> {
  const req = parseInput(transitionSchema, input);
  const found = await db.analysisRevision.findFirst({ where: { id: uuidOrNone(revisionId), analysisId: uuidOrNone(analysisId), analysis: { groupId: member.group.id } }, include: { analysis: true } });
  if (!found) throw new NotFoundError("revision");
  const a = found.analysis;
  // Early answer before any work; the self-approval setting is re-read under the row lock below.
  const pre = checkTransition({ action: req.action, state: found.state, role: member.role, isSubmitter: found.submittedById === member.userId, allowSelfApproval: true, comment: req.comment ?? null });
  if (!pre.ok) refuse(pre.kind, pre.reason);
  let signer: Awaited<ReturnType<typeof checkSignerIdentity>> | null = null;
  if (req.action === "approve") {
    if (!req.meaning) throw new InputError(`choose what your approval means (${MEANING_KEYS.join(" or ")})`, { field: "meaning" });
    if (!req.comment?.trim()) throw new InputError("write a note: approving needs one (what you checked, anything the reader should know)", { field: "comment" });
    signer = await checkSignerIdentity(db, member, req.password, session);
  }
  // Fresh outputs for the reviewer: recompute stale steps before the revision freezes.
  if (req.action === "submit" || req.action === "resubmit") await computeRevisionSteps(db, member.group.id, a.sampleId, found.id, "edit");
  return db.$transaction(async (tx) => {
    const rev = await lockRevision(tx, found.id);
    if (rev.version !== req.version) throw new ConflictError(`revision ${rev.number} changed meanwhile (version ${rev.version}, you saw ${req.version}); reload it`, { state: rev.state, version: rev.version });
    const group = await tx.group.findUniqueOrThrow({ where: { id: member.group.id }, select: { allowSelfApproval: true, slug: true } });
    const verdict = checkTransition({ action: req.action, state: rev.state, role: member.role, isSubmitter: rev.submittedById === member.userId, allowSelfApproval: group.allowSelfApproval, comment: req.comment ?? null });
    if (!verdict.ok) refuse(verdict.kind, verdict.reason);
    const rule = verdict.rule;
    const beforeHash = await stateHash(tx, rev);
    const now = new Date();
    let sealed: { snapshot: object; contentHash: string } | null = null;
    let signature: SealSignature | null = null;
    if (rule.action === "approve") {
      const acknowledged = requireAcknowledged(await openThreads(tx, a.id), req.acknowledgedThreadIds);
      signature = {
        signerId: member.userId, signerName: signer!.name, signerEmail: signer!.email, signerRole: member.role, meaning: req.meaning!, statement: SIGNATURE_MEANINGS[req.meaning!],
        note: req.comment!.trim(), signedAt: now.toISOString(), method: signer!.method, acknowledgedThreads: acknowledged,
      };
      sealed = await buildSnapshot(tx, { ...rev, analysis: a }, member.userId, now, signature);
    }
    else if (rule.to === "in_review") await checkSubmittable(tx, member.group.id, a.sampleId, rev);
    const data = {
      state: rule.to,
      version: rev.version + 1,
      ...(rule.to === "in_review" ? { submittedById: member.userId, submittedAt: now } : {}),
      ...(rule.action === "withdraw" ? { submittedById: null, submittedAt: null } : {}),
      ...(sealed ? { snapshot: sealed.snapshot, contentHash: sealed.contentHash, sealedById: member.userId, sealedAt: now } : {}),
    };
    await tx.analysisRevision.update({ where: { id: rev.id }, data });
    const replaced = rule.action === "approve" ? await supersedeSealed(tx, member, a.id, rev.id) : [];
    const decisionId = rule.decision
      ? (await tx.reviewDecision.create({ data: { revisionId: rev.id, reviewerId: member.userId, decision: rule.action === "approve" ? "approved" : "returned", comment: req.comment?.trim() ?? "" } })).id
      : null;
    await notifyTransition(tx, member, group.slug, rule, { analysisId: a.id, title: a.title, revisionId: rev.id, number: rev.number, submittedById: rev.submittedById, comment: req.comment?.trim() ?? "" });
    const afterHash = sealed ? sealed.contentHash : await stateHash(tx, { ...rev, state: rule.to, version: rev.version + 1 });
    await recordAudit(tx, {
      groupId: member.group.id, actorId: member.userId, action: `revision.${rule.action}`, objectType: "analysisRevision", objectId: rev.id, beforeHash, afterHash,
      detail: { analysisId: a.id, number: rev.number, from: rev.state, to: rule.to, ...(req.comment?.trim() ? { comment: req.comment.trim() } : {}), ...(decisionId ? { decisionId } : {}), ...(replaced.length ? { replaced } : {}),
        ...(signature ? { signature: { signerRole: signature.signerRole, meaning: signature.meaning, statement: signature.statement, note: signature.note, method: signature.method, signedAt: signature.signedAt, acknowledgedThreadIds: signature.acknowledgedThreads.map((t) => t.id) } } : {}) },
    });
    // Open notebook pages (any instance) refresh on this, like on a step change.
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: rev.id, kind: "review", actorId: member.userId });
    return { revisionId: rev.id, number: rev.number, from: rev.state, state: rule.to, version: rev.version + 1, contentHash: sealed?.contentHash ?? null, decisionId, replacedRevisionIds: replaced };
  }, { timeout: 60_000 }).catch((err: unknown) => {
    throw lockViolation(err);
  });
}

interface NoticeFacts {
  analysisId: string;
  title: string;
  revisionId: string;
  number: number;
  submittedById: string | null;
  comment: string;
}

async function notifyTransition(tx: Tx, member: Member, slug: string, rule: TransitionRule, f: NoticeFacts): Promise<void> {
  const actor = await tx.user.findUnique({ where: { id: member.userId }, select: { name: true } });
  const who = actor?.name ?? "someone";
  const link = `/g/${slug}/analyses/${f.analysisId}?revision=${f.revisionId}`;
  const what = `"${f.title}" revision ${f.number}`;
  const notMe = (ids: (string | null)[]) => ids.filter((id): id is string => id !== null && id !== member.userId);
  const base = { groupId: member.group.id, link };
  switch (rule.action) {
    case "submit":
    case "resubmit":
      await sendNotices(tx, { ...base, userIds: notMe(await reviewers(tx, member.group.id)), kind: "review.requested", message: `${who} asks for review of ${what}` });
      return;
    case "withdraw":
      await sendNotices(tx, { ...base, userIds: notMe(await reviewers(tx, member.group.id)), kind: "review.withdrawn", message: `${who} withdrew ${what} from review` });
      return;
    case "return": {
      const excerpt = f.comment.length > 200 ? `${f.comment.slice(0, 200)}…` : f.comment;
      await sendNotices(tx, { ...base, userIds: notMe([f.submittedById]), kind: "review.returned", message: `${who} asked for changes to ${what}: ${excerpt}` });
      return;
    }
    case "approve":
      await sendNotices(tx, { ...base, userIds: notMe([f.submittedById]), kind: "review.approved", message: `${who} approved ${what}; it is now sealed` });
      return;
  }
}
