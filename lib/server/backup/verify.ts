/**
 * Verification of one group's records, used around backup and restore.
 *
 * Group audit chain vs the global one (lib/server/audit.ts verifyAuditChain): the chain is
 * global — each row's prevHash is the hash of the previous row of ANY group. A group's own rows
 * therefore form a subsequence, and a restored database holds only that subsequence, so the
 * global walk (which demands prevHash = previous row's hash) cannot succeed there. The group
 * check instead verifies, for each of the group's rows in id order:
 *   1. its hash recomputes from its content and its stored prevHash (chainHash of audit.ts);
 *   2. where its prevHash names the hash of an earlier row of the group, that row is the
 *      immediately preceding group row (no group row removed or reordered in between);
 * and it reports a digest over the ordered (id, prevHash, hash) triples plus the head hash: two
 * databases hold the identical group chain exactly when these agree. Rows whose predecessor was
 * another group's are counted as `externalLinks` (they are verified by the global walk only).
 */
import type { Db } from "../db/client";
import { chainHash } from "../audit";
import { contentHash, sha256Hex } from "../hash";
import type { SealedEntry } from "./format";
import { verifySealedRevisions as verifySnapshotsAgainstRows, describeMismatch } from "../review/integrity";

export interface GroupChainReport {
  ok: boolean;
  checked: number;
  externalLinks: number;
  firstBrokenId: string | null;
  reason: string | null;
  headHash: string | null;
  digest: string;
}

/** Verify the group's audit rows; see the module comment. */
export async function verifyGroupAuditChain(db: Db, groupId: string): Promise<GroupChainReport> {
  const rows = await db.auditEvent.findMany({ where: { groupId }, orderBy: { id: "asc" } });
  const position = new Map<string, number>();
  let external = 0;
  const triples: string[] = [];
  for (const [i, r] of rows.entries()) {
    const broken = (reason: string): GroupChainReport => ({ ok: false, checked: i, externalLinks: external, firstBrokenId: r.id.toString(), reason, headHash: null, digest: "" });
    const expected = chainHash({ groupId: r.groupId, actorId: r.actorId, at: r.at, action: r.action, objectType: r.objectType, objectId: r.objectId, beforeHash: r.beforeHash, afterHash: r.afterHash, detail: r.detail, prevHash: r.prevHash });
    if (expected !== r.hash) return broken("row content does not match its hash");
    const linked = position.get(r.prevHash);
    if (linked === undefined) external++;
    else if (linked !== i - 1) return broken("links to a group row that is not the preceding one");
    position.set(r.hash, i);
    triples.push(`${r.id}:${r.prevHash}:${r.hash}`);
  }
  return { ok: true, checked: rows.length, externalLinks: external, firstBrokenId: null, reason: null, headHash: rows.at(-1)?.hash ?? null, digest: sha256Hex(triples.join("\n")) };
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
