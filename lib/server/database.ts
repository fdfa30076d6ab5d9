/**
 * The one door from app/ to the database: a handle to pass to lib/server functions, and the
 * readiness check. app/ never imports the client, the generated Prisma module or pg, and never
 * runs a query itself (lint: scripts/lint-boundaries.ts).
 */
import { getDb, sqlRows, type Db } from "./db/client";

/** The process's database handle, to hand to lib/server functions. */
export function database(): Db {
  return getDb();
}

/** Whether PostgreSQL answers `SELECT 1` (throws with the reason when it does not). */
export async function pingDatabase(): Promise<void> {
  await sqlRows(getDb(), "SELECT 1 AS one", []);
}

export type { Db };
