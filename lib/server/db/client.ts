/**
 * The Prisma client, over `pg` through @prisma/adapter-pg (no native engine needed).
 * One client per connection string per process. The client's pg pool is ours, so the few
 * queries on every request's path (membership, notebook read, sample list) can run on it as
 * bare `pg` queries: the same connections, without Prisma's per-query work (which was a
 * quarter of a notebook read's CPU time under load; see "Scaling out" in README.md).
 */
import { createHash } from "node:crypto";
import pg from "pg";
import { PrismaPg } from "@prisma/adapter-pg";
import { PrismaClient } from "../generated/prisma/client";

export type Db = PrismaClient;

const clients = new Map<string, PrismaClient>();
const names = new Map<string, string>();

/** A prepared statement's name: from a hash of its text (the same text always gets the same name). */
function statementName(text: string): string {
  let name = names.get(text);
  if (!name) names.set(text, (name = `hb_${createHash("sha256").update(text).digest("hex").slice(0, 24)}`));
  return name;
}
const pools = new WeakMap<PrismaClient, pg.Pool>();

/** A client for `url`, created once. Pool size from HEATBOOK_DB_POOL (default 10). */
export function createDb(url: string, poolSize = 10): PrismaClient {
  let client = clients.get(url);
  if (!client) {
    const pool = new pg.Pool({ connectionString: url, max: poolSize });
    // An idle connection that PostgreSQL closes (a restart, a dropped test database) makes the
    // pool emit "error"; with no listener that would end the process. The Prisma adapter
    // listens only until it is disposed, so this one stays for the pool's whole life. The
    // pool opens a fresh connection for the next query.
    pool.on("error", (err) => {
      if (!pool.ending) console.warn(`database: an idle connection was closed (${err.message}); the next query opens a new one`);
    });
    // An interactive transaction waits up to 10 s for a free connection (Prisma's default, 2 s,
    // failed saves under the load benchmark's 128 connections with a pool of 10).
    client = new PrismaClient({ adapter: new PrismaPg(pool, { disposeExternalPool: true }), transactionOptions: { maxWait: 10_000, timeout: 20_000 } });
    clients.set(url, client);
    pools.set(client, pool);
  }
  return client;
}

/** The app's client, from DATABASE_URL (set by scripts/start.ts for the embedded database). */
export function getDb(): PrismaClient {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: start the app with `npm start`, which starts its own PostgreSQL");
  return createDb(url, Number(process.env.HEATBOOK_DB_POOL ?? 10));
}

/** SQL giving a UTC timestamp(3) column as ISO 8601 text with "Z" (as Date#toISOString writes it), NULL stays NULL. */
export function isoTimestampSql(column: string): string {
  return `to_char(${column}, 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;
}

/**
 * Rows of one parameterised SQL statement ($1, $2, … bound to `values`) on the client's own pool,
 * or through Prisma when the client has none (made elsewhere, or disconnected). Only for
 * statements whose columns are text, numbers, booleans or JSON text: pg's default parsers apply.
 */
export async function sqlRows<T>(db: Db, text: string, values: readonly unknown[]): Promise<T[]> {
  const pool = pools.get(db);
  // Named, so each connection parses and plans a statement once, not on every call.
  if (pool && !pool.ending && !pool.ended) return (await pool.query({ name: statementName(text), text, values: values as unknown[] })).rows as T[];
  return db.$queryRawUnsafe<T[]>(text, ...values);
}
