/**
 * Verification of one group's records, used around backup and restore.
 *
 * The group's audit chain is its own (lib/server/audit.ts): seq 1, 2, … with every event signed
 * by the audit key, so a group restored into another database verifies on its own. The archive
 * carries a signed checkpoint of the chain's head (auditCheckpoint.ts); after a restore the chain
 * is verified against it, so events missing at the end, or a different head, are named too.
 */
import type { Db } from "../db/client";
import { contentHash } from "../hash";
import { verifyGroupChain, type ChainProblem } from "../auditVerify";
import { takeCheckpoint, checkpointHeads, type AuditCheckpoint } from "../auditCheckpoint";
import { auditKey as processKey, type AuditKey } from "../auditKey";
import type { SealedEntry } from "./format";
import { verifySealedRevisions as verifySnapshotsAgainstRows, describeMismatch } from "../review/integrity";

export interface GroupChainReport {
  ok: boolean;
  checked: number;
  firstBrokenId: string | null;
  reason: string | null;
  problems: ChainProblem[];
  headSeq: number | null;
  headHash: string | null;
  /** The signed head of the group's chain, as kept in the archive's closing line. */
  checkpoint: AuditCheckpoint;
}

/** Verify the group's chain with the key (the process's by default), against a checkpoint if given. */
export async function verifyGroupAuditChain(db: Db, groupId: string, opts: { key?: AuditKey; checkpoint?: AuditCheckpoint } = {}): Promise<GroupChainReport> {
  const key = opts.key ?? processKey();
  const head = opts.checkpoint ? checkpointHeads(opts.checkpoint).get(groupId) : undefined;
  const r = await verifyGroupChain(db, groupId, { key, ...(head ? { checkpoint: head } : {}) });
  if (opts.checkpoint && !head && r.checked > 0) r.problems.push({ kind: "inserted", groupId, eventId: null, seq: null, message: `${r.label}: the checkpoint records no events for this group, the database has ${r.checked}` });
  const problems = r.problems;
  return {
    ok: problems.length === 0, checked: r.checked, firstBrokenId: problems[0]?.eventId ?? null, reason: problems[0]?.message ?? null, problems,
    headSeq: r.head?.seq ?? null, headHash: r.head?.hash ?? null, checkpoint: await takeCheckpoint(db, key, [groupId]),
  };
}

export interface SealReport {
  ok: boolean;
  checked: number;
  problems: string[];
}

/** The group's sealed/replaced revisions: the snapshot still hashes to the stored contentHash. */
export async function sealedEntries(db: Db, groupId: string): Promise<SealedEntry[]> {
  const revs = await db.analysisRevision.findMany({ where: { analysis: { groupId }, state: { in: ["sealed", "replaced"] } }, select: { id: true, state: true, contentHash: true, snapshot: true }, orderBy: { id: "asc" } });
  return revs.map((r) => ({ revisionId: r.id, state: r.state, contentHash: r.contentHash, snapshotHash: r.snapshot === null ? null : contentHash(r.snapshot) }));
}

/**
 * Check each sealed revision recomputes, and (if given) matches the archive's entries exactly;
 * and (lib/server/review/integrity.ts) that the stored step rows, measurements, files and the
 * seal's audit event agree with each snapshot and the engine reproduces it, naming each mismatch.
 */
export async function verifySealedRevisions(db: Db, groupId: string, expected?: SealedEntry[]): Promise<SealReport> {
  const now = await sealedEntries(db, groupId);
  const problems: string[] = [];
  for (const e of now) if (e.snapshotHash !== e.contentHash) problems.push(`revision ${e.revisionId}: snapshot does not hash to its content hash`);
  // The engine re-run is Verify's and `heatbook audit verify`'s; restore checks what was carried.
  const deep = await verifySnapshotsAgainstRows(db, { groupId, engine: false });
  for (const m of deep.mismatches) if (m.check !== "content-hash") problems.push(describeMismatch(m));
  if (expected) {
    const byId = new Map(now.map((e) => [e.revisionId, e]));
    for (const e of expected) {
      const got = byId.get(e.revisionId);
      if (!got) problems.push(`revision ${e.revisionId}: missing`);
      else if (got.contentHash !== e.contentHash || got.snapshotHash !== e.snapshotHash || got.state !== e.state) problems.push(`revision ${e.revisionId}: differs from the archive`);
    }
    if (now.length !== expected.length) problems.push(`${now.length} sealed revisions, the archive has ${expected.length}`);
  }
  return { ok: problems.length === 0, checked: now.length, problems };
}
