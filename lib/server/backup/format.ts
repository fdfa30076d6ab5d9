/**
 * The group backup archive, our own format: gzip of UTF-8 JSON lines.
 *
 *   line 1      {"format":"heatbook-group-backup","version":1,"createdAt","engineVersion","group":{id,slug,name}}
 *   lines 2…    {"table":"<Model>","row":{…}}   one record per line, tables in TABLES order
 *   last line   {"end":{"counts":{table:n},"sealed":[{revisionId,contentHash,snapshotHash}],"audit":GroupChainReport (with .checkpoint, the signed head of the group's audit chain)}}
 *
 * Column values: JSON as stored; DateTime as ISO-8601 text; Bytes as base64; BigInt as decimal
 * text; which columns are which is listed per table below (so JSON content is never guessed at).
 * Users carry id, email, name and createdAt only — never password hashes: restored accounts
 * sign in after a password reset. Not exported: API tokens (credentials), invitations, notices,
 * sign-in attempts. RevisionMeasurement is not exported: PostgreSQL's sealing trigger rebuilds it.
 */

export const BACKUP_FORMAT = "heatbook-group-backup";
/** 2: audit events carry seq and keyId, and the closing line a signed checkpoint (audit.checkpoint). 1 is still read. */
export const BACKUP_VERSION = 2;

export interface TableSpec {
  /** Prisma model name (also the SQL table name). */
  readonly name: string;
  readonly dates?: readonly string[];
  readonly bytes?: readonly string[];
  readonly bigints?: readonly string[];
  /** Nullable JSON columns (need Prisma.DbNull on insert). */
  readonly nullableJson?: readonly string[];
}

/** Insert order (foreign keys point backwards). */
export const TABLES: readonly TableSpec[] = [
  { name: "Group", dates: ["createdAt"] },
  { name: "User", dates: ["createdAt"] },
  { name: "Membership", dates: ["createdAt"] },
  { name: "Sample", dates: ["createdAt", "updatedAt", "archivedAt"], nullableJson: ["latticeJson"] },
  { name: "StoredFile", dates: ["createdAt"], bytes: ["bytes"] },
  { name: "Measurement", dates: ["createdAt", "archivedAt"], bytes: ["temperatureK", "heatCapacity", "sigma", "fieldPointsT", "sourceLines"] },
  { name: "Analysis", dates: ["createdAt", "updatedAt", "archivedAt"] },
  { name: "AnalysisRevision", dates: ["submittedAt", "sealedAt", "createdAt", "updatedAt"], nullableJson: ["snapshot"] },
  { name: "Step", dates: ["computedAt", "createdAt", "updatedAt"], nullableJson: ["output"] },
  { name: "ReviewDecision", dates: ["at"] },
  { name: "Thread", dates: ["createdAt", "resolvedAt"], nullableJson: ["anchor"] },
  { name: "Comment", dates: ["createdAt"] },
  { name: "Series", dates: ["createdAt"] },
  { name: "SeriesMember" },
  { name: "AuditEvent", dates: ["at"], bigints: ["id"] },
];

export type Row = Record<string, unknown>;

export function tableSpec(name: string): TableSpec {
  const t = TABLES.find((x) => x.name === name);
  if (!t) throw new Error(`unknown table ${JSON.stringify(name)} in backup`);
  return t;
}

/** Database row → JSON-safe row. */
export function encodeRow(spec: TableSpec, row: Row): Row {
  const out: Row = { ...row };
  for (const c of spec.dates ?? []) if (out[c] instanceof Date) out[c] = (out[c] as Date).toISOString();
  for (const c of spec.bytes ?? []) if (out[c] != null) out[c] = Buffer.from(out[c] as Uint8Array).toString("base64");
  for (const c of spec.bigints ?? []) if (out[c] != null) out[c] = String(out[c]);
  return out;
}

/** JSON row → values for the database (Dates, Buffers, BigInts back). */
export function decodeRow(spec: TableSpec, row: Row): Row {
  const out: Row = { ...row };
  for (const c of spec.dates ?? []) if (out[c] != null) out[c] = new Date(out[c] as string);
  for (const c of spec.bytes ?? []) if (out[c] != null) out[c] = Buffer.from(out[c] as string, "base64");
  for (const c of spec.bigints ?? []) if (out[c] != null) out[c] = BigInt(out[c] as string);
  return out;
}

export interface BackupHeader {
  format: typeof BACKUP_FORMAT;
  version: number;
  createdAt: string;
  engineVersion: string;
  group: { id: string; slug: string; name: string };
}

export interface SealedEntry {
  revisionId: string;
  state: string;
  contentHash: string | null;
  /** contentHash(snapshot) at export time (canonical JSON, so key order in jsonb does not matter). */
  snapshotHash: string | null;
}
