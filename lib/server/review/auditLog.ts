/**
 * The group's audit trail for its owners: events newest first, paged by id (keyset).
 * Hashes are shown so a reader can follow the chain; the chain itself is checked by
 * verifyAuditChain (lib/server/audit.ts).
 */
import type { Db } from "../db/client";
import { InputError } from "../../engine/errors";
import { authorise, type Member } from "../access";

export interface AuditEventView {
  id: string;
  at: string;
  actorId: string | null;
  actorName: string | null;
  action: string;
  objectType: string;
  objectId: string;
  beforeHash: string | null;
  afterHash: string | null;
  detail: unknown;
  prevHash: string;
  hash: string;
}

/** Owner-only (audit.read). `before`: an event id to page below; `take` 1–500 (default 100). */
export async function listAuditEvents(db: Db, member: Member, opts: { before?: string; take?: number } = {}): Promise<AuditEventView[]> {
  authorise(member, "audit.read");
  if (opts.before !== undefined && !/^\d{1,19}$/.test(opts.before)) throw new InputError(`invalid before: ${JSON.stringify(opts.before)} (an event id)`, { field: "before" });
  const take = Math.min(Math.max(Math.trunc(opts.take ?? 100), 1), 500);
  const rows = await db.auditEvent.findMany({
    where: { groupId: member.group.id, ...(opts.before ? { id: { lt: BigInt(opts.before) } } : {}) },
    orderBy: { id: "desc" },
    take,
  });
  const actorIds = [...new Set(rows.map((r) => r.actorId).filter((x): x is string => !!x))];
  const names = new Map((await db.user.findMany({ where: { id: { in: actorIds } }, select: { id: true, name: true } })).map((u) => [u.id, u.name]));
  return rows.map((r) => ({
    id: r.id.toString(), at: r.at.toISOString(), actorId: r.actorId, actorName: r.actorId ? (names.get(r.actorId) ?? null) : null, action: r.action,
    objectType: r.objectType, objectId: r.objectId, beforeHash: r.beforeHash, afterHash: r.afterHash, detail: r.detail, prevHash: r.prevHash, hash: r.hash,
  }));
}
