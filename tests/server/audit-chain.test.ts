/**
 * The audit trail's tamper evidence: a row altered behind the append-only trigger (disabled
 * inside the test, then re-enabled) is named by verifyAuditChain and by `heatbook audit verify`
 * (exit 1); an intact chain gives exit 0; removal of a row breaks the next row's link.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { verifyAuditChain } from "../../lib/server/audit";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";

let t: TestDatabase;
let sql: pg.Client;

async function cli(argv: string[], env: Record<string, string | undefined>): Promise<{ code: number; out: string; err: string }> {
  let out = "", err = "";
  const io: CliIo = { out: (s) => (out += s + "\n"), err: (s) => (err += s + "\n"), readFile: () => { throw new Error("no files"); }, env };
  const code = await main(argv, io);
  return { code, out, err };
}

/** Run `sql` on AuditEvent with its append-only triggers off, then switch them back on. */
async function behindTheTrigger(text: string, params: unknown[]): Promise<void> {
  await sql.query(`ALTER TABLE "AuditEvent" DISABLE TRIGGER USER`);
  try {
    await sql.query(text, params);
  } finally {
    await sql.query(`ALTER TABLE "AuditEvent" ENABLE TRIGGER USER`);
  }
}

beforeAll(async () => {
  t = await freshDatabase();
  sql = new pg.Client({ connectionString: t.url });
  await sql.connect();
  const g = await makeGroup(t.db, "Audit group");
  for (const label of ["A-1", "A-2", "A-3", "A-4"]) await createSample(t.db, g.members.analyst, { label, formula: "Cu" });
});
afterAll(async () => { await sql.end(); await t.drop(); });

describe("audit chain verification", () => {
  it("heatbook audit verify on an intact chain exits 0 and counts the events", async () => {
    const n = Number((await sql.query(`SELECT count(*) FROM "AuditEvent"`)).rows[0].count);
    expect(n).toBeGreaterThanOrEqual(5);
    const r = await cli(["audit", "verify"], { DATABASE_URL: t.url });
    expect(r.code).toBe(0);
    expect(r.out).toMatch(new RegExp(`intact: ${n} events`));
  });

  it("heatbook audit verify without a database URL exits 2 and says so", async () => {
    const r = await cli(["audit", "verify"], {});
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/DATABASE_URL/);
    expect((await cli(["audit", "check"], { DATABASE_URL: t.url })).code).toBe(2);
  });

  it("the append-only trigger is back on after the tampering helper", async () => {
    await behindTheTrigger(`SELECT 1`, []);
    await expect(sql.query(`UPDATE "AuditEvent" SET action = 'x'`)).rejects.toMatchObject({ code: "HBA01" });
  });

  it("an edited row's content is named as the first broken row, by the library and the CLI (exit 1)", async () => {
    const { rows } = await sql.query(`SELECT id FROM "AuditEvent" ORDER BY id OFFSET 2 LIMIT 1`);
    const id = String(rows[0].id);
    await behindTheTrigger(`UPDATE "AuditEvent" SET detail = jsonb_set(detail, '{label}', '"forged"') WHERE id = $1`, [id]);
    expect(await verifyAuditChain(t.db)).toMatchObject({ ok: false, firstBrokenId: id, reason: "row content does not match its hash", checked: 2 });
    const r = await cli(["audit", "verify", "--json"], { DATABASE_URL: t.url });
    expect(r.code).toBe(1);
    expect(JSON.parse(r.out)).toMatchObject({ ok: false, firstBrokenId: id });
    const text = await cli(["audit", "verify", "--url", t.url], {});
    expect(text.out).toMatch(new RegExp(`BROKEN at event ${id}: row content does not match its hash`));
  });

  it("a row whose hash was overwritten is named, and a deleted row breaks the next row's link", async () => {
    const t2 = await freshDatabase();
    const c = new pg.Client({ connectionString: t2.url });
    await c.connect();
    try {
      const g = await makeGroup(t2.db, "Second");
      for (const label of ["B-1", "B-2", "B-3"]) await createSample(t2.db, g.members.analyst, { label, formula: "Ag" });
      const { rows } = await c.query(`SELECT id FROM "AuditEvent" ORDER BY id`);
      const victim = String(rows[1].id), next = String(rows[2].id);
      await c.query(`ALTER TABLE "AuditEvent" DISABLE TRIGGER USER`);
      await c.query(`UPDATE "AuditEvent" SET hash = repeat('a', 64) WHERE id = $1`, [victim]);
      await c.query(`ALTER TABLE "AuditEvent" ENABLE TRIGGER USER`);
      const r = await verifyAuditChain(t2.db);
      // the victim's own hash no longer matches its content: named first
      expect(r).toMatchObject({ ok: false, firstBrokenId: victim });
      await c.query(`ALTER TABLE "AuditEvent" DISABLE TRIGGER USER`);
      await c.query(`DELETE FROM "AuditEvent" WHERE id = $1`, [victim]);
      await c.query(`ALTER TABLE "AuditEvent" ENABLE TRIGGER USER`);
      expect(await verifyAuditChain(t2.db)).toMatchObject({ ok: false, firstBrokenId: next, reason: "link to the previous row does not match" });
    } finally {
      await c.end();
      await t2.drop();
    }
  });
});
