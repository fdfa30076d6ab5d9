/**
 * Editing the chain of an editable revision. A step's configuration carries a version: saving
 * against an older version is refused with the newer step (ConflictError → 409), so nothing
 * either person typed is silently overwritten. Adding, removing and moving steps are guarded by
 * the revision's version in the same way.
 */
import { z } from "zod";
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { parseStepConfig, stepDefinition, STEP_ORDER, type StepKind } from "../../engine/notebook";
import { recordAudit } from "../audit";
import { authorise, type Member } from "../access";
import { parseInput } from "../validate";
import { contentHash } from "../hash";
import { uuidOrNone } from "../samples";
import { editableRevision } from "./analyses";
import { notify } from "./events";

export const addStepSchema = z.object({
  revisionId: z.string(),
  revisionVersion: z.number().int().positive(),
  kind: z.enum(STEP_ORDER as [StepKind, ...StepKind[]]),
  position: z.number().int().min(0).optional(),
  title: z.string().max(160).default(""),
  config: z.unknown().optional(),
});

export const updateStepSchema = z.object({
  version: z.number().int().positive(),
  title: z.string().max(160).optional(),
  config: z.unknown(),
});

export const moveStepSchema = z.object({ revisionVersion: z.number().int().positive(), position: z.number().int().min(0) });
export const removeStepSchema = z.object({ revisionVersion: z.number().int().positive() });

async function analysisOf(db: Db, member: Member, analysisId: string) {
  const a = await db.analysis.findFirst({ where: { id: uuidOrNone(analysisId), groupId: member.group.id } });
  if (!a) throw new NotFoundError("analysis");
  return a;
}

/** The analysis and one of its steps, which must be in an editable revision (else 404 / 409). */
async function editableStep(db: Db, member: Member, analysisId: string, stepId: string) {
  const a = await analysisOf(db, member, analysisId);
  const step = await db.step.findFirst({ where: { id: uuidOrNone(stepId), revision: { analysisId: a.id } }, select: { id: true, revisionId: true, kind: true, config: true } });
  if (!step) throw new NotFoundError("step");
  await editableRevision(db, a.id, step.revisionId);
  return { a, step };
}

type Tx = Parameters<Parameters<Db["$transaction"]>[0]>[0];

/** Bump the revision version if it is still `expected`; otherwise another structural edit won. */
async function claimRevision(tx: Tx, revisionId: string, expected: number): Promise<void> {
  const r = await tx.analysisRevision.updateMany({ where: { id: revisionId, version: expected }, data: { version: { increment: 1 } } });
  if (r.count === 0) throw new ConflictError("the chain was changed by someone else meanwhile; reload to see the newer version");
}

async function renumber(tx: Tx, revisionId: string, orderedIds: string[]): Promise<void> {
  // Two passes so the positions never collide mid-way.
  for (const [i, id] of orderedIds.entries()) await tx.step.update({ where: { id }, data: { position: 10_000 + i } });
  for (const [i, id] of orderedIds.entries()) await tx.step.update({ where: { id }, data: { position: i } });
}

export async function addStep(db: Db, member: Member, analysisId: string, input: unknown): Promise<{ stepId: string }> {
  authorise(member, "analysis.write");
  const req = parseInput(addStepSchema, input);
  const a = await analysisOf(db, member, analysisId);
  const rev = await editableRevision(db, a.id, req.revisionId);
  const config = parseStepConfig(req.kind, req.config ?? defaultConfig(req.kind));
  return db.$transaction(async (tx) => {
    await claimRevision(tx, rev.id, req.revisionVersion);
    const existing = await tx.step.findMany({ where: { revisionId: rev.id }, orderBy: { position: "asc" }, select: { id: true } });
    const at = Math.min(req.position ?? existing.length, existing.length);
    const step = await tx.step.create({ data: { revisionId: rev.id, position: 20_000, kind: req.kind, title: req.title, config: config as object, updatedById: member.userId } });
    const order = existing.map((s) => s.id);
    order.splice(at, 0, step.id);
    await renumber(tx, rev.id, order);
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "step.add", objectType: "step", objectId: step.id, afterHash: contentHash(config), detail: { analysisId: a.id, kind: req.kind, position: at } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: rev.id, stepId: step.id, kind: "structure", actorId: member.userId });
    return { stepId: step.id };
  });
}

/** Defaults for a new step of a kind (the step's own schema fills the rest). */
/** The configuration a new step of this kind starts from (its definition's `initial`). */
function defaultConfig(kind: StepKind): unknown {
  return stepDefinition(kind).initial ?? {};
}

export async function updateStep(db: Db, member: Member, analysisId: string, stepId: string, input: unknown) {
  authorise(member, "analysis.write");
  const req = parseInput(updateStepSchema, input);
  const { a, step } = await editableStep(db, member, analysisId, stepId);
  const config = parseStepConfig(step.kind, req.config);
  return db.$transaction(async (tx) => {
    const r = await tx.step.updateMany({
      where: { id: step.id, version: req.version },
      data: { config: config as object, ...(req.title !== undefined ? { title: req.title } : {}), version: { increment: 1 }, updatedById: member.userId },
    });
    if (r.count === 0) {
      const current = await tx.step.findUnique({ where: { id: step.id }, select: { id: true, version: true, title: true, config: true, updatedAt: true } });
      throw new ConflictError(
        "this step was saved by someone else after you opened it; your edit was not applied — compare with the newer version below and save again",
        current ? { id: current.id, version: current.version, title: current.title, config: current.config, updatedAt: current.updatedAt.toISOString() } : undefined,
      );
    }
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "step.update", objectType: "step", objectId: step.id, beforeHash: contentHash(step.config), afterHash: contentHash(config), detail: { analysisId: a.id, kind: step.kind } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: step.revisionId, stepId: step.id, kind: "step", actorId: member.userId });
    return { version: req.version + 1 };
  });
}

export async function removeStep(db: Db, member: Member, analysisId: string, stepId: string, input: unknown): Promise<void> {
  authorise(member, "analysis.write");
  const req = parseInput(removeStepSchema, input);
  const { a, step } = await editableStep(db, member, analysisId, stepId);
  await db.$transaction(async (tx) => {
    await claimRevision(tx, step.revisionId, req.revisionVersion);
    await tx.step.delete({ where: { id: step.id } });
    const rest = await tx.step.findMany({ where: { revisionId: step.revisionId }, orderBy: { position: "asc" }, select: { id: true } });
    await renumber(tx, step.revisionId, rest.map((s) => s.id));
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "step.remove", objectType: "step", objectId: step.id, beforeHash: contentHash(step.config), detail: { analysisId: a.id, kind: step.kind } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: step.revisionId, kind: "structure", actorId: member.userId });
  });
}

export async function moveStep(db: Db, member: Member, analysisId: string, stepId: string, input: unknown): Promise<void> {
  authorise(member, "analysis.write");
  const req = parseInput(moveStepSchema, input);
  const { a, step } = await editableStep(db, member, analysisId, stepId);
  await db.$transaction(async (tx) => {
    await claimRevision(tx, step.revisionId, req.revisionVersion);
    const order = (await tx.step.findMany({ where: { revisionId: step.revisionId }, orderBy: { position: "asc" }, select: { id: true } })).map((s) => s.id).filter((id) => id !== step.id);
    order.splice(Math.min(req.position, order.length), 0, step.id);
    await renumber(tx, step.revisionId, order);
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "step.move", objectType: "step", objectId: step.id, detail: { analysisId: a.id, to: req.position } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, revisionId: step.revisionId, kind: "structure", actorId: member.userId });
  });
}
