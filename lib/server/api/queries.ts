/** Paged list queries of the v1 API (keyset on createdAt, id), mapped to the server layer's types. */
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import type { Member } from "../access";
import { toSampleInfo, uuidOrNone, type SampleInfo } from "../samples";
import type { MeasurementInfo } from "../measurements";
import { afterCursor, pageOf, PAGE_ORDER } from "./pagination";

export async function pageSamples(db: Db, member: Member, q: { limit: number; cursor?: string; q?: string; archived: "exclude" | "include" | "only" }): Promise<{ samples: SampleInfo[]; nextCursor: string | null }> {
  const text = q.q?.trim();
  const rows = await db.sample.findMany({
    where: {
      groupId: member.group.id,
      ...(q.archived === "exclude" ? { archivedAt: null } : q.archived === "only" ? { archivedAt: { not: null } } : {}),
      ...(text ? { AND: [{ OR: [{ label: { contains: text, mode: "insensitive" as const } }, { formula: { contains: text, mode: "insensitive" as const } }] }] } : {}),
      ...afterCursor(q.cursor),
    },
    orderBy: PAGE_ORDER,
    take: q.limit + 1,
  });
  const p = pageOf(rows, q.limit, toSampleInfo);
  return { samples: p.items, nextCursor: p.nextCursor };
}

export async function pageMeasurements(db: Db, member: Member, sampleId: string, q: { limit: number; cursor?: string }): Promise<{ measurements: MeasurementInfo[]; nextCursor: string | null }> {
  const sample = await db.sample.findFirst({ where: { id: uuidOrNone(sampleId), groupId: member.group.id }, select: { id: true } });
  if (!sample) throw new NotFoundError("sample");
  const rows = await db.measurement.findMany({
    where: { groupId: member.group.id, sampleId: sample.id, archivedAt: null, ...afterCursor(q.cursor) },
    omit: { temperatureK: true, heatCapacity: true, sigma: true, fieldPointsT: true, sourceLines: true },
    include: { file: { select: { fileName: true, sha256: true, sizeBytes: true } } },
    orderBy: PAGE_ORDER,
    take: q.limit + 1,
  });
  const p = pageOf(rows, q.limit, (m): MeasurementInfo => ({
    id: m.id, sampleId: m.sampleId, kind: m.kind, label: m.label, fieldT: m.fieldT, notes: m.notes, basis: m.basis, pointCount: m.pointCount, tMinK: m.tMinK, tMaxK: m.tMaxK,
    fileName: m.file.fileName, sha256: m.file.sha256, sizeBytes: m.file.sizeBytes, units: m.units as Record<string, string>, columnMapping: m.columnMapping as Record<string, number>, createdAt: m.createdAt.toISOString(),
  }));
  return { measurements: p.items, nextCursor: p.nextCursor };
}
