/**
 * Series records: a named composition series of one group, its composition variable (x in
 * A₁₋ₓBₓ, or any label the group uses) and its member samples. Every change is audited.
 */
import { z } from "zod";
import type { Db } from "../db/client";
import { ConflictError, InputError, NotFoundError } from "../../engine/errors";
import { authorise, type Member } from "../access";
import { recordAudit } from "../audit";
import { parseInput } from "../validate";
import { uuidOrNone } from "../samples";

export const createSeriesSchema = z.object({
  name: z.string().trim().min(1, "a series needs a name").max(120),
  compositionVariable: z.string().trim().min(1).max(40).default("x"),
  description: z.string().max(5_000).default(""),
  sampleIds: z.array(z.string().uuid("sample ids are UUIDs")).max(500).default([]),
});

export const updateSeriesSchema = z.object({
  name: z.string().trim().min(1, "a series needs a name").max(120).optional(),
  compositionVariable: z.string().trim().min(1).max(40).optional(),
  description: z.string().max(5_000).optional(),
});

export const seriesMembersSchema = z.object({
  sampleIds: z.array(z.string().uuid("sample ids are UUIDs")).min(1, "name at least one sample").max(500),
});

export interface SeriesInfo {
  id: string;
  name: string;
  compositionVariable: string;
  description: string;
  memberIds: string[];
  createdAt: string;
}

type SeriesRow = { id: string; name: string; compositionVariable: string; description: string; createdAt: Date; members: { sampleId: string }[] };

function toInfo(s: SeriesRow): SeriesInfo {
  return { id: s.id, name: s.name, compositionVariable: s.compositionVariable, description: s.description, memberIds: s.members.map((m) => m.sampleId), createdAt: s.createdAt.toISOString() };
}

const WITH_MEMBERS = { members: { select: { sampleId: true } } } as const;

export async function listSeries(db: Db, member: Member): Promise<SeriesInfo[]> {
  authorise(member, "group.read");
  const rows = await db.series.findMany({ where: { groupId: member.group.id }, include: WITH_MEMBERS, orderBy: { name: "asc" } });
  return rows.map(toInfo);
}

export async function getSeries(db: Db, member: Member, id: string): Promise<SeriesInfo> {
  authorise(member, "group.read");
  const s = await db.series.findFirst({ where: { id: uuidOrNone(id), groupId: member.group.id }, include: WITH_MEMBERS });
  if (!s) throw new NotFoundError("series");
  return toInfo(s);
}

/** Samples must belong to the member's group (others do not exist for them). */
async function checkSamples(db: Db, member: Member, ids: string[]): Promise<void> {
  const found = await db.sample.findMany({ where: { id: { in: ids }, groupId: member.group.id }, select: { id: true } });
  const have = new Set(found.map((s) => s.id));
  const missing = ids.find((id) => !have.has(id));
  if (missing) throw new InputError(`sample ${missing} not found in this group`, { field: "sampleIds" });
}

async function nameTaken(db: Db, member: Member, name: string, exceptId?: string): Promise<void> {
  const other = await db.series.findFirst({ where: { groupId: member.group.id, name, ...(exceptId ? { NOT: { id: exceptId } } : {}) } });
  if (other) throw new ConflictError(`a series named "${name}" already exists`);
}

export async function createSeries(db: Db, member: Member, input: unknown): Promise<SeriesInfo> {
  authorise(member, "series.write");
  const data = parseInput(createSeriesSchema, input);
  const ids = [...new Set(data.sampleIds)];
  await checkSamples(db, member, ids);
  await nameTaken(db, member, data.name);
  return db.$transaction(async (tx) => {
    const s = await tx.series.create({
      data: { groupId: member.group.id, name: data.name, compositionVariable: data.compositionVariable, description: data.description, members: { create: ids.map((sampleId) => ({ sampleId })) } },
      include: WITH_MEMBERS,
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "series.create", objectType: "series", objectId: s.id, detail: { name: s.name, members: ids.length } });
    return toInfo(s);
  });
}

export async function updateSeries(db: Db, member: Member, id: string, input: unknown): Promise<SeriesInfo> {
  authorise(member, "series.write");
  const data = parseInput(updateSeriesSchema, input);
  const before = await getSeries(db, member, id);
  if (data.name !== undefined) await nameTaken(db, member, data.name, before.id);
  return db.$transaction(async (tx) => {
    const s = await tx.series.update({ where: { id: before.id }, data, include: WITH_MEMBERS });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "series.update", objectType: "series", objectId: s.id, detail: data });
    return toInfo(s);
  });
}

export async function addSeriesMembers(db: Db, member: Member, id: string, input: unknown): Promise<SeriesInfo> {
  authorise(member, "series.write");
  const ids = [...new Set(parseInput(seriesMembersSchema, input).sampleIds)];
  const before = await getSeries(db, member, id);
  await checkSamples(db, member, ids);
  const added = ids.filter((s) => !before.memberIds.includes(s));
  return db.$transaction(async (tx) => {
    await tx.seriesMember.createMany({ data: added.map((sampleId) => ({ seriesId: before.id, sampleId })), skipDuplicates: true });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "series.members.add", objectType: "series", objectId: before.id, detail: { sampleIds: added } });
    return toInfo(await tx.series.findUniqueOrThrow({ where: { id: before.id }, include: WITH_MEMBERS }));
  });
}

export async function removeSeriesMember(db: Db, member: Member, id: string, sampleId: string): Promise<SeriesInfo> {
  authorise(member, "series.write");
  const before = await getSeries(db, member, id);
  if (!before.memberIds.includes(sampleId)) throw new NotFoundError("series member");
  return db.$transaction(async (tx) => {
    await tx.seriesMember.delete({ where: { seriesId_sampleId: { seriesId: before.id, sampleId } } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "series.members.remove", objectType: "series", objectId: before.id, detail: { sampleId } });
    return toInfo(await tx.series.findUniqueOrThrow({ where: { id: before.id }, include: WITH_MEMBERS }));
  });
}
