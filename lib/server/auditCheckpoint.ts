/**
 * Checkpoints of the audit chains' heads, kept OUTSIDE the database (a file the operator keeps,
 * `heatbook audit checkpoint --out FILE`; and the closing line of every group backup). A chain
 * that ends before a checkpoint's head, or whose event at that place differs, lost or changed
 * its newest events. The checkpoint is signed with the audit key, so a forged one is refused.
 *
 * File format (JSON, our own):
 *   {"format":"heatbook-audit-checkpoint","version":1,"takenAt":ISO,"keyId":"…",
 *    "heads":[{"groupId":UUID|null,"label":"group slug"|"server","seq":n,"eventId":"…","hash":"…"}],"mac":"…"}
 */
import type { Db } from "./db/client";
import { macOf, type AuditKey } from "./auditKey";
import type { CheckpointHead } from "./auditVerify";

export const CHECKPOINT_FORMAT = "heatbook-audit-checkpoint" as const;

export interface CheckpointEntry {
  groupId: string | null;
  label: string;
  seq: number;
  eventId: string;
  hash: string;
}

export interface AuditCheckpoint {
  format: typeof CHECKPOINT_FORMAT;
  version: 1;
  takenAt: string;
  keyId: string;
  heads: CheckpointEntry[];
  mac: string;
}

/** The current head of every chain (or of the listed groups' chains), signed. */
export async function takeCheckpoint(db: Db, key: AuditKey, groupIds?: (string | null)[]): Promise<AuditCheckpoint> {
  const heads = await db.$queryRawUnsafe<{ groupId: string | null; seq: number; id: string; hash: string; slug: string | null }[]>(
    `SELECT DISTINCT ON (e."groupId") e."groupId"::text AS "groupId", e."seq", e."id"::text AS id, e."hash", g."slug"
     FROM "AuditEvent" e LEFT JOIN "Group" g ON g."id" = e."groupId"
     WHERE e."seq" IS NOT NULL ORDER BY e."groupId", e."seq" DESC`);
  const wanted = groupIds ? new Set(groupIds) : null;
  const entries = heads
    .filter((h) => !wanted || wanted.has(h.groupId))
    .map((h) => ({ groupId: h.groupId, label: h.groupId === null ? "server" : `group ${h.slug ?? h.groupId}`, seq: Number(h.seq), eventId: h.id, hash: h.hash }));
  const body = { format: CHECKPOINT_FORMAT, version: 1 as const, takenAt: new Date().toISOString(), keyId: key.id, heads: entries };
  return { ...body, mac: macOf(key, body) };
}

/** Parse and authenticate a checkpoint (text of the file, or the object); throws naming what is wrong. */
export function readCheckpoint(input: string | unknown, key: AuditKey, where = "checkpoint"): AuditCheckpoint {
  let cp: AuditCheckpoint;
  try {
    cp = (typeof input === "string" ? JSON.parse(input) : input) as AuditCheckpoint;
  } catch (err) {
    throw new Error(`${where}: not JSON (${(err as Error).message})`);
  }
  if (!cp || cp.format !== CHECKPOINT_FORMAT || cp.version !== 1 || !Array.isArray(cp.heads)) throw new Error(`${where}: not a Heatbook audit checkpoint (format ${JSON.stringify(cp?.format)}, version ${JSON.stringify(cp?.version)})`);
  if (cp.keyId !== key.id) throw new Error(`${where}: signed by another audit key (key id ${cp.keyId}; this key's id is ${key.id})`);
  const { mac, ...body } = cp;
  if (macOf(key, body) !== mac) throw new Error(`${where}: its signature does not verify (the file was changed after it was written)`);
  return cp;
}

/** A checkpoint's heads keyed by group id, as verifyAuditChains takes them. */
export function checkpointHeads(cp: AuditCheckpoint): Map<string | null, CheckpointHead> {
  return new Map(cp.heads.map((h) => [h.groupId, { seq: h.seq, eventId: h.eventId, hash: h.hash, takenAt: formatWhen(cp.takenAt) }]));
}

function formatWhen(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
