/**
 * A fresh database per test file, cloned from the template that globalSetup prepared.
 * `url` and `db` log in as the RUNTIME role (what the app uses: the tests meet its real
 * permissions); `ownerUrl` and `owner()` as the owner (migrations, backup, restore, tampering
 * in tests). Usage: `const t = await freshDatabase(); … afterAll(() => t.drop())`.
 */
import { inject } from "vitest";
import pg from "pg";
import { randomBytes } from "node:crypto";
import { createDb, type Db } from "../../lib/server/db/client";
import { applyRuntimeGrants } from "../../lib/server/db/roles";

export interface TestDatabase {
  /** Runtime role. */
  url: string;
  db: Db;
  /** Owner (superuser of the test server). */
  ownerUrl: string;
  owner(): Db;
  drop(): Promise<void>;
}

export async function freshDatabase(): Promise<TestDatabase> {
  const templateUrl = inject("templateDatabaseUrl");
  const login = inject("runtimeLogin");
  const template = new URL(templateUrl);
  const templateName = template.pathname.slice(1);
  const name = `t_${randomBytes(6).toString("hex")}`;
  const adminUrl = Object.assign(new URL(template), { pathname: "/postgres" }).toString();
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE "${name}" TEMPLATE "${templateName}"`);
  await admin.end();
  const ownerUrl = Object.assign(new URL(template), { pathname: `/${name}` }).toString();
  // Database-level privileges (CONNECT, TEMPORARY) are not copied from the template: set them as start-up does.
  const grants = new pg.Client({ connectionString: ownerUrl });
  await grants.connect();
  await applyRuntimeGrants(grants, login.user);
  await grants.end();
  const runtime = new URL(ownerUrl);
  runtime.username = encodeURIComponent(login.user);
  runtime.password = encodeURIComponent(login.password);
  const url = runtime.toString();
  const db = createDb(url, 4);
  let ownerDb: Db | undefined;
  return {
    url,
    db,
    ownerUrl,
    owner: () => (ownerDb ??= createDb(ownerUrl, 2)),
    async drop() {
      await db.$disconnect();
      await ownerDb?.$disconnect();
      const c = new pg.Client({ connectionString: adminUrl });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
      await c.end();
    },
  };
}
