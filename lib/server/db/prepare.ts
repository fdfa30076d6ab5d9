/**
 * Everything the OWNER does to a database before the app (as the runtime role) uses it:
 * migrations, the job queue's schema and queues (pg-boss creates tables, which the runtime role
 * may not), the runtime role's grants (roles.ts; again after every migration, so new tables get
 * theirs), and re-chaining audit events from before per-group chains with the audit key.
 */
import pg from "pg";
import { migrate, readMigrations } from "./migrate";
import { applyRuntimeGrants } from "./roles";
import { PrismaPg } from "@prisma/adapter-pg";
import { PrismaClient } from "../generated/prisma/client";
import { startBoss } from "../jobs/queue";
import { rechainLegacyEvents, type RechainResult } from "../auditUpgrade";
import type { AuditKey } from "../auditKey";

export interface PrepareResult {
  applied: string[];
  rechained: RechainResult | null;
}

/** Prepare the database at `ownerUrl` for `runtimeRole`; see the module comment. */
export async function prepareDatabase(opts: { ownerUrl: string; runtimeRole: string; key: AuditKey; migrations?: ReturnType<typeof readMigrations>; queue?: boolean }): Promise<PrepareResult> {
  const applied = await migrate(opts.ownerUrl, opts.migrations);
  if (opts.queue !== false) {
    const boss = await startBoss(opts.ownerUrl, { supervise: false });
    await boss.stop({ graceful: false, wait: true });
  }
  const client = new pg.Client({ connectionString: opts.ownerUrl });
  await client.connect();
  try {
    await applyRuntimeGrants(client, opts.runtimeRole);
  } finally {
    await client.end();
  }
  const db = new PrismaClient({ adapter: new PrismaPg({ connectionString: opts.ownerUrl, max: 2 }) });
  try {
    return { applied, rechained: await rechainLegacyEvents(db, opts.key) };
  } finally {
    await db.$disconnect();
  }
}

/** The user name in a connection string. */
export function roleOf(url: string): string {
  const u = decodeURIComponent(new URL(url).username);
  if (!u) throw new Error("the database URL names no user");
  return u;
}
