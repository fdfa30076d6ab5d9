/**
 * Enqueueing a job: validate the payload, check the caller may write analyses in the group
 * (owner or analyst), check the series or step belongs to the group, then insert the JobRun
 * row and the queue entry in one transaction (both or neither).
 */
import { z } from "zod";
import { randomUUID } from "node:crypto";
import type { Db } from "../db/client";
import { authorise, type Member } from "../access";
import { parseInput } from "../validate";
import { NotFoundError, InputError } from "../../engine/errors";
import { appQueue, queueSettings, type JobKind } from "./queue";
import { insertRun, jobPool, getRun, type JobView } from "./runs";
import { refitTargets } from "./refitSeries";

export const enqueueSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("refit-series"), seriesId: z.string().uuid("choose a series") }),
  z.object({
    kind: z.literal("window-scan"),
    analysisId: z.string().uuid("choose an analysis"),
    stepId: z.string().uuid("choose a fit step"),
    /** Candidate edges per axis (the notebook's own scan uses 20). */
    gridSize: z.number().int().min(4).max(120).default(60),
  }),
]);
export type EnqueueInput = z.infer<typeof enqueueSchema>;

async function checkTarget(db: Db, member: Member, input: EnqueueInput): Promise<number> {
  if (input.kind === "refit-series") {
    const series = await db.series.findFirst({ where: { id: input.seriesId, groupId: member.group.id }, select: { id: true } });
    if (!series) throw new NotFoundError("series");
    return (await refitTargets(db, member.group.id, series.id)).length;
  }
  const step = await db.step.findFirst({ where: { id: input.stepId, revision: { analysisId: input.analysisId, analysis: { groupId: member.group.id } } }, select: { kind: true } });
  if (!step) throw new NotFoundError("step");
  if (step.kind !== "fit") throw new InputError(`a window scan needs a fit step, not a ${step.kind} step`, { field: "stepId" });
  return input.gridSize;
}

/** Enqueue a job; returns its JobRun view (state "queued"). */
export async function enqueueJob(db: Db, member: Member, body: unknown): Promise<JobView> {
  authorise(member, "analysis.write");
  const input = parseInput(enqueueSchema, body);
  const total = await checkTarget(db, member, input);
  const boss = await appQueue();
  const id = randomUUID();
  const { kind, ...params } = input;
  const client = await jobPool().connect();
  try {
    await client.query("BEGIN");
    await insertRun(client, { id, groupId: member.group.id, kind: kind as JobKind, params, createdById: member.userId, total });
    const s = queueSettings();
    const sent = await boss.send(kind, { jobId: id, groupId: member.group.id, actorId: member.userId, ...params }, {
      id, expireInSeconds: s.expireInSeconds, retryLimit: s.retryLimit, retryDelay: s.retryDelaySeconds,
      db: { executeSql: (text: string, values: unknown[]) => client.query(text, values) },
    });
    if (!sent) throw new Error(`the queue ${kind} does not exist`);
    await client.query("COMMIT");
  } catch (err) {
    await client.query("ROLLBACK").catch(() => undefined);
    throw err;
  } finally {
    client.release();
  }
  return (await getRun(jobPool(), member.group.id, id))!;
}
