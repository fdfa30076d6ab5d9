/**
 * Starts one embedded PostgreSQL for the whole vitest run (or uses TEST_DATABASE_URL's server,
 * whose user must be a superuser), prepares a template database as the OWNER (migrations, job
 * queue, the runtime role's grants: lib/server/db/prepare.ts), and hands the test files its
 * address and the runtime role's login: each file clones the template into a fresh database of
 * its own (tests/helpers/db.ts) and runs the app code as the runtime role, so the tests meet
 * the real permissions.
 */
import type { TestProject } from "vitest/node";
import { rmSync } from "node:fs";
import { randomBytes } from "node:crypto";
import pg from "pg";
import { startEmbeddedDatabase, type EmbeddedDatabase } from "../../lib/server/db/embedded";
import { prepareDatabase } from "../../lib/server/db/prepare";
import { ensureRuntimeRole } from "../../lib/server/db/roles";
import { auditKeyFromEnv } from "../../lib/server/auditKey";

declare module "vitest" {
  export interface ProvidedContext {
    templateDatabaseUrl: string;
    runtimeLogin: { user: string; password: string };
  }
}

let server: EmbeddedDatabase | undefined;

export async function setup(project: TestProject): Promise<void> {
  let templateUrl: string;
  let login: { user: string; password: string };
  if (process.env.TEST_DATABASE_URL) {
    const admin = new URL(process.env.TEST_DATABASE_URL);
    login = { user: "heatbook_test_runtime", password: randomBytes(18).toString("base64url") };
    const c = new pg.Client({ connectionString: admin.toString() });
    await c.connect();
    await ensureRuntimeRole(c, login.user, login.password);
    await c.end();
    templateUrl = await makeTemplate(admin.toString(), (db) => Object.assign(new URL(admin), { pathname: `/${db}` }).toString(), login.user);
  } else {
    const dir = `.data/test-pg-${process.pid}`;
    rmSync(dir, { recursive: true, force: true });
    rmSync(`${dir}.credentials.json`, { force: true });
    server = await startEmbeddedDatabase({ dir, database: "postgres" });
    const runtime = new URL(server.runtimeUrl);
    login = { user: decodeURIComponent(runtime.username), password: decodeURIComponent(runtime.password) };
    templateUrl = await makeTemplate(server.ownerUrl, server.urlFor, login.user);
  }
  project.provide("templateDatabaseUrl", templateUrl);
  project.provide("runtimeLogin", login);
}

async function makeTemplate(adminUrl: string, urlFor: (db: string) => string, runtimeRole: string): Promise<string> {
  const name = `heatbook_template_${process.pid}`;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  await client.query(`DROP DATABASE IF EXISTS "${name}"`);
  await client.query(`CREATE DATABASE "${name}"`);
  await client.end();
  const url = urlFor(name);
  await prepareDatabase({ ownerUrl: url, runtimeRole, key: auditKeyFromEnv() });
  return url;
}

export async function teardown(): Promise<void> {
  if (server) {
    const dir = server.dir;
    await server.stop();
    rmSync(dir, { recursive: true, force: true });
    rmSync(`${dir}.log`, { force: true });
    rmSync(server.credentialsFile, { force: true });
  }
}
