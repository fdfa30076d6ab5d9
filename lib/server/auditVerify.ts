/**
 * Verification of the per-group audit chains (see audit.ts). For each chain, in seq order, it
 * names every event that breaks it and says how:
 *   deleted    a gap in seq (events missing), or — against a checkpoint — the newest ones gone;
 *   inserted   an event claiming a seq already held, or one not signed by the key whose
 *              neighbours link up without it;
 *   reordered  seq order disagrees with id order, or an event's signature holds at another seq;
 *   rechained  events that link to each other but are not signed by the audit key (recomputed
 *              without it), or signed by another key;
 *   edited     an event whose content no longer matches its signature, or that links to a
 *              predecessor other than the one now in its place;
 *   unchained  an event with no place in any chain (seq missing).
 * A checkpoint (auditCheckpoint.ts) adds what the chain alone cannot show: the newest events
 * deleted, or the head replaced. Each chain is checked on its own, so a group restored into
 * another database verifies by itself.
 */
import type { Db } from "./db/client";
import { GENESIS_HASH, eventMac, toChainedEvent, type ChainedEvent } from "./audit";
import { auditKey as processKey, type AuditKey } from "./auditKey";

export type ProblemKind = "deleted" | "inserted" | "reordered" | "rechained" | "edited" | "unchained";

export interface ChainProblem {
  kind: ProblemKind;
  groupId: string | null;
  /** The event concerned (null when the problem is events that are missing). */
  eventId: string | null;
  seq: number | null;
  message: string;
}

export interface ChainHead {
  seq: number;
  eventId: string;
  hash: string;
}

export interface ChainReport {
  groupId: string | null;
  /** The group's slug, or "server" for server-wide events. */
  label: string;
  ok: boolean;
  checked: number;
  head: ChainHead | null;
  problems: ChainProblem[];
}

/** What a checkpoint says about one chain (auditCheckpoint.ts). */
export interface CheckpointHead extends ChainHead {
  takenAt: string;
}

const MAX_PROBLEMS = 100;
const REORDER_WINDOW = 8;

type StoredEvent = ChainedEvent & { hash: string; seqMissing: boolean };

const where = (e: { id: string; seq: number }) => `event ${e.id} (seq ${e.seq})`;

/** Check one chain's events (any order) with the key, and against a checkpoint of its head if given. */
export function verifyChainEvents(events: StoredEvent[], key: AuditKey, groupId: string | null, label: string, checkpoint?: CheckpointHead): ChainReport {
  const rows = [...events].sort((a, b) => (a.seqMissing !== b.seqMissing ? (a.seqMissing ? 1 : -1) : a.seq - b.seq || (BigInt(a.id) < BigInt(b.id) ? -1 : 1)));
  const problems: ChainProblem[] = [];
  const add = (kind: ProblemKind, e: { id: string; seq: number } | null, message: string) => {
    if (problems.length < MAX_PROBLEMS) problems.push({ kind, groupId, eventId: e?.id ?? null, seq: e?.seq ?? null, message: `${label}: ${message}` });
  };
  const macOk = rows.map((r) => eventMac(key, r) === r.hash);
  let prev: StoredEvent | null = null;
  let prevOk = true;
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i]!;
    if (r.seqMissing) {
      add("unchained", r, `event ${r.id} has no place in the chain (no seq): written past the app, or never re-chained`);
      continue;
    }
    const expected = prev ? prev.seq + 1 : 1;
    if (r.seq < expected) add("inserted", r, `${where(r)} claims a place that event ${prev!.id} already holds`);
    else if (r.seq > expected) add("deleted", r, `${r.seq - expected === 1 ? `the event at seq ${expected} is` : `events at seq ${expected}–${r.seq - 1} are`} missing before ${where(r)}`);
    if (prev && BigInt(r.id) < BigInt(prev.id)) add("reordered", r, `${where(r)} has a lower id than ${where(prev)} before it: the order was changed`);
    if (!macOk[i]) {
      const skipTo = classifyUnsigned(rows, macOk, i, key, add);
      prevOk = false;
      prev = rows[skipTo]!;
      i = skipTo;
      continue;
    }
    if (r.seq === expected && prevOk && r.prevHash !== (prev?.hash ?? GENESIS_HASH))
      add("edited", r, `${where(r)} links to another predecessor than ${prev ? where(prev) : "the start of the chain"}: the event before it was replaced`);
    prev = r;
    prevOk = true;
  }
  const chained = rows.filter((r) => !r.seqMissing);
  const last = chained.at(-1);
  if (checkpoint) {
    if (!last || last.seq < checkpoint.seq) {
      const from = (last?.seq ?? 0) + 1;
      add("deleted", null, `the newest ${from === checkpoint.seq ? `event (seq ${from}) is` : `events (seq ${from}–${checkpoint.seq}) are`} missing: the checkpoint of ${checkpoint.takenAt} records seq ${checkpoint.seq} (event ${checkpoint.eventId})`);
    } else {
      const at = chained.find((r) => r.seq === checkpoint.seq);
      if (!at) add("deleted", null, `the event at seq ${checkpoint.seq} recorded by the checkpoint of ${checkpoint.takenAt} (event ${checkpoint.eventId}) is missing`);
      else if (at.hash !== checkpoint.hash || at.id !== checkpoint.eventId)
        add("edited", at, `${where(at)} differs from the event the checkpoint of ${checkpoint.takenAt} recorded at that place (event ${checkpoint.eventId})`);
    }
  }
  return { groupId, label, ok: problems.length === 0, checked: rows.length, head: last ? { seq: last.seq, eventId: last.id, hash: last.hash } : null, problems };
}

/** Name why event i is not signed; returns the index of the last event this explanation covers. */
function classifyUnsigned(rows: StoredEvent[], macOk: boolean[], i: number, key: AuditKey, add: (kind: ProblemKind, e: StoredEvent, message: string) => void): number {
  const r = rows[i]!;
  if (r.keyId !== key.id) {
    add("rechained", r, `${where(r)} is signed by another key (key id ${r.keyId || "none"}; this server's is ${key.id}): re-chained without the audit key`);
    return i;
  }
  for (let j = Math.max(0, i - REORDER_WINDOW); j < Math.min(rows.length, i + REORDER_WINDOW + 1); j++) {
    const s = rows[j]!.seq;
    if (s !== r.seq && eventMac(key, { ...r, seq: s }) === r.hash) {
      add("reordered", r, `${where(r)} was signed at seq ${s}: events were reordered`);
      return i;
    }
  }
  let end = i;
  while (end + 1 < rows.length && !macOk[end + 1] && !rows[end + 1]!.seqMissing && rows[end + 1]!.prevHash === rows[end]!.hash) end++;
  if (end > i) {
    add("rechained", r, `from ${where(r)} to ${where(rows[end]!)}, ${end - i + 1} events link to each other but none is signed by the audit key: the chain was recomputed without it (re-chained)`);
    return end;
  }
  const before = rows[i - 1];
  const after = rows[i + 1];
  // The next event links past this one to the one before, and is signed where it stands or at
  // this one's place (the later events were renumbered to make room).
  const afterSigned = after && (macOk[i + 1] || eventMac(key, { ...after, seq: r.seq }) === after.hash);
  if (after && afterSigned && after.prevHash === (before?.hash ?? GENESIS_HASH) && after.prevHash !== r.hash) {
    add("inserted", r, `${where(r)} is not signed by the audit key and its neighbours link up without it: inserted`);
    return i;
  }
  if (!after) add("edited", r, `${where(r)}, the newest, is not signed by the audit key: added past the app, or edited after it was written`);
  else add("edited", r, `${where(r)} no longer matches its signature: edited after it was written`);
  return i;
}

/** The group ids (null = server-wide) that have audit events, with labels. */
async function chainsOf(db: Db, groupId?: string | null): Promise<{ groupId: string | null; label: string }[]> {
  const ids = groupId !== undefined ? [groupId] : (await db.$queryRawUnsafe<{ g: string | null }[]>(`SELECT DISTINCT "groupId"::text AS g FROM "AuditEvent"`)).map((r) => r.g);
  const groups = await db.group.findMany({ where: { id: { in: ids.filter((x): x is string => x !== null) } }, select: { id: true, slug: true } });
  const slugs = new Map(groups.map((g) => [g.id, g.slug]));
  return ids.map((id) => ({ groupId: id, label: id === null ? "server" : `group ${slugs.get(id) ?? id}` }));
}

/** Load and verify one chain. */
export async function verifyGroupChain(db: Db, groupId: string | null, opts: { key?: AuditKey; checkpoint?: CheckpointHead; label?: string } = {}): Promise<ChainReport> {
  const key = opts.key ?? processKey();
  const label = opts.label ?? (await chainsOf(db, groupId))[0]!.label;
  const rows = await db.auditEvent.findMany({ where: { groupId } });
  const events = rows.map((r) => ({ ...toChainedEvent(r), hash: r.hash, seqMissing: r.seq === null }));
  return verifyChainEvents(events, key, groupId, label, opts.checkpoint);
}

export interface AuditReport {
  ok: boolean;
  /** Events checked over all chains. */
  checked: number;
  chains: ChainReport[];
  problems: ChainProblem[];
  /** The first problem's event and message (null when intact). */
  firstBrokenId: string | null;
  reason: string | null;
  /** Upgrades that re-chained events written before per-group chains (auditUpgrade.ts). */
  rechained: { at: string; belowId: string; events: number; legacyChain: string }[];
}

/** Every chain in the database (or the chains named), each against its checkpoint head if given. */
export async function verifyAuditChains(db: Db, opts: { key?: AuditKey; checkpoint?: Map<string | null, CheckpointHead>; groupIds?: (string | null)[] } = {}): Promise<AuditReport> {
  const key = opts.key ?? processKey();
  const present = await chainsOf(db);
  const wanted = opts.groupIds ? new Set(opts.groupIds) : null;
  const list = present.filter((c) => !wanted || wanted.has(c.groupId));
  // Chains the checkpoint knows but the database no longer has: every event deleted.
  for (const id of opts.checkpoint?.keys() ?? []) if (!present.some((c) => c.groupId === id) && (!wanted || wanted.has(id))) list.push({ groupId: id, label: id === null ? "server" : `group ${id}` });
  const chains: ChainReport[] = [];
  for (const c of list) chains.push(await verifyGroupChain(db, c.groupId, { key, label: c.label, ...(opts.checkpoint?.get(c.groupId) ? { checkpoint: opts.checkpoint.get(c.groupId)! } : {}) }));
  const problems = chains.flatMap((c) => c.problems);
  const upgrades = await db.auditChainUpgrade.findMany({ orderBy: { id: "asc" } });
  return {
    ok: problems.length === 0,
    checked: chains.reduce((n, c) => n + c.checked, 0),
    chains,
    problems,
    firstBrokenId: problems[0]?.eventId ?? null,
    reason: problems[0]?.message ?? null,
    rechained: upgrades.map((u) => ({ at: u.at.toISOString(), belowId: u.belowId.toString(), events: u.events, legacyChain: u.legacyChain })),
  };
}

/** Every chain of the database with the process's key (no checkpoint). */
export function verifyAuditChain(db: Db): Promise<AuditReport> {
  return verifyAuditChains(db);
}
