/**
 * `heatbook audit verify`: walk the audit trail's hash chain in the database named by
 * DATABASE_URL (or --url) and name the first broken row; then check every sealed revision
 * against its snapshot (stored step rows, measurements, files, the seal's audit event, engine
 * re-run) and name the first mismatch. Exit 0 intact, 1 broken (row id and reason printed),
 * 2 bad usage or the database cannot be reached.
 */
import { PrismaPg } from "@prisma/adapter-pg";
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getString, parseArgs, type FlagSpec } from "../args";
import { PrismaClient } from "../../server/generated/prisma/client";
import { verifyAuditChain } from "../../server/audit";
import { verifySealedRevisions, describeMismatch } from "../../server/review/integrity";
import type { Db } from "../../server/db/client";

const FLAGS: Record<string, FlagSpec> = {
  url: { kind: "string", meta: "URL", help: "PostgreSQL connection string (default: $DATABASE_URL)" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = () => `usage: heatbook audit verify [--url URL] [--json]\n\n${formatFlagHelp(FLAGS)}\n\nexit 0 the chain is intact, 1 it is broken (first broken row named), 2 usage or connection error`;

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const [sub, ...rest] = argv;
  if (sub === "--help" || sub === "-h") { io.out(USAGE()); return 0; }
  if (sub !== "verify") { io.err(`heatbook audit: expected the subcommand verify\n${USAGE()}`); return 2; }
  let args;
  try {
    args = parseArgs(rest, FLAGS);
  } catch (err) {
    io.err(`heatbook audit verify: ${(err as Error).message}`);
    return 2;
  }
  if (getBoolean(args, "help")) { io.out(USAGE()); return 0; }
  const url = getString(args, "url") ?? io.env.DATABASE_URL;
  if (!url) { io.err("heatbook audit verify: set DATABASE_URL or pass --url"); return 2; }
  const db = new PrismaClient({ adapter: new PrismaPg({ connectionString: url, max: 2 }) });
  try {
    const r = await verifyAuditChain(db);
    // Sealed revisions against their snapshots (lib/server/review/integrity.ts), whole database.
    const seals = await verifySealedRevisions(db as unknown as Db);
    if (getBoolean(args, "json")) io.out(JSON.stringify({ ...r, seals }));
    else {
      if (r.ok) io.out(`audit chain intact: ${r.checked} events checked`);
      else io.out(`audit chain BROKEN at event ${r.firstBrokenId}: ${r.reason} (${r.checked} events before it check out)`);
      if (seals.ok) io.out(`sealed revisions verified: ${seals.checked} checked against their snapshots (stored steps, measurements, files, seal events, engine re-run)`);
      else {
        io.out(`sealed revisions NOT verified: ${seals.mismatches.length} mismatch(es) in ${seals.checked} sealed revisions; first: ${describeMismatch(seals.mismatches[0]!)}`);
        for (const m of seals.mismatches.slice(1, 20)) io.out(`  also: ${describeMismatch(m)}`);
      }
      for (const c of seals.contextChanged) io.out(`note: analysis ${c.analysisId} revision ${c.number}: ${c.what} (sealed numbers and sealed context unchanged)`);
    }
    return r.ok && seals.ok ? 0 : 1;
  } catch (err) {
    io.err(`heatbook audit verify: cannot read the audit trail: ${(err as Error).message}`);
    return 2;
  } finally {
    await db.$disconnect();
  }
}
