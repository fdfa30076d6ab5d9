/**
 * A fresh database per test file, cloned from the migrated template that globalSetup made.
 * Usage: `const t = await freshDatabase(); … afterAll(() => t.drop())`.
 */
import { inject } from "vitest";
import pg from "pg";
import { randomBytes } from "node:crypto";
import { createDb, type Db } from "../../lib/server/db/client";

export interface TestDatabase {
  url: string;
  db: Db;
  drop(): Promise<void>;
}

export async function freshDatabase(): Promise<TestDatabase> {
  const templateUrl = inject("templateDatabaseUrl");
  const template = new URL(templateUrl);
  const templateName = template.pathname.slice(1);
  const name = `t_${randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: Object.assign(new URL(template), { pathname: "/postgres" }).toString() });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}" TEMPLATE "${templateName}"`);
  await admin.end();
  const url = Object.assign(new URL(template), { pathname: `/${name}` }).toString();
  const db = createDb(url, 4);
  return {
    url,
    db,
    async drop() {
      await db.$disconnect();
      const c = new pg.Client({ connectionString: Object.assign(new URL(template), { pathname: "/postgres" }).toString() });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}
