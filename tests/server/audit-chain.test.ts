/**
 * The per-group audit chains' tamper evidence. Each case makes its own database with two groups,
 * tampers as the OWNER (append-only trigger switched off for the statement, as an attacker with
 * the owner's login could) but without the audit key, and checks that verifyAuditChains and
 * `heatbook audit verify` name what was done (kind, event id, seq, group).
 */
import { describe, it, expect, afterAll } from "vitest";
import pg from "pg";
import { rmSync, writeFileSync, readFileSync, mkdirSync } from "node:fs";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { verifyAuditChains, eventMac, legacyChainHash, toChainedEvent } from "../../lib/server/audit";
import { auditKey, auditKeyFromText } from "../../lib/server/auditKey";
import { checkpointHeads, takeCheckpoint } from "../../lib/server/auditCheckpoint";
import { verifyGroup } from "../../lib/server/integrity";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";

const open: { t: TestDatabase; sql: pg.Client }[] = [];
const files: string[] = [];
afterAll(async () => {
  for (const o of open) { await o.sql.end(); await o.t.drop(); }
  for (const f of files) rmSync(f, { force: true });
});

async function cli(argv: string[], env: Record<string, string | undefined> = { HEATBOOK_AUDIT_KEY: process.env.HEATBOOK_AUDIT_KEY }): Promise<{ code: number; out: string; err: string }> {
  let out = "", err = "";
  const io: CliIo = { out: (s) => (out += s + "\n"), err: (s) => (err += s + "\n"), readFile: (p) => readFileSync(p), env };
  return { code: await main(argv, io), out, err };
}

/** A database with groups A (5 samples) and B (2 samples); `sql` is the owner's connection. */
async function scenario(): Promise<{ t: TestDatabase; sql: pg.Client; A: GroupFixture; B: GroupFixture }> {
  const t = await freshDatabase();
  const sql = new pg.Client({ connectionString: t.ownerUrl });
  await sql.connect();
  open.push({ t, sql });
  const A = await makeGroup(t.db, "Chain A");
  const B = await makeGroup(t.db, "Chain B");
  for (const label of ["A-1", "A-2", "A-3", "A-4", "A-5"]) await createSample(t.db, A.members.analyst, { label, formula: "Cu" });
  for (const label of ["B-1", "B-2"]) await createSample(t.db, B.members.analyst, { label, formula: "Nb" });
  return { t, sql, A, B };
}

/** Run statements as the owner with AuditEvent's append-only trigger and the seq index out of the way. */
async function tamper(sql: pg.Client, statements: [string, unknown[]][]): Promise<void> {
  await sql.query("BEGIN");
  await sql.query(`ALTER TABLE "AuditEvent" DISABLE TRIGGER USER`);
  await sql.query(`DROP INDEX IF EXISTS "AuditEvent_groupId_seq_key"`);
  for (const [text, params] of statements) await sql.query(text, params);
  await sql.query(`ALTER TABLE "AuditEvent" ENABLE TRIGGER USER`);
  await sql.query("COMMIT");
}

async function eventsOf(sql: pg.Client, groupId: string): Promise<{ id: string; seq: number; hash: string; prevHash: string }[]> {
  return (await sql.query(`SELECT id::text AS id, seq, hash, "prevHash" FROM "AuditEvent" WHERE "groupId" = $1 ORDER BY seq`, [groupId])).rows;
}

describe("verifyAuditChains on untouched chains", () => {
  it("verifyAuditChains finds one signed chain per group and `heatbook audit verify` exits 0", async () => {
    const { t, A, B } = await scenario();
    const r = await verifyAuditChains(t.db);
    expect(r).toMatchObject({ ok: true, problems: [] });
    const a = r.chains.find((c) => c.groupId === A.groupId)!;
    const b = r.chains.find((c) => c.groupId === B.groupId)!;
    expect(a.head!.seq).toBe(a.checked);
    expect(b.head!.seq).toBe(b.checked);
    expect(a.checked).toBeGreaterThan(b.checked);
    const v = await cli(["audit", "verify", "--url", t.ownerUrl]);
    expect(v.code).toBe(0);
    expect(v.out).toMatch(new RegExp(`audit chains intact: ${r.chains.length} chains, ${r.checked} events`));
  });

  it("verifyGroup counts only the group's own events (what its owner sees)", async () => {
    const { t, A, B } = await scenario();
    const own = await t.db.auditEvent.count({ where: { groupId: A.groupId } });
    const all = await t.db.auditEvent.count();
    expect(all).toBeGreaterThan(own);
    const v = await verifyGroup(t.db, A.groupId, auditKey());
    expect(v.chain).toMatchObject({ ok: true, checked: own, headSeq: own });
    expect((await verifyGroup(t.db, B.groupId, auditKey())).chain.checked).toBe(await t.db.auditEvent.count({ where: { groupId: B.groupId } }));
  });

  it("heatbook audit verify without a database, without a key, or with an unknown subcommand exits 2 and says which", async () => {
    expect((await cli(["audit", "verify"], { HEATBOOK_AUDIT_KEY: process.env.HEATBOOK_AUDIT_KEY })).err).toMatch(/no database/);
    const noKey = await cli(["audit", "verify", "--url", "postgresql://x@127.0.0.1:1/x"], {});
    expect(noKey.code).toBe(2);
    expect(noKey.err).toMatch(/HEATBOOK_AUDIT_KEY/);
    expect((await cli(["audit", "check"])).code).toBe(2);
  });
});

describe("verifyAuditChains on tampered chains", () => {
  it("an edited event (re-attributed to another user) is named as edited with its id, seq and group; the CLI exits 1", async () => {
    const { t, sql, A, B } = await scenario();
    const ev = (await eventsOf(sql, A.groupId))[2]!;
    await tamper(sql, [[`UPDATE "AuditEvent" SET "actorId" = $2 WHERE id = $1`, [ev.id, B.members.owner.userId]]]);
    const r = await verifyAuditChains(t.db);
    expect(r.problems).toEqual([expect.objectContaining({ kind: "edited", eventId: ev.id, seq: 3, groupId: A.groupId })]);
    expect(r.problems[0]!.message).toMatch(new RegExp(`group ${A.slug}: event ${ev.id} \\(seq 3\\) no longer matches its signature`));
    const v = await cli(["audit", "verify", "--url", t.ownerUrl]);
    expect(v.code).toBe(1);
    expect(v.err).toMatch(new RegExp(`event ${ev.id} \\(seq 3\\): \\[edited\\]`));
    expect(r.chains.find((c) => c.groupId === B.groupId)!.ok).toBe(true);
  });

  it("a deleted middle event is named as deleted with the missing seq", async () => {
    const { t, sql, A } = await scenario();
    const evs = await eventsOf(sql, A.groupId);
    await tamper(sql, [[`DELETE FROM "AuditEvent" WHERE id = $1`, [evs[1]!.id]]]);
    const r = await verifyAuditChains(t.db);
    expect(r.problems).toEqual([expect.objectContaining({ kind: "deleted", eventId: evs[2]!.id, seq: 3 })]);
    expect(r.problems[0]!.message).toMatch(/the event at seq 2 is missing before event \d+ \(seq 3\)/);
  });

  it("deleting the newest events passes without a checkpoint and is named against a later checkpoint (library and CLI)", async () => {
    const { t, sql, A } = await scenario();
    mkdirSync(".data", { recursive: true });
    const file = `.data/audit-checkpoint-${process.pid}-${Date.now()}.json`;
    files.push(file);
    const written = await cli(["audit", "checkpoint", "--url", t.ownerUrl, "--out", file]);
    expect(written.code).toBe(0);
    const evs = await eventsOf(sql, A.groupId);
    const n = evs.length;
    await tamper(sql, [[`DELETE FROM "AuditEvent" WHERE id = ANY($1::bigint[])`, [[evs[n - 1]!.id, evs[n - 2]!.id]]]]);
    expect((await verifyAuditChains(t.db)).ok).toBe(true);
    const cp = checkpointHeads(JSON.parse(readFileSync(file, "utf8")));
    const r = await verifyAuditChains(t.db, { checkpoint: cp });
    expect(r.problems).toEqual([expect.objectContaining({ kind: "deleted", groupId: A.groupId, eventId: null })]);
    expect(r.problems[0]!.message).toMatch(new RegExp(`the newest events \\(seq ${n - 1}–${n}\\) are missing: the checkpoint of .* UTC records seq ${n} \\(event ${evs[n - 1]!.id}\\)`));
    const v = await cli(["audit", "verify", "--url", t.ownerUrl, "--checkpoint", file]);
    expect(v.code).toBe(1);
    expect(v.err).toMatch(/\[deleted\].*newest events/);
    expect((await cli(["audit", "verify", "--url", t.ownerUrl])).code).toBe(0);
  });

  it("a checkpoint edited by hand, or signed with another key, is refused (exit 2)", async () => {
    const { t } = await scenario();
    const cp = await takeCheckpoint(t.db, auditKey());
    const file = `.data/audit-checkpoint-forged-${process.pid}.json`;
    files.push(file);
    writeFileSync(file, JSON.stringify({ ...cp, heads: cp.heads.map((h) => ({ ...h, seq: h.seq - 1 })) }));
    const v = await cli(["audit", "verify", "--url", t.ownerUrl, "--checkpoint", file]);
    expect(v.code).toBe(2);
    expect(v.err).toMatch(/signature does not verify/);
    writeFileSync(file, JSON.stringify(await takeCheckpoint(t.db, auditKeyFromText("another-key-another-key-another-key"))));
    expect((await cli(["audit", "verify", "--url", t.ownerUrl, "--checkpoint", file])).err).toMatch(/signed by another audit key/);
  });

  it("an event inserted with a place already taken is named as inserted", async () => {
    const { t, sql, A } = await scenario();
    const evs = await eventsOf(sql, A.groupId);
    await tamper(sql, [[
      `INSERT INTO "AuditEvent" ("groupId", action, "objectType", "objectId", "prevHash", hash, seq, "keyId")
       SELECT "groupId", 'sample.delete', "objectType", "objectId", $2, md5('x') || md5('y'), 3, "keyId" FROM "AuditEvent" WHERE id = $1`, [evs[2]!.id, evs[1]!.hash]]]);
    const rows = (await sql.query(`SELECT id::text AS id FROM "AuditEvent" WHERE action = 'sample.delete'`)).rows;
    const r = await verifyAuditChains(t.db);
    expect(r.problems[0]).toMatchObject({ kind: "inserted", eventId: rows[0].id, seq: 3 });
  });

  it("an event inserted in the middle with the later ones renumbered is named as inserted, the shifted ones as reordered", async () => {
    const { t, sql, A } = await scenario();
    const evs = await eventsOf(sql, A.groupId);
    await tamper(sql, [
      [`UPDATE "AuditEvent" SET seq = seq + 1 WHERE "groupId" = $1 AND seq >= 3`, [A.groupId]],
      [`INSERT INTO "AuditEvent" ("groupId", action, "objectType", "objectId", "prevHash", hash, seq, "keyId")
        SELECT "groupId", 'sample.delete', "objectType", "objectId", $2, md5('x') || md5('y'), 3, "keyId" FROM "AuditEvent" WHERE id = $1`, [evs[2]!.id, evs[1]!.hash]],
    ]);
    const r = await verifyAuditChains(t.db);
    expect(r.problems[0]).toMatchObject({ kind: "inserted", seq: 3 });
    expect(r.problems[0]!.message).toMatch(/inserted/);
    expect(r.problems.slice(1).some((p) => p.kind === "reordered" && p.eventId === evs[2]!.id)).toBe(true);
  });

  it("an event appended by the runtime role (which may INSERT) with a made-up signature is named", async () => {
    const { t, sql, A } = await scenario();
    const head = (await eventsOf(sql, A.groupId)).at(-1)!;
    const runtime = new pg.Client({ connectionString: t.url });
    await runtime.connect();
    const { rows } = await runtime.query(
      `INSERT INTO "AuditEvent" ("groupId", action, "objectType", "objectId", "prevHash", hash, seq, "keyId")
       SELECT "groupId", 'revision.approve', 'revision', 'x', hash, md5('a') || md5('b'), seq + 1, "keyId" FROM "AuditEvent" WHERE id = $1 RETURNING id::text AS id`, [head.id]);
    await runtime.end();
    const r = await verifyAuditChains(t.db);
    expect(r.problems).toEqual([expect.objectContaining({ kind: "edited", eventId: rows[0].id, seq: head.seq + 1, groupId: A.groupId })]);
    expect(r.problems[0]!.message).toMatch(/the newest, is not signed by the audit key/);
  });

  it("two events whose places were swapped are named as reordered", async () => {
    const { t, sql, A } = await scenario();
    const evs = await eventsOf(sql, A.groupId);
    await tamper(sql, [
      [`UPDATE "AuditEvent" SET seq = 4 WHERE id = $1`, [evs[2]!.id]],
      [`UPDATE "AuditEvent" SET seq = 3 WHERE id = $1`, [evs[3]!.id]],
    ]);
    const r = await verifyAuditChains(t.db);
    expect(r.ok).toBe(false);
    expect(r.problems.every((p) => p.kind === "reordered")).toBe(true);
    expect(r.problems.map((p) => p.eventId)).toEqual(expect.arrayContaining([evs[2]!.id, evs[3]!.id]));
    expect(r.problems.find((p) => p.eventId === evs[3]!.id)!.message).toMatch(/was signed at seq 4: events were reordered/);
  });

  it("a chain recomputed without the key (another key, or the old unkeyed hash) is named as re-chained from the first event changed", async () => {
    const { t, sql, A } = await scenario();
    const wrong = auditKeyFromText("an-attackers-key-an-attackers-key-0000");
    const rows = await t.owner().auditEvent.findMany({ where: { groupId: A.groupId }, orderBy: { seq: "asc" } });
    let prev = rows[1]!.hash;
    const statements: [string, unknown[]][] = [];
    for (const r of rows.slice(2)) {
      const e = { ...toChainedEvent(r), actorId: r.actorId, prevHash: prev, detail: { ...(r.detail as object), label: "forged" } };
      const hash = eventMac(wrong, e); // keyId left as the real key's id: it is public
      statements.push([`UPDATE "AuditEvent" SET "prevHash" = $2, hash = $3, detail = $4 WHERE id = $1`, [e.id, prev, hash, e.detail]]);
      prev = hash;
    }
    await tamper(sql, statements);
    const r = await verifyAuditChains(t.db);
    expect(r.problems).toEqual([expect.objectContaining({ kind: "rechained", eventId: String(rows[2]!.id), seq: 3, groupId: A.groupId })]);
    expect(r.problems[0]!.message).toMatch(new RegExp(`from event ${rows[2]!.id} \\(seq 3\\) to event ${rows.at(-1)!.id} \\(seq ${rows.length}\\), ${rows.length - 2} events link to each other but none is signed by the audit key`));

    // The old single-chain hash function, and another key's id, are named too.
    const { sql: sql2, t: t2, A: A2 } = await scenario();
    const rows2 = await t2.owner().auditEvent.findMany({ where: { groupId: A2.groupId }, orderBy: { seq: "asc" } });
    const first = rows2[0]!;
    const forged = legacyChainHash({ ...first, prevHash: first.prevHash });
    await tamper(sql2, [[`UPDATE "AuditEvent" SET hash = $2, "keyId" = 'ffffffffffffffff' WHERE id = $1`, [String(first.id), forged]]]);
    const r2 = await verifyAuditChains(t2.db);
    expect(r2.problems[0]).toMatchObject({ kind: "rechained", eventId: String(first.id), seq: 1 });
    expect(r2.problems[0]!.message).toMatch(/signed by another key \(key id ffffffffffffffff/);
  });

  it("every event of a group deleted is named against a checkpoint that knew the group", async () => {
    const { t, sql, B } = await scenario();
    const cp = checkpointHeads(await takeCheckpoint(t.db, auditKey()));
    await tamper(sql, [[`DELETE FROM "AuditEvent" WHERE "groupId" = $1`, [B.groupId]]]);
    const r = await verifyAuditChains(t.db, { checkpoint: cp });
    expect(r.problems).toEqual([expect.objectContaining({ kind: "deleted", groupId: B.groupId })]);
  });
});
