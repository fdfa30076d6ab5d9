/**
 * The runtime role (what the app and the workers log in as) in raw SQL: every way around the
 * review locks and the append-only audit trail that a superuser or a table owner has is refused
 * (permission denied, SQLSTATE 42501), while the owner still runs them. The sealed revision is
 * made by the owner in SQL, exactly as approval leaves it.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeReviewFixture, type ReviewFixture } from "../server/reviewFixtures";
import { checkRuntimeRole, TABLE_GRANTS } from "../../lib/server/db/roles";

let t: TestDatabase;
let f: ReviewFixture;
let runtime: pg.Client;
let owner: pg.Client;

/** The statement fails as the runtime role with "permission denied" (or `code`). */
async function denied(text: string, code = "42501"): Promise<void> {
  await expect(runtime.query(text)).rejects.toMatchObject({ code });
}

beforeAll(async () => {
  t = await freshDatabase();
  f = await makeReviewFixture(t.db);
  runtime = new pg.Client({ connectionString: t.url });
  owner = new pg.Client({ connectionString: t.ownerUrl });
  await runtime.connect();
  await owner.connect();
  await owner.query(`UPDATE "AnalysisRevision" SET state = 'in_review', "updatedAt" = now() WHERE id = $1`, [f.revisionId]);
  await owner.query(
    `UPDATE "AnalysisRevision" SET state = 'sealed', snapshot = $2, "contentHash" = 'h', "sealedById" = $3, "sealedAt" = now(), "updatedAt" = now() WHERE id = $1`,
    [f.revisionId, { inputs: { measurements: [{ id: f.measurementId }] } }, f.members.reviewer.userId],
  );
});
afterAll(async () => {
  await runtime.end();
  await owner.end();
  await t.drop();
});

describe("the runtime role", () => {
  it("is not a superuser, owns no table and holds no TRIGGER or TRUNCATE privilege", async () => {
    const me = (await runtime.query(`SELECT current_user AS u, rolsuper, rolcreaterole, rolcreatedb, rolbypassrls FROM pg_roles WHERE rolname = current_user`)).rows[0];
    expect(me).toMatchObject({ rolsuper: false, rolcreaterole: false, rolcreatedb: false, rolbypassrls: false });
    expect(me.u).not.toBe(new URL(t.ownerUrl).username);
    expect(await checkRuntimeRole(runtime)).toEqual({ ok: true, problems: [] });
    expect((await checkRuntimeRole(owner)).ok).toBe(false);
  });

  it("SET session_replication_role = replica is refused, in a session and in a transaction", async () => {
    await denied(`SET session_replication_role = replica`);
    await runtime.query("BEGIN");
    await expect(runtime.query(`SET LOCAL session_replication_role = replica`)).rejects.toMatchObject({ code: "42501" });
    await runtime.query("ROLLBACK");
    expect((await runtime.query(`SHOW session_replication_role`)).rows[0].session_replication_role).toBe("origin");
  });

  it("ALTER TABLE … DISABLE TRIGGER is refused on every locked table", async () => {
    for (const table of ["AuditEvent", "Step", "AnalysisRevision", "ReviewDecision", "Measurement", "StoredFile", "RevisionMeasurement"]) {
      await denied(`ALTER TABLE "${table}" DISABLE TRIGGER USER`);
      await denied(`ALTER TABLE "${table}" DISABLE TRIGGER ALL`);
    }
  });

  it("TRUNCATE is refused on the audit trail and the sealed tables", async () => {
    for (const table of ["AuditEvent", "Step", "AnalysisRevision", "ReviewDecision", "Measurement", "Sample"]) await denied(`TRUNCATE "${table}" CASCADE`);
  });

  it("CREATE TRIGGER, CREATE FUNCTION, CREATE TABLE, DROP TABLE and ALTER ROLE are refused", async () => {
    await denied(`CREATE FUNCTION public.hb_evil() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$`);
    await denied(`CREATE TRIGGER hb_evil BEFORE UPDATE ON "Step" FOR EACH ROW EXECUTE FUNCTION heatbook_audit_append_only()`);
    await denied(`CREATE OR REPLACE FUNCTION heatbook_step_guard() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$`);
    await denied(`CREATE TABLE public.hb_evil (x int)`);
    await denied(`DROP TABLE "AuditEvent"`);
    await denied(`DROP TRIGGER "Step_lock" ON "Step"`);
    await denied(`CREATE TEMPORARY TABLE hb_tmp (x int)`);
    await denied(`ALTER ROLE CURRENT_USER SUPERUSER`);
  });

  it("UPDATE and DELETE of append-only tables are refused before any trigger runs", async () => {
    for (const table of ["AuditEvent", "ReviewDecision", "StoredFile", "RevisionMeasurement"]) {
      await denied(`UPDATE "${table}" SET "${table === "RevisionMeasurement" ? "revisionId" : "id"}" = "${table === "RevisionMeasurement" ? "revisionId" : "id"}"`);
      await denied(`DELETE FROM "${table}"`);
    }
    await denied(`UPDATE "AuditChainUpgrade" SET events = 0`);
    await denied(`INSERT INTO "AuditChainUpgrade" ("belowId", events, "keyId", "legacyChain") VALUES (1, 0, 'x', 'x')`);
    await denied(`SELECT * FROM "_prisma_migrations"`);
  });

  it("UPDATE and DELETE of a sealed revision's steps and of the revision itself are refused by the locks", async () => {
    await expect(runtime.query(`UPDATE "Step" SET output = '{"gamma": 7.99}' WHERE "revisionId" = $1`, [f.revisionId])).rejects.toMatchObject({ code: "HBL01" });
    await expect(runtime.query(`DELETE FROM "Step" WHERE "revisionId" = $1`, [f.revisionId])).rejects.toMatchObject({ code: "HBL01" });
    await expect(runtime.query(`UPDATE "AnalysisRevision" SET "contentHash" = 'forged' WHERE id = $1`, [f.revisionId])).rejects.toMatchObject({ code: "HBL01" });
    await expect(runtime.query(`UPDATE "Measurement" SET "sampleId" = "sampleId" WHERE id = $1`, [f.measurementId])).rejects.toMatchObject({ code: "HBL01" });
  });

  it("has exactly the privileges TABLE_GRANTS lists on every table (read-write where not listed), and USAGE on the id sequences", async () => {
    const { rows } = await runtime.query<{ name: string; s: boolean; i: boolean; u: boolean; d: boolean; t: boolean; g: boolean }>(
      `SELECT c.relname AS name, has_table_privilege(c.oid, 'SELECT') AS s, has_table_privilege(c.oid, 'INSERT') AS i, has_table_privilege(c.oid, 'UPDATE') AS u,
              has_table_privilege(c.oid, 'DELETE') AS d, has_table_privilege(c.oid, 'TRUNCATE') AS t, has_table_privilege(c.oid, 'TRIGGER') AS g
       FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace WHERE n.nspname = 'public' AND c.relkind = 'r' ORDER BY 1`);
    expect(rows.length).toBeGreaterThan(15);
    for (const r of rows) {
      const want = TABLE_GRANTS[r.name] ?? ["SELECT", "INSERT", "UPDATE", "DELETE"];
      const got = (["SELECT", "INSERT", "UPDATE", "DELETE"] as const).filter((p) => r[({ SELECT: "s", INSERT: "i", UPDATE: "u", DELETE: "d" } as const)[p]]);
      expect({ table: r.name, privileges: got }).toEqual({ table: r.name, privileges: [...want] });
      expect({ table: r.name, truncate: r.t, trigger: r.g }).toEqual({ table: r.name, truncate: false, trigger: false });
    }
    const seq = (await runtime.query(`SELECT has_sequence_privilege(pg_get_serial_sequence('"AuditEvent"', 'id'), 'USAGE') AS ok`)).rows[0];
    expect(seq.ok).toBe(true);
  });

  it("the owner can still do what the runtime role cannot (the test is not vacuous)", async () => {
    await owner.query("BEGIN");
    await owner.query(`ALTER TABLE "AuditEvent" DISABLE TRIGGER USER`);
    await owner.query(`SET LOCAL session_replication_role = replica`);
    await owner.query("ROLLBACK");
  });
});
