/**
 * The audit trail: append-only (database triggers refuse UPDATE and DELETE) with a hash chain:
 * each row's hash is SHA-256 over the previous row's hash and the row's own canonical content,
 * so any edit, insertion or removal after the fact breaks the chain at that row.
 */
import type { Db } from "./db/client";
import { contentHash } from "./hash";

export const GENESIS_HASH = "0".repeat(64);
const CHAIN_LOCK = 72_201_807;

type Tx = Omit<Db, "$connect" | "$disconnect" | "$on" | "$transaction" | "$extends">;

export interface AuditInput {
  groupId?: string | null;
  actorId?: string | null;
  action: string;
  objectType: string;
  objectId: string;
  beforeHash?: string | null;
  afterHash?: string | null;
  detail?: Record<string, unknown>;
}

interface ChainRow {
  groupId: string | null;
  actorId: string | null;
  at: Date;
  action: string;
  objectType: string;
  objectId: string;
  beforeHash: string | null;
  afterHash: string | null;
  detail: unknown;
  prevHash: string;
}

/** The hash a row must carry: covers the previous hash and every field of the row. */
export function chainHash(row: ChainRow): string {
  return contentHash({ ...row, at: row.at.toISOString() });
}

/** Append one event inside the caller's transaction (serialised by an advisory lock). */
export async function recordAudit(tx: Tx, input: AuditInput): Promise<void> {
  await tx.$executeRawUnsafe(`SELECT pg_advisory_xact_lock(${CHAIN_LOCK})`);
  const last = await tx.auditEvent.findFirst({ orderBy: { id: "desc" }, select: { hash: true } });
  const row: ChainRow = {
    groupId: input.groupId ?? null,
    actorId: input.actorId ?? null,
    at: new Date(),
    action: input.action,
    objectType: input.objectType,
    objectId: input.objectId,
    beforeHash: input.beforeHash ?? null,
    afterHash: input.afterHash ?? null,
    detail: input.detail ?? {},
    prevHash: last?.hash ?? GENESIS_HASH,
  };
  await tx.auditEvent.create({ data: { ...row, detail: row.detail as object, hash: chainHash(row) } });
}

export interface ChainReport {
  ok: boolean;
  checked: number;
  firstBrokenId: string | null;
  reason: string | null;
}

/** Walk the whole chain in id order; name the first row whose link or hash does not hold. */
export async function verifyAuditChain(db: Db): Promise<ChainReport> {
  let prev = GENESIS_HASH;
  let checked = 0;
  let cursor: bigint | undefined;
  for (;;) {
    const rows = await db.auditEvent.findMany({
      orderBy: { id: "asc" },
      take: 1000,
      ...(cursor !== undefined ? { cursor: { id: cursor }, skip: 1 } : {}),
    });
    if (rows.length === 0) break;
    for (const r of rows) {
      if (r.prevHash !== prev) return { ok: false, checked, firstBrokenId: r.id.toString(), reason: "link to the previous row does not match" };
      const expected = chainHash({
        groupId: r.groupId, actorId: r.actorId, at: r.at, action: r.action, objectType: r.objectType,
        objectId: r.objectId, beforeHash: r.beforeHash, afterHash: r.afterHash, detail: r.detail, prevHash: r.prevHash,
      });
      if (expected !== r.hash) return { ok: false, checked, firstBrokenId: r.id.toString(), reason: "row content does not match its hash" };
      prev = r.hash;
      checked++;
    }
    cursor = rows[rows.length - 1]!.id;
  }
  return { ok: true, checked, firstBrokenId: null, reason: null };
}
