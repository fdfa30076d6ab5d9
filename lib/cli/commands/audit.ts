/**
 * `heatbook audit verify` and `heatbook audit checkpoint`, run by an operator over the OWNER's
 * connection for the whole database.
 *
 *   verify      every per-group audit chain (signatures under the audit key, seq, links; against
 *               --checkpoint FILE if given) and every other integrity check of lib/server/integrity.ts;
 *               names each problem (event id and seq, group). Exit 0 intact, 1 problems found.
 *   checkpoint  verify, then write the signed heads of all chains to --out FILE (keep it outside
 *               the database's reach); refused (exit 1) when verification fails.
 *
 * Connection: --url URL, or --data-dir DIR (the embedded default: the owner's login and the key
 * are read from the data folder; the database is started for the command if it is not running),
 * or HEATBOOK_OWNER_DATABASE_URL, or DATABASE_URL. Key: --key-file FILE, HEATBOOK_AUDIT_KEY,
 * HEATBOOK_AUDIT_KEY_FILE, or DIR/audit-key. Exit 2: bad usage, no key, cannot connect.
 */
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { PrismaPg } from "@prisma/adapter-pg";
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getString, parseArgs, type FlagSpec } from "../args";
import { PrismaClient } from "../../server/generated/prisma/client";
import { auditKeyFromEnv, auditKeyFromText, type AuditKey } from "../../server/auditKey";
import { checkpointHeads, readCheckpoint, takeCheckpoint } from "../../server/auditCheckpoint";
import { runIntegrityChecks } from "../../server/integrity";
import { runningEmbeddedUrls } from "../../server/db/embeddedUrls";
import type { EmbeddedDatabase } from "../../server/db/embedded";

const FLAGS: Record<string, FlagSpec> = {
  url: { kind: "string", meta: "URL", help: "the owner's PostgreSQL connection string (default: $HEATBOOK_OWNER_DATABASE_URL, then $DATABASE_URL)" },
  "data-dir": { kind: "string", meta: "DIR", help: "an embedded default's data folder (`npm start --data-dir`, default .data): owner login and key from there" },
  "key-file": { kind: "string", meta: "FILE", help: "the audit key (default: $HEATBOOK_AUDIT_KEY, $HEATBOOK_AUDIT_KEY_FILE, DIR/audit-key)" },
  checkpoint: { kind: "string", meta: "FILE", help: "verify: a checkpoint written earlier by `audit checkpoint` (finds deleted newest events)" },
  group: { kind: "string", meta: "SLUG", help: "only this group's chain and records" },
  out: { kind: "string", meta: "FILE", help: "checkpoint: the file to write" },
  json: { kind: "boolean", help: "print one JSON object" },
  "skip-engine": { kind: "boolean", help: "do not re-run the engine on sealed revisions (stored rows, files and seal events are still compared with each snapshot)" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = () => `usage: heatbook audit verify [--url URL | --data-dir DIR] [--checkpoint FILE] [--group SLUG] [--skip-engine] [--json]
       heatbook audit checkpoint --out FILE [--url URL | --data-dir DIR] [--group SLUG]

${formatFlagHelp(FLAGS)}

exit 0 intact (checkpoint written), 1 problems found (each named), 2 usage, key or connection error`;

class UsageError extends Error {}

interface Target {
  url: string;
  key: AuditKey;
  close(): Promise<void>;
}

/** The owner's URL and the key, from the flags, the data folder or the environment. */
async function target(args: ReturnType<typeof parseArgs>, io: CliIo): Promise<Target> {
  const dataDir = getString(args, "data-dir");
  const keyFile = getString(args, "key-file");
  let embedded: EmbeddedDatabase | null = null;
  let url = getString(args, "url");
  if (!url && dataDir) {
    const credentialsFile = join(dataDir, "database-credentials.json");
    if (!existsSync(credentialsFile)) throw new UsageError(`${credentialsFile} not found: is ${dataDir} a Heatbook data folder? (\`npm start\` makes it on its first start)`);
    const running = runningEmbeddedUrls(join(dataDir, "pg"), "heatbook", credentialsFile);
    if (running) url = running.ownerUrl;
    else {
      const { startEmbeddedDatabase } = await import("../../server/db/embedded");
      embedded = await startEmbeddedDatabase({ dir: join(dataDir, "pg"), credentialsFile });
      url = embedded.ownerUrl;
    }
  }
  url ??= io.env.HEATBOOK_OWNER_DATABASE_URL ?? io.env.DATABASE_URL;
  if (!url) throw new UsageError("no database: pass --url or --data-dir, or set HEATBOOK_OWNER_DATABASE_URL");
  let key: AuditKey;
  try {
    if (keyFile) key = auditKeyFromText(readFileSync(keyFile, "utf8"), keyFile);
    else if (!io.env.HEATBOOK_AUDIT_KEY && !io.env.HEATBOOK_AUDIT_KEY_FILE && dataDir) key = auditKeyFromText(readFileSync(join(dataDir, "audit-key"), "utf8"), join(dataDir, "audit-key"));
    else key = auditKeyFromEnv(io.env);
  } catch (err) {
    await embedded?.stop();
    throw new UsageError((err as Error).message);
  }
  return { url, key, close: async () => void (await embedded?.stop()) };
}

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const [sub, ...rest] = argv;
  if (sub === "--help" || sub === "-h") { io.out(USAGE()); return 0; }
  if (sub !== "verify" && sub !== "checkpoint") { io.err(`heatbook audit: expected the subcommand verify or checkpoint\n${USAGE()}`); return 2; }
  const name = `heatbook audit ${sub}`;
  let t: Target | undefined;
  let db: PrismaClient | undefined;
  try {
    const args = parseArgs(rest, FLAGS);
    if (getBoolean(args, "help")) { io.out(USAGE()); return 0; }
    const out = getString(args, "out");
    if (sub === "checkpoint" && !out) throw new UsageError("missing --out FILE");
    const cpFile = getString(args, "checkpoint");
    t = await target(args, io);
    db = new PrismaClient({ adapter: new PrismaPg({ connectionString: t.url, max: 2 }) });
    let checkpoint;
    if (cpFile) {
      try {
        checkpoint = checkpointHeads(readCheckpoint(Buffer.from(io.readFile(cpFile)).toString("utf8"), t.key, cpFile));
      } catch (err) {
        throw new UsageError((err as Error).message);
      }
    }
    let groupIds: string[] | null = null;
    const slug = getString(args, "group");
    if (slug) {
      const g = await db.group.findFirst({ where: { slug }, select: { id: true } });
      if (!g) throw new UsageError(`no group with slug ${JSON.stringify(slug)}`);
      groupIds = [g.id];
    }
    const result = await runIntegrityChecks({ db, key: t.key, groupIds, engine: !getBoolean(args, "skip-engine"), ...(checkpoint ? { checkpoint } : {}) });
    if (sub === "checkpoint") {
      if (!result.ok) {
        io.err(`${name}: not written, verification failed:\n${report(result.findings)}`);
        return 1;
      }
      const cp = await takeCheckpoint(db, t.key, groupIds ?? undefined);
      writeFileSync(out!, JSON.stringify(cp, null, 2) + "\n");
      const summary = `wrote ${out}: heads of ${cp.heads.length} ${cp.heads.length === 1 ? "chain" : "chains"} (${cp.heads.map((h) => `${h.label} seq ${h.seq}`).join(", ") || "no events yet"}), signed with key ${cp.keyId}`;
      io.out(getBoolean(args, "json") ? JSON.stringify({ out, checkpoint: cp }) : summary);
      return 0;
    }
    if (getBoolean(args, "json")) io.out(JSON.stringify(result));
    else (result.ok ? io.out : io.err)(report(result.findings));
    return result.ok ? 0 : 1;
  } catch (err) {
    const usage = err instanceof UsageError || (err as Error).name === "InputError" || /^(unknown|missing|invalid)/i.test((err as Error).message);
    io.err(`${name}: ${usage ? "" : "cannot verify: "}${(err as Error).message}`);
    return 2;
  } finally {
    await db?.$disconnect();
    await t?.close();
  }
}

function report(findings: { check: string; ok: boolean; summary: string; problems: { where: string; message: string }[]; detail?: unknown }[]): string {
  const lines: string[] = [];
  for (const f of findings) {
    lines.push(f.summary);
    for (const p of f.problems.slice(0, 50)) lines.push(`  ${p.where}: ${p.message}`);
    if (f.problems.length > 50) lines.push(`  … and ${f.problems.length - 50} more (--json lists them all)`);
    const rechained = (f.detail as { rechained?: { at: string; belowId: string; events: number; legacyChain: string }[] } | undefined)?.rechained ?? [];
    for (const u of rechained) lines.push(`  note: events with id below ${u.belowId} (${u.events}) were re-chained at the upgrade of ${u.at.slice(0, 10)} ${u.at.slice(11, 16)} UTC; the old unkeyed chain was then ${u.legacyChain}`);
  }
  return lines.join("\n");
}
