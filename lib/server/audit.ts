/**
 * The audit trail: append-only (database triggers refuse UPDATE and DELETE; the runtime role has
 * only INSERT and SELECT on it), kept as one chain per group (and one for server-wide events,
 * groupId NULL). Each event has its place `seq` (1, 2, … within its chain), the previous event's
 * `hash` in `prevHash`, and as `hash` an HMAC-SHA256 under the audit key (auditKey.ts) over every
 * field including its id, group and seq. Without the key nobody can write an event that
 * verifies, so editing, inserting, reordering or re-chaining events is detected; deleting the
 * newest ones is detected against a checkpoint of the chain's head kept outside the database
 * (auditCheckpoint.ts). Verification: auditVerify.ts.
 */
import type { Db } from "./db/client";
import { contentHash } from "./hash";
import { auditKey, macOf, type AuditKey } from "./auditKey";

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

/** Everything an event's HMAC covers. */
export interface ChainedEvent {
  id: string;
  groupId: string | null;
  seq: number;
  actorId: string | null;
  at: Date;
  action: string;
  objectType: string;
  objectId: string;
  beforeHash: string | null;
  afterHash: string | null;
  detail: unknown;
  prevHash: string;
  keyId: string;
}

/** The `hash` an event must carry: HMAC-SHA256 under the key of its canonical content. */
export function eventMac(key: AuditKey, e: ChainedEvent): string {
  return macOf(key, {
    v: 2, id: e.id, groupId: e.groupId, seq: e.seq, actorId: e.actorId, at: e.at.toISOString(), action: e.action, objectType: e.objectType, objectId: e.objectId,
    beforeHash: e.beforeHash, afterHash: e.afterHash, detail: e.detail, prevHash: e.prevHash, keyId: e.keyId,
  });
}

/** A stored row as the chain functions read it. */
export function toChainedEvent(r: { id: bigint | string; groupId: string | null; seq: number | null; actorId: string | null; at: Date; action: string; objectType: string; objectId: string; beforeHash: string | null; afterHash: string | null; detail: unknown; prevHash: string; keyId: string | null }): ChainedEvent {
  return {
    id: String(r.id), groupId: r.groupId, seq: r.seq ?? 0, actorId: r.actorId, at: r.at, action: r.action, objectType: r.objectType, objectId: r.objectId,
    beforeHash: r.beforeHash, afterHash: r.afterHash, detail: r.detail, prevHash: r.prevHash, keyId: r.keyId ?? "",
  };
}

/** Append one event to its group's chain inside the caller's transaction (serialised per chain by an advisory lock). */
export async function recordAudit(tx: Tx, input: AuditInput, key: AuditKey = auditKey()): Promise<void> {
  const groupId = input.groupId ?? null;
  await tx.$queryRawUnsafe(`SELECT pg_advisory_xact_lock(${CHAIN_LOCK}, hashtext($1))::text`, groupId ?? "server");
  const last = await tx.auditEvent.findFirst({ where: { groupId, seq: { not: null } }, orderBy: { seq: "desc" }, select: { seq: true, hash: true } });
  const [{ id }] = await tx.$queryRawUnsafe<[{ id: string }]>(`SELECT nextval(pg_get_serial_sequence('"AuditEvent"', 'id'))::text AS id`);
  const e: ChainedEvent = {
    id,
    groupId,
    seq: (last?.seq ?? 0) + 1,
    actorId: input.actorId ?? null,
    at: new Date(),
    action: input.action,
    objectType: input.objectType,
    objectId: input.objectId,
    beforeHash: input.beforeHash ?? null,
    afterHash: input.afterHash ?? null,
    detail: input.detail ?? {},
    prevHash: last?.hash ?? GENESIS_HASH,
    keyId: key.id,
  };
  await tx.auditEvent.create({ data: { ...e, id: BigInt(e.id), detail: e.detail as object, hash: eventMac(key, e) } });
}

/**
 * The hash of the chain used before per-group chains (one SHA-256 chain over all groups, no
 * key). Kept only to check such events before they are re-chained (auditUpgrade.ts).
 */
export function legacyChainHash(row: { groupId: string | null; actorId: string | null; at: Date; action: string; objectType: string; objectId: string; beforeHash: string | null; afterHash: string | null; detail: unknown; prevHash: string }): string {
  const { groupId, actorId, at, action, objectType, objectId, beforeHash, afterHash, detail, prevHash } = row;
  return contentHash({ groupId, actorId, at: at.toISOString(), action, objectType, objectId, beforeHash, afterHash, detail, prevHash });
}

export { verifyAuditChain, verifyAuditChains, verifyGroupChain, type AuditReport, type ChainReport, type ChainProblem } from "./auditVerify";
