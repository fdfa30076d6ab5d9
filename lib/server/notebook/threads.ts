/**
 * Discussion on an analysis: threads on a step, or on a range of points selected on a plot
 * (the anchor), with replies; resolve and reopen. Mentions (@ followed by a member's e-mail name
 * part or full name without spaces) notify that member.
 */
import { z } from "zod";
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import { recordAudit } from "../audit";
import { authorise, type Member } from "../access";
import { parseInput } from "../validate";
import { uuidOrNone } from "../samples";
import { notify } from "./events";

export const anchorSchema = z.object({
  plot: z.enum(["ct-vs-t2", "c-vs-t", "residuals", "scan", "addenda", "transition", "entropy"]),
  xMin: z.number().finite(),
  xMax: z.number().finite(),
  yMin: z.number().finite().optional(),
  yMax: z.number().finite().optional(),
  /** Points inside the range when it was drawn, as measurement id + index. */
  points: z.array(z.object({ measurementId: z.string(), index: z.number().int().min(0) })).max(5000).optional(),
}).refine((a) => a.xMax >= a.xMin, { message: "the range must have xMax ≥ xMin", path: ["xMax"] });

export const newThreadSchema = z.object({
  stepId: z.string().uuid().nullable().default(null),
  anchor: anchorSchema.nullable().default(null),
  body: z.string().trim().min(1, "write something").max(10_000),
});

export const replySchema = z.object({ body: z.string().trim().min(1, "write something").max(10_000) });
export const threadStateSchema = z.object({ state: z.enum(["open", "resolved"]) });

export interface CommentView {
  id: string;
  authorId: string;
  authorName: string;
  body: string;
  createdAt: string;
}

export interface ThreadView {
  id: string;
  stepId: string | null;
  anchor: z.infer<typeof anchorSchema> | null;
  state: "open" | "resolved";
  createdAt: string;
  resolvedAt: string | null;
  comments: CommentView[];
}

async function analysisOf(db: Db, member: Member, analysisId: string) {
  const a = await db.analysis.findFirst({ where: { id: uuidOrNone(analysisId), groupId: member.group.id }, select: { id: true, title: true } });
  if (!a) throw new NotFoundError("analysis");
  return a;
}

export async function listThreads(db: Db, member: Member, analysisId: string): Promise<ThreadView[]> {
  authorise(member, "group.read");
  const a = await analysisOf(db, member, analysisId);
  const rows = await db.thread.findMany({
    where: { analysisId: a.id, groupId: member.group.id },
    include: { comments: { include: { author: { select: { name: true } } }, orderBy: { createdAt: "asc" } } },
    orderBy: { createdAt: "asc" },
  });
  return rows.map((t) => ({
    id: t.id, stepId: t.stepId, anchor: (t.anchor as ThreadView["anchor"]) ?? null, state: t.state, createdAt: t.createdAt.toISOString(), resolvedAt: t.resolvedAt?.toISOString() ?? null,
    comments: t.comments.map((c) => ({ id: c.id, authorId: c.authorId, authorName: c.author.name, body: c.body, createdAt: c.createdAt.toISOString() })),
  }));
}

type Tx = Parameters<Parameters<Db["$transaction"]>[0]>[0];

/** The @handles written in a comment body, lower-cased, each once, in order. */
export function mentionedHandles(body: string): string[] {
  return [...new Set([...body.matchAll(/(?:^|[^\w@.])@([A-Za-z0-9][\w.\-]*)/g)].map((m) => m[1]!.replace(/[.\-]+$/, "").toLowerCase()))];
}

/**
 * Notify the members a comment mentions: by their handle in the group (members page), or as
 * before by the e-mail's name part or the name without spaces. Returns the handles that match
 * nobody, so the writer is told at once that they reached no one.
 */
async function noticeMentions(tx: Tx, member: Member, body: string, link: string, title: string): Promise<string[]> {
  const handles = mentionedHandles(body);
  if (!handles.length) return [];
  const members = await tx.membership.findMany({ where: { groupId: member.group.id }, include: { user: { select: { id: true, email: true, name: true } } } });
  const matched = new Set<string>();
  for (const m of members) {
    const names = [m.handle.toLowerCase(), m.user.email.split("@")[0]!.toLowerCase(), m.user.name.replace(/\s+/g, "").toLowerCase()];
    const hit = handles.filter((h) => names.includes(h));
    hit.forEach((h) => matched.add(h));
    if (hit.length && m.user.id !== member.userId)
      await tx.notice.create({ data: { userId: m.user.id, groupId: member.group.id, kind: "mention", message: `You were mentioned in a discussion on "${title}"`, link } });
  }
  return handles.filter((h) => !matched.has(h));
}

export async function createThread(db: Db, member: Member, analysisId: string, input: unknown): Promise<{ threadId: string; unmatchedMentions: string[] }> {
  authorise(member, "comment.write");
  const req = parseInput(newThreadSchema, input);
  const a = await analysisOf(db, member, analysisId);
  if (req.stepId) {
    const step = await db.step.findFirst({ where: { id: req.stepId, revision: { analysisId: a.id } } });
    if (!step) throw new NotFoundError("step");
  }
  return db.$transaction(async (tx) => {
    const t = await tx.thread.create({
      data: { groupId: member.group.id, analysisId: a.id, stepId: req.stepId, anchor: req.anchor ?? undefined, createdById: member.userId, comments: { create: { authorId: member.userId, body: req.body } } },
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "thread.create", objectType: "thread", objectId: t.id, detail: { analysisId: a.id, stepId: req.stepId, anchored: !!req.anchor } });
    const unmatchedMentions = await noticeMentions(tx, member, req.body, `/g/${member.group.slug}/analyses/${a.id}#thread-${t.id}`, a.title);
    await notify(tx, { groupId: member.group.id, analysisId: a.id, ...(req.stepId ? { stepId: req.stepId } : {}), kind: "comment", actorId: member.userId });
    return { threadId: t.id, unmatchedMentions };
  });
}

async function threadOf(db: Db, member: Member, analysisId: string, threadId: string) {
  const a = await analysisOf(db, member, analysisId);
  const t = await db.thread.findFirst({ where: { id: uuidOrNone(threadId), analysisId: a.id, groupId: member.group.id } });
  if (!t) throw new NotFoundError("thread");
  return { a, t };
}

export async function replyToThread(db: Db, member: Member, analysisId: string, threadId: string, input: unknown): Promise<{ unmatchedMentions: string[] }> {
  authorise(member, "comment.write");
  const { body } = parseInput(replySchema, input);
  const { a, t } = await threadOf(db, member, analysisId, threadId);
  return db.$transaction(async (tx) => {
    const c = await tx.comment.create({ data: { threadId: t.id, authorId: member.userId, body } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "comment.create", objectType: "comment", objectId: c.id, detail: { threadId: t.id, analysisId: a.id } });
    const others = await tx.comment.findMany({ where: { threadId: t.id, authorId: { not: member.userId } }, select: { authorId: true }, distinct: ["authorId"] });
    for (const o of others) await tx.notice.create({ data: { userId: o.authorId, groupId: member.group.id, kind: "reply", message: `New reply in a discussion on "${a.title}"`, link: `/g/${member.group.slug}/analyses/${a.id}#thread-${t.id}` } });
    const unmatchedMentions = await noticeMentions(tx, member, body, `/g/${member.group.slug}/analyses/${a.id}#thread-${t.id}`, a.title);
    await notify(tx, { groupId: member.group.id, analysisId: a.id, kind: "comment", actorId: member.userId });
    return { unmatchedMentions };
  });
}

export async function setThreadState(db: Db, member: Member, analysisId: string, threadId: string, input: unknown): Promise<void> {
  authorise(member, "comment.write");
  const { state } = parseInput(threadStateSchema, input);
  const { a, t } = await threadOf(db, member, analysisId, threadId);
  await db.$transaction(async (tx) => {
    await tx.thread.update({ where: { id: t.id }, data: { state, resolvedAt: state === "resolved" ? new Date() : null } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: state === "resolved" ? "thread.resolve" : "thread.reopen", objectType: "thread", objectId: t.id, detail: { analysisId: a.id } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, kind: "comment", actorId: member.userId });
  });
}
