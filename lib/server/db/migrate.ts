/**
 * Applies prisma/migrations/<name>/migration.sql in name order, each in its own transaction under
 * a PostgreSQL advisory lock, recording every one in Prisma's own `_prisma_migrations` table
 * (same columns, sha256 checksum of the file) so Prisma's tooling still recognises them.
 * Refuses to run when an applied migration's file has changed since it was applied.
 */
import pg from "pg";
import { createHash, randomUUID } from "node:crypto";
import { readdirSync, readFileSync, existsSync } from "node:fs";
import { join } from "node:path";

const LOCK_KEY = 72_201_806; // arbitrary, fixed: serialises concurrent migrators

export interface MigrationFile {
  name: string;
  sql: string;
  checksum: string;
}

export function readMigrations(dir = join(process.cwd(), "prisma", "migrations")): MigrationFile[] {
  return readdirSync(dir, { withFileTypes: true })
    .filter((d) => d.isDirectory() && existsSync(join(dir, d.name, "migration.sql")))
    .map((d) => d.name)
    .sort()
    .map((name) => {
      const sql = readFileSync(join(dir, name, "migration.sql"), "utf8");
      return { name, sql, checksum: createHash("sha256").update(sql).digest("hex") };
    });
}

const CREATE_TABLE = `CREATE TABLE IF NOT EXISTS "_prisma_migrations" (
  "id" VARCHAR(36) PRIMARY KEY NOT NULL,
  "checksum" VARCHAR(64) NOT NULL,
  "finished_at" TIMESTAMPTZ,
  "migration_name" VARCHAR(255) NOT NULL,
  "logs" TEXT,
  "rolled_back_at" TIMESTAMPTZ,
  "started_at" TIMESTAMPTZ NOT NULL DEFAULT now(),
  "applied_steps_count" INTEGER NOT NULL DEFAULT 0
)`;

/** Migrate the database at `url`; returns the names applied by this call. */
export async function migrate(url: string, migrations = readMigrations()): Promise<string[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const applied: string[] = [];
  try {
    await client.query("BEGIN");
    await client.query("SELECT pg_advisory_xact_lock($1)", [LOCK_KEY]);
    await client.query(CREATE_TABLE);
    const done = await client.query<{ migration_name: string; checksum: string }>(
      `SELECT migration_name, checksum FROM "_prisma_migrations" WHERE rolled_back_at IS NULL AND finished_at IS NOT NULL`,
    );
    await client.query("COMMIT");
    const byName = new Map(done.rows.map((r) => [r.migration_name, r.checksum]));
    for (const m of migrations) {
      const previous = byName.get(m.name);
      if (previous !== undefined) {
        if (previous !== m.checksum)
          throw new Error(`migration ${m.name} was edited after it was applied (checksum ${previous.slice(0, 12)}… ≠ ${m.checksum.slice(0, 12)}…); add a new migration instead`);
        continue;
      }
      await client.query("BEGIN");
      try {
        await client.query("SELECT pg_advisory_xact_lock($1)", [LOCK_KEY]);
        const again = await client.query(`SELECT 1 FROM "_prisma_migrations" WHERE migration_name = $1 AND finished_at IS NOT NULL`, [m.name]);
        if (again.rowCount) {
          await client.query("COMMIT");
          continue;
        }
        await client.query(m.sql);
        await client.query(
          `INSERT INTO "_prisma_migrations" (id, checksum, finished_at, migration_name, started_at, applied_steps_count) VALUES ($1, $2, now(), $3, now(), 1)`,
          [randomUUID(), m.checksum, m.name],
        );
        await client.query("COMMIT");
        applied.push(m.name);
      } catch (err) {
        await client.query("ROLLBACK");
        throw new Error(`migration ${m.name} failed and was rolled back: ${(err as Error).message}`);
      }
    }
  } finally {
    await client.end();
  }
  return applied;
}
