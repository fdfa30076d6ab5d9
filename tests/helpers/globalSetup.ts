/**
 * Starts one embedded PostgreSQL for the whole vitest run (or uses TEST_DATABASE_URL's server),
 * migrates a template database, and hands its address to the test files, each of which
 * clones the template into a fresh database of its own (tests/helpers/db.ts).
 */
import type { TestProject } from "vitest/node";
import { rmSync } from "node:fs";
import pg from "pg";
import { startEmbeddedDatabase, type EmbeddedDatabase } from "../../lib/server/db/embedded";
import { migrate } from "../../lib/server/db/migrate";

declare module "vitest" {
  export interface ProvidedContext {
    templateDatabaseUrl: string;
  }
}

let server: EmbeddedDatabase | undefined;

export async function setup(project: TestProject): Promise<void> {
  let templateUrl: string;
  if (process.env.TEST_DATABASE_URL) {
    const admin = new URL(process.env.TEST_DATABASE_URL);
    templateUrl = await makeTemplate(admin.toString(), (db) => Object.assign(new URL(admin), { pathname: `/${db}` }).toString());
  } else {
    const dir = `.data/test-pg-${process.pid}`;
    rmSync(dir, { recursive: true, force: true });
    server = await startEmbeddedDatabase({ dir, database: "postgres" });
    templateUrl = await makeTemplate(server.url, server.urlFor);
  }
  project.provide("templateDatabaseUrl", templateUrl);
}

async function makeTemplate(adminUrl: string, urlFor: (db: string) => string): Promise<string> {
  const name = `heatbook_template_${process.pid}`;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  await client.query(`DROP DATABASE IF EXISTS "${name}"`);
  await client.query(`CREATE DATABASE "${name}"`);
  await client.end();
  const url = urlFor(name);
  await migrate(url);
  return url;
}

export async function teardown(): Promise<void> {
  if (server) {
    const dir = server.dir;
    await server.stop();
    rmSync(dir, { recursive: true, force: true });
    rmSync(`${dir}.log`, { force: true });
  }
}
