/**
 * Export one group into the backup archive (see format.ts). Reads only; whole archive in memory
 * (fine for groups of a few hundred MB of original files; a streaming writer is the next step).
 */
import { gzipSync } from "node:zlib";
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { verifySealedRevisions as verifySnapshotsAgainstRows, describeMismatch } from "../review/integrity";
import { ENGINE_VERSION } from "../../engine/version";
import { BACKUP_FORMAT, BACKUP_VERSION, TABLES, encodeRow, type BackupHeader, type Row } from "./format";
import { sealedEntries, verifyGroupAuditChain } from "./verify";
import { auditKey, type AuditKey } from "../auditKey";

type Delegate = { findMany(args: object): Promise<Row[]> };

function delegate(db: Db, table: string): Delegate {
  return (db as unknown as Record<string, Delegate>)[table[0]!.toLowerCase() + table.slice(1)]!;
}

/** The query that selects the group's rows of each table. */
function scope(table: string, groupId: string, userIds: string[]): object {
  const revision = { analysis: { groupId } };
  switch (table) {
    case "Group": return { where: { id: groupId } };
    case "User": return { where: { id: { in: userIds } }, select: { id: true, email: true, name: true, createdAt: true } };
    case "AnalysisRevision": return { where: revision, orderBy: [{ analysisId: "asc" }, { number: "asc" }] };
    case "Step": case "ReviewDecision": return { where: { revision } };
    case "Comment": return { where: { thread: { groupId } } };
    case "SeriesMember": return { where: { series: { groupId } } };
    case "AuditEvent": return { where: { groupId }, orderBy: { id: "asc" } };
    default: return { where: { groupId } };
  }
}

/** Members' and comment authors' user ids (Comment.authorId is the one foreign key into User). */
async function userIdsOf(db: Db, groupId: string): Promise<string[]> {
  const members = await db.membership.findMany({ where: { groupId }, select: { userId: true } });
  const authors = await db.comment.findMany({ where: { thread: { groupId } }, select: { authorId: true }, distinct: ["authorId"] });
  return [...new Set([...members.map((m) => m.userId), ...authors.map((a) => a.authorId)])];
}

export interface ExportResult {
  archive: Uint8Array;
  counts: Record<string, number>;
}

/** Archive everything of the group with this slug or id. NotFoundError for an unknown group. */
export async function exportGroup(db: Db, slugOrId: string, key: AuditKey = auditKey()): Promise<ExportResult> {
  const isUuid = /^[0-9a-f-]{36}$/i.test(slugOrId);
  const group = await db.group.findFirst({ where: isUuid ? { id: slugOrId } : { slug: slugOrId } });
  if (!group) throw new NotFoundError(`group ${JSON.stringify(slugOrId)}`);
  // A group whose stored rows no longer agree with its sealed snapshots is not backed up as if sound.
  const seals = await verifySnapshotsAgainstRows(db, { groupId: group.id, engine: false });
  if (!seals.ok) throw new ConflictError(`group ${group.slug} not exported: ${seals.mismatches.length} mismatch(es) with sealed snapshots; first: ${describeMismatch(seals.mismatches[0]!)}`);
  const header: BackupHeader = { format: BACKUP_FORMAT, version: BACKUP_VERSION, createdAt: new Date().toISOString(), engineVersion: ENGINE_VERSION, group: { id: group.id, slug: group.slug, name: group.name } };
  const lines = [JSON.stringify(header)];
  const userIds = await userIdsOf(db, group.id);
  const counts: Record<string, number> = {};
  for (const spec of TABLES) {
    const rows = await delegate(db, spec.name).findMany(scope(spec.name, group.id, userIds));
    counts[spec.name] = rows.length;
    for (const row of rows) lines.push(JSON.stringify({ table: spec.name, row: encodeRow(spec, row) }));
  }
  // The group chain's state and a signed checkpoint of its head: restore verifies against it.
  const end = { counts, sealed: await sealedEntries(db, group.id), audit: await verifyGroupAuditChain(db, group.id, { key }) };
  lines.push(JSON.stringify({ end }));
  return { archive: gzipSync(Buffer.from(lines.join("\n") + "\n", "utf8")), counts };
}
