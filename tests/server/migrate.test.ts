/** The migration runner: idempotent, recorded in Prisma's table, and refuses edited migrations. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { migrate, readMigrations } from "../../lib/server/db/migrate";

let t: TestDatabase;
beforeAll(async () => { t = await freshDatabase(); });
afterAll(async () => { await t.drop(); });

describe("migrate", () => {
  it("migrate on an up-to-date database applies nothing", async () => {
    expect(await migrate(t.ownerUrl)).toEqual([]);
  });

  it("migrate records every migration with its sha256 checksum in _prisma_migrations", async () => {
    const c = new pg.Client({ connectionString: t.ownerUrl });
    await c.connect();
    const rows = (await c.query(`SELECT migration_name, checksum, finished_at FROM "_prisma_migrations" ORDER BY migration_name`)).rows;
    await c.end();
    const files = readMigrations();
    expect(rows.map((r) => r.migration_name)).toEqual(files.map((f) => f.name));
    expect(rows.map((r) => r.checksum)).toEqual(files.map((f) => f.checksum));
    expect(rows.every((r) => r.finished_at !== null)).toBe(true);
  });

  it("migrate refuses to run when an applied migration file was edited", async () => {
    const files = readMigrations();
    const edited = files.map((f, i) => (i === 0 ? { ...f, checksum: "0".repeat(64) } : f));
    await expect(migrate(t.ownerUrl, edited)).rejects.toThrow(/was edited after it was applied/);
  });

  it("migrate rolls back a failing migration and records nothing of it", async () => {
    const bad = [...readMigrations(), { name: "99999999999999_broken", sql: "CREATE TABLE half_done (x int); SELECT no_such_function();", checksum: "f".repeat(64) }];
    await expect(migrate(t.ownerUrl, bad)).rejects.toThrow(/99999999999999_broken failed and was rolled back/);
    const c = new pg.Client({ connectionString: t.ownerUrl });
    await c.connect();
    const table = await c.query(`SELECT to_regclass('half_done') AS t`);
    const rec = await c.query(`SELECT 1 FROM "_prisma_migrations" WHERE migration_name = '99999999999999_broken'`);
    await c.end();
    expect(table.rows[0].t).toBeNull();
    expect(rec.rowCount).toBe(0);
  });
});
