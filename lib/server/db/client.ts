/**
 * The Prisma client, over `pg` through @prisma/adapter-pg (no native engine needed).
 * One client per connection string per process.
 */
import { PrismaPg } from "@prisma/adapter-pg";
import { PrismaClient } from "../generated/prisma/client";

export type Db = PrismaClient;

const clients = new Map<string, PrismaClient>();

/** A client for `url`, created once. Pool size from HEATBOOK_DB_POOL (default 10). */
export function createDb(url: string, poolSize = 10): PrismaClient {
  let client = clients.get(url);
  if (!client) {
    client = new PrismaClient({ adapter: new PrismaPg({ connectionString: url, max: poolSize }) });
    clients.set(url, client);
  }
  return client;
}

/** The app's client, from DATABASE_URL (set by scripts/start.ts for the embedded database). */
export function getDb(): PrismaClient {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: start the app with `npm start`, which starts its own PostgreSQL");
  return createDb(url, Number(process.env.HEATBOOK_DB_POOL ?? 10));
}
