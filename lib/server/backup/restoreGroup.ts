/**
 * Restore a group archive into an EMPTY database (no users, groups or audit rows; refused
 * otherwise with ConflictError), in one transaction, keeping every id, timestamp and hash.
 *
 * The database's own locks are respected, not bypassed: a sealed revision cannot be inserted
 * sealed and the steps of a revision in review are frozen, so revisions are inserted `open`,
 * their steps and decisions added, and then moved to `in_review`, `sealed` (and `replaced`) by
 * the same UPDATEs the review flow makes — the sealing trigger
 * checks the seal and rebuilds RevisionMeasurement. Audit rows are inserted with their original
 * ids, seq, prevHash and signature (the table only refuses UPDATE/DELETE), and the id sequence
 * moved past them. Afterwards the sealed hashes are checked against the archive's closing line,
 * and the group's audit chain is verified ON ITS OWN with the audit key against the signed
 * checkpoint of its head in that line (a restore into a server with another key says so).
 * Version 1 archives (before per-group chains) carry unsigned events: they are re-chained
 * with the key, as the start-up upgrade does, and the report says so.
 * Run as the owner (the re-chaining of a version 1 archive switches the append-only trigger off
 * for its transaction). Then every integrity check (lib/server/integrity.ts) runs on the group.
 */
import { gunzipSync } from "node:zlib";
import type { Db } from "../db/client";
import { Prisma } from "../generated/prisma/client";
import { ConflictError, InputError } from "../../engine/errors";
import { BACKUP_FORMAT, BACKUP_VERSION, decodeRow, tableSpec, TABLES, type BackupHeader, type Row, type SealedEntry } from "./format";
import { verifyGroupAuditChain, verifySealedRevisions, type GroupChainReport, type SealReport } from "./verify";
import { readCheckpoint, type AuditCheckpoint } from "../auditCheckpoint";
import { auditKey as processKey, type AuditKey } from "../auditKey";
import { rechainLegacyEvents, type RechainResult } from "../auditUpgrade";
import { runIntegrityChecks, type IntegrityFinding } from "../integrity";

type Tx = Prisma.TransactionClient;
type Delegate = { createMany(args: { data: Row[] }): Promise<unknown> };

interface Parsed {
  header: BackupHeader;
  rows: Map<string, Row[]>;
  end: { counts: Record<string, number>; sealed: SealedEntry[]; audit: { checkpoint?: AuditCheckpoint } };
}

/**
 * Largest decompressed archive read (bytes): decompression stops there, so a small file that
 * inflates without end (a "gzip bomb") is refused instead of filling memory. 500 MiB stays below the
 * longest string JavaScript can hold (2²⁹ − 24 characters).
 */
export const MAX_ARCHIVE_BYTES = 500 * 1024 * 1024;

/** Parse and check an archive; InputError naming the line on anything malformed. */
export function readArchive(archive: Uint8Array, maxBytes = MAX_ARCHIVE_BYTES): Parsed {
  let text: string;
  try {
    text = gunzipSync(archive, { maxOutputLength: maxBytes }).toString("utf8");
  } catch (err) {
    if ((err as { code?: string }).code === "ERR_BUFFER_TOO_LARGE") throw new InputError(`the archive decompresses to more than ${Math.round(maxBytes / 1024 / 1024)} MiB: refused`, { field: "archive" });
    throw new InputError("not a gzip file: expected a Heatbook group backup", { field: "archive" });
  }
  const lines = text.split("\n").filter((l) => l.length > 0);
  const parse = (i: number) => {
    try {
      return JSON.parse(lines[i]!) as Record<string, unknown>;
    } catch {
      throw new InputError("invalid JSON", { field: "archive", line: i + 1 });
    }
  };
  const header = parse(0) as unknown as BackupHeader;
  if (header.format !== BACKUP_FORMAT) throw new InputError(`not a Heatbook group backup (format ${JSON.stringify(header.format)})`, { field: "archive", line: 1 });
  if (header.version !== BACKUP_VERSION && header.version !== 1) throw new InputError(`backup version ${header.version} is not supported (this build reads version ${BACKUP_VERSION})`, { field: "archive", line: 1 });
  const last = parse(lines.length - 1);
  if (!last.end) throw new InputError("the archive is truncated: its closing line is missing", { field: "archive", line: lines.length });
  const rows = new Map<string, Row[]>(TABLES.map((t) => [t.name, []]));
  for (let i = 1; i < lines.length - 1; i++) {
    const rec = parse(i) as { table?: string; row?: Row };
    if (typeof rec.table !== "string" || !rows.has(rec.table) || !rec.row) throw new InputError(`unknown record ${JSON.stringify(rec.table)}`, { field: "archive", line: i + 1 });
    rows.get(rec.table)!.push(decodeRow(tableSpec(rec.table), rec.row));
  }
  const end = last.end as Parsed["end"];
  for (const t of TABLES) if ((end.counts[t.name] ?? 0) !== rows.get(t.name)!.length) throw new InputError(`${t.name}: ${rows.get(t.name)!.length} rows, the closing line says ${end.counts[t.name]}`, { field: "archive" });
  return { header, rows, end };
}

async function assertEmpty(db: Db): Promise<void> {
  const [users, groups, audit] = await Promise.all([db.user.count(), db.group.count(), db.auditEvent.count()]);
  if (users + groups + audit > 0) throw new ConflictError(`restore needs an empty database; this one has ${groups} group(s), ${users} user(s), ${audit} audit row(s)`);
}

function forInsert(table: string, row: Row): Row {
  const out = { ...row };
  for (const c of tableSpec(table).nullableJson ?? []) if (out[c] === null) out[c] = Prisma.DbNull;
  if (table === "AnalysisRevision") {
    if (out.state !== "open" && out.state !== "returned") out.state = "open";
    out.basedOnId = null;
  }
  return out;
}

async function insertAll(tx: Tx, table: string, rows: Row[]): Promise<void> {
  const d = (tx as unknown as Record<string, Delegate>)[table[0]!.toLowerCase() + table.slice(1)]!;
  for (let i = 0; i < rows.length; i += 500) await d.createMany({ data: rows.slice(i, i + 500).map((r) => forInsert(table, r)) });
}

/** Lineage, then seals, in the order the review flow would have made them. */
async function replayRevisionStates(tx: Tx, revisions: Row[]): Promise<void> {
  for (const r of revisions) if (r.basedOnId) await tx.$executeRaw`UPDATE "AnalysisRevision" SET "basedOnId" = ${r.basedOnId as string}::uuid WHERE "id" = ${r.id as string}::uuid`;
  for (const r of revisions) if (r.state === "in_review" || r.state === "sealed" || r.state === "replaced") await tx.$executeRaw`UPDATE "AnalysisRevision" SET "state" = 'in_review'::"RevisionState", "updatedAt" = ${r.updatedAt as Date} WHERE "id" = ${r.id as string}::uuid`;
  const sealedOrder = revisions.filter((r) => r.state === "sealed" || r.state === "replaced").sort((a, b) => (a.sealedAt as Date).getTime() - (b.sealedAt as Date).getTime());
  for (const r of sealedOrder) await tx.$executeRaw`UPDATE "AnalysisRevision" SET "state" = 'sealed'::"RevisionState", "updatedAt" = ${r.updatedAt as Date} WHERE "id" = ${r.id as string}::uuid`;
  for (const r of sealedOrder) if (r.state === "replaced") await tx.$executeRaw`UPDATE "AnalysisRevision" SET "state" = 'replaced'::"RevisionState", "updatedAt" = ${r.updatedAt as Date} WHERE "id" = ${r.id as string}::uuid`;
}

export interface RestoreReport {
  ok: boolean;
  group: BackupHeader["group"];
  counts: Record<string, number>;
  audit: GroupChainReport;
  auditMatchesArchive: boolean;
  /** Set when the archive's events predate per-group chains and were re-chained at restore. */
  rechained: RechainResult | null;
  seals: SealReport;
  /** Every integrity check (lib/server/integrity.ts) on the restored group. */
  integrity: IntegrityFinding[];
}

/** Restore `archive` into the empty database `db`; see the module comment. */
export async function restoreGroup(db: Db, archive: Uint8Array, key: AuditKey = processKey()): Promise<RestoreReport> {
  const { header, rows, end } = readArchive(archive);
  const checkpoint = header.version === 1 ? undefined : readCheckpoint(end.audit?.checkpoint ?? null, key, "the archive's audit checkpoint");
  await assertEmpty(db);
  await db.$transaction(async (tx) => {
    for (const t of TABLES) await insertAll(tx, t.name, rows.get(t.name)!);
    await replayRevisionStates(tx, rows.get("AnalysisRevision")!);
    await tx.$queryRawUnsafe(`SELECT setval(pg_get_serial_sequence('"AuditEvent"', 'id'), GREATEST((SELECT MAX("id") FROM "AuditEvent"), 1))`);
  }, { timeout: 600_000, maxWait: 10_000 });
  const rechained = header.version === 1 ? await rechainLegacyEvents(db, key) : null;
  const audit = await verifyGroupAuditChain(db, header.group.id, { key, ...(checkpoint ? { checkpoint } : {}) });
  const seals = await verifySealedRevisions(db, header.group.id, end.sealed);
  const auditMatchesArchive = audit.ok && (checkpoint ? audit.checked === (end.counts.AuditEvent ?? 0) : true);
  // The sealed revisions were compared with the archive above; here stored data only (no engine re-run).
  const integrity = await runIntegrityChecks({ db, key, groupIds: [header.group.id], engine: false });
  const ok = audit.ok && auditMatchesArchive && seals.ok && integrity.ok;
  return { ok, group: header.group, counts: end.counts, audit, auditMatchesArchive, rechained, seals, integrity: integrity.findings };
}
