/**
 * Revisions of a sealed analysis: `reviseSealed` starts a new open revision (number + 1,
 * basedOnId = the sealed one) with a copy of its steps; approving that one later replaces the
 * sealed one (`supersedeSealed`, the only change the database allows to a sealed revision:
 * state sealed → replaced, nothing else).
 */
import { notify } from "../notebook/events";
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { recordAudit } from "../audit";
import { authorise, type Member } from "../access";
import { uuidOrNone } from "../samples";
import { computeRevisionSteps } from "../notebook/compute";
import type { Tx } from "./notices";
import { lockViolation } from "./lockError";
import { intactSnapshot, sealedSteps } from "./served";
import { randomUUID } from "node:crypto";

/** Mark every other sealed revision of the analysis replaced; returns their ids. */
export async function supersedeSealed(tx: Tx, member: Member, analysisId: string, newRevisionId: string): Promise<string[]> {
  const old = await tx.analysisRevision.findMany({ where: { analysisId, state: "sealed", id: { not: newRevisionId } }, select: { id: true, number: true, contentHash: true } });
  for (const r of old) {
    await tx.analysisRevision.update({ where: { id: r.id }, data: { state: "replaced" } });
    await recordAudit(tx, {
      groupId: member.group.id, actorId: member.userId, action: "revision.replace", objectType: "analysisRevision", objectId: r.id,
      beforeHash: r.contentHash, afterHash: r.contentHash, detail: { analysisId, number: r.number, from: "sealed", to: "replaced", replacedBy: newRevisionId },
    });
  }
  return old.map((r) => r.id);
}

export interface NewRevision {
  revisionId: string;
  number: number;
  basedOnId: string;
  version: number;
  steps: number;
}

/**
 * Start a new open revision from the analysis's sealed revision, copying its steps (configuration,
 * with references to other steps remapped; outputs are then computed afresh). Refused while
 * another revision of the analysis is still open, in review or returned.
 */
export async function reviseSealed(db: Db, member: Member, analysisId: string): Promise<NewRevision> {
  authorise(member, "analysis.write");
  const a = await db.analysis.findFirst({ where: { id: uuidOrNone(analysisId), groupId: member.group.id } });
  if (!a) throw new NotFoundError("analysis");
  const result = await db.$transaction(async (tx) => {
    // Serialise revisers of one analysis: the row lock makes the "no draft yet" check hold.
    await tx.$queryRaw`SELECT 1 FROM "Analysis" WHERE id = ${a.id}::uuid FOR UPDATE`;
    const revisions = await tx.analysisRevision.findMany({ where: { analysisId: a.id }, orderBy: { number: "desc" }, select: { id: true, number: true, state: true, contentHash: true, snapshot: true } });
    const draft = revisions.find((r) => r.state === "open" || r.state === "in_review" || r.state === "returned");
    if (draft) throw new ConflictError(`revision ${draft.number} of this analysis is ${draft.state === "in_review" ? "in review" : "still being edited"}: work on it instead of starting another`);
    const sealed = revisions.find((r) => r.state === "sealed");
    if (!sealed) throw new ConflictError("this analysis has no sealed revision to revise");
    // The sealed steps come from the snapshot (checked against its content hash), not the rows beside it.
    const steps = sealedSteps(intactSnapshot(sealed, a.title));
    const ids = new Map(steps.map((s) => [s.id, randomUUID()]));
    const number = revisions[0]!.number + 1;
    const created = await tx.analysisRevision.create({
      data: {
        analysisId: a.id, number, basedOnId: sealed.id, createdById: member.userId,
        steps: {
          create: steps.map((s) => ({ id: ids.get(s.id)!, position: s.position, kind: s.kind, title: s.title, config: remapIds(s.config ?? {}, ids) as object, updatedById: member.userId })),
        },
      },
    });
    await tx.analysis.update({ where: { id: a.id }, data: { updatedAt: new Date() } });
    await recordAudit(tx, {
      groupId: member.group.id, actorId: member.userId, action: "revision.revise", objectType: "analysisRevision", objectId: created.id,
      detail: { analysisId: a.id, number, basedOnId: sealed.id, basedOnNumber: sealed.number, steps: steps.length },
    });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: created.id, kind: "review", actorId: member.userId });
    return { revisionId: created.id, number, basedOnId: sealed.id, version: created.version, steps: steps.length };
  }).catch((err: unknown) => {
    throw lockViolation(err);
  });
  // Outputs are computed afresh (they may name step ids of the sealed revision).
  await computeRevisionSteps(db, member.group.id, a.sampleId, result.revisionId, "edit");
  return result;
}

/** A copy of a step configuration with references to steps of the old revision pointed at their copies. */
export function remapIds(value: unknown, ids: ReadonlyMap<string, string>): unknown {
  if (typeof value === "string") return ids.get(value) ?? value;
  if (Array.isArray(value)) return value.map((v) => remapIds(v, ids));
  if (value && typeof value === "object") return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, remapIds(v, ids)]));
  return value;
}
