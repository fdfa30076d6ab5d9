/**
 * Start-up upgrade of audit events written before per-group chains (seq NULL): the owner, with
 * the audit key, first checks them as the old single SHA-256 chain (recording whether it held),
 * then re-chains them — per group, in id order, seq 1, 2, …, each signed with the key — and
 * records in AuditChainUpgrade that events below a given id were re-chained at this upgrade.
 * The append-only trigger is switched off for this one transaction only (the owner can; the
 * runtime role cannot). Honest limit: the re-chained events are only as trustworthy as the
 * database was at the moment of the upgrade.
 */
import type { Db } from "./db/client";
import { GENESIS_HASH, eventMac, legacyChainHash, toChainedEvent } from "./audit";
import type { AuditKey } from "./auditKey";

export interface RechainResult {
  events: number;
  belowId: string;
  legacyChain: string;
}

/** Re-chain events without seq; null when there are none. Run as the owner. */
export async function rechainLegacyEvents(db: Db, key: AuditKey): Promise<RechainResult | null> {
  return db.$transaction(async (tx) => {
    await tx.$executeRawUnsafe(`LOCK TABLE "AuditEvent" IN EXCLUSIVE MODE`);
    const legacy = await tx.auditEvent.findMany({ where: { seq: null }, orderBy: { id: "asc" } });
    if (!legacy.length) return null;
    const chained = await tx.auditEvent.count({ where: { seq: { not: null } } });
    if (chained) throw new Error(`audit upgrade: ${legacy.length} events without a place in a chain sit beside ${chained} chained ones; refusing to re-chain (verify with \`heatbook audit verify\`)`);
    let prev = GENESIS_HASH;
    let legacyChain = `intact (${legacy.length} events)`;
    for (const r of legacy) {
      if (r.prevHash !== prev || legacyChainHash({ ...r }) !== r.hash) {
        legacyChain = `broken at event ${r.id} (${r.prevHash !== prev ? "link to the previous event does not match" : "content does not match its hash"})`;
        break;
      }
      prev = r.hash;
    }
    const heads = new Map<string | null, { seq: number; hash: string }>();
    const ids: string[] = [], seqs: number[] = [], prevs: string[] = [], hashes: string[] = [];
    for (const r of legacy) {
      const head = heads.get(r.groupId) ?? { seq: 0, hash: GENESIS_HASH };
      const e = { ...toChainedEvent(r), seq: head.seq + 1, prevHash: head.hash, keyId: key.id };
      const hash = eventMac(key, e);
      heads.set(r.groupId, { seq: e.seq, hash });
      ids.push(e.id); seqs.push(e.seq); prevs.push(e.prevHash); hashes.push(hash);
    }
    await tx.$executeRawUnsafe(`ALTER TABLE "AuditEvent" DISABLE TRIGGER "AuditEvent_append_only"`);
    for (let i = 0; i < ids.length; i += 1000) {
      const s = (a: unknown[]) => a.slice(i, i + 1000);
      await tx.$executeRawUnsafe(
        `UPDATE "AuditEvent" AS a SET "seq" = v.seq, "prevHash" = v.p, "hash" = v.h, "keyId" = $5
         FROM unnest($1::bigint[], $2::int[], $3::text[], $4::text[]) AS v(id, seq, p, h) WHERE a."id" = v.id`,
        s(ids), s(seqs), s(prevs), s(hashes), key.id);
    }
    await tx.$executeRawUnsafe(`ALTER TABLE "AuditEvent" ENABLE TRIGGER "AuditEvent_append_only"`);
    const belowId = (BigInt(legacy.at(-1)!.id) + 1n).toString();
    await tx.auditChainUpgrade.create({ data: { belowId: BigInt(belowId), events: legacy.length, keyId: key.id, legacyChain } });
    return { events: legacy.length, belowId, legacyChain };
  }, { timeout: 600_000, maxWait: 10_000 });
}
