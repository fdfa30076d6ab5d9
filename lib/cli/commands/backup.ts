/**
 * `heatbook backup export --group SLUG --out FILE` and `heatbook backup restore FILE`: a group's
 * archive straight from/to the database named by HEATBOOK_OWNER_DATABASE_URL (the owner role;
 * DATABASE_URL when that is not set) — an administrator's tool, no API token. The audit key
 * (HEATBOOK_AUDIT_KEY or HEATBOOK_AUDIT_KEY_FILE) signs the archive's checkpoint and verifies
 * the restored group's chain. Restore needs an empty, migrated database and prints the
 * verification report.
 * Exit 0 done and verified, 2 bad usage or input, 1 anything else (including a failed verification).
 */
import { writeFileSync } from "node:fs";
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getString, parseArgs, type FlagSpec } from "../args";
import { InputError } from "../../engine/errors";
import { createDb } from "../../server/db/client";
import { exportGroup, restoreGroup } from "../../server/backup";
import { auditKeyFromEnv } from "../../server/auditKey";

const FLAGS: Record<string, FlagSpec> = {
  group: { kind: "string", meta: "SLUG", help: "export: the group's slug or id" },
  out: { kind: "string", meta: "FILE", help: "export: archive to write (.hbk.gz)" },
  json: { kind: "boolean", help: "print the report as JSON" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = `usage: heatbook backup export --group SLUG --out FILE\n       heatbook backup restore FILE\n(uses HEATBOOK_OWNER_DATABASE_URL, else DATABASE_URL, and the audit key)\n\n${formatFlagHelp(FLAGS)}`;

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  let db: ReturnType<typeof createDb> | undefined;
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    const [action, file, ...rest] = args.positionals;
    const url = io.env.HEATBOOK_OWNER_DATABASE_URL ?? io.env.DATABASE_URL;
    if (!url) throw new InputError("set HEATBOOK_OWNER_DATABASE_URL to the database (the owner's login)", { field: "HEATBOOK_OWNER_DATABASE_URL" });
    let key;
    try {
      key = auditKeyFromEnv(io.env);
    } catch (err) {
      throw new InputError((err as Error).message, { field: "HEATBOOK_AUDIT_KEY" });
    }
    if (action === "export" && !file && !rest.length) {
      const group = getString(args, "group");
      const out = getString(args, "out");
      if (!group) throw new InputError("missing --group", { field: "group" });
      if (!out) throw new InputError("missing --out", { field: "out" });
      db = createDb(url, 2);
      const { archive, counts } = await exportGroup(db, group, key);
      writeFileSync(out, archive);
      io.out(getBoolean(args, "json") ? JSON.stringify({ out, bytes: archive.byteLength, counts }) : `wrote ${out} (${archive.byteLength} bytes): ${Object.entries(counts).map(([k, n]) => `${k} ${n}`).join(", ")}`);
      return 0;
    }
    if (action === "restore" && file && !rest.length) {
      db = createDb(url, 2);
      const report = await restoreGroup(db, io.readFile(file), key);
      const text = getBoolean(args, "json") ? JSON.stringify(report, null, 2)
        : `restored group ${report.group.slug}: audit chain ${report.audit.ok && report.auditMatchesArchive ? "verified identical" : `NOT verified (${report.audit.reason ?? "differs from the archive"})`} (${report.audit.checked} rows), sealed revisions ${report.seals.ok ? "verified" : "NOT verified"} (${report.seals.checked})${report.seals.problems.map((p) => `\n  ${p}`).join("")}${report.audit.problems.map((p) => `\n  audit: [${p.kind}] ${p.message}`).join("")}${report.rechained ? `\n  note: the archive predates per-group chains; its ${report.rechained.events} events were re-chained with this key (old chain: ${report.rechained.legacyChain})` : ""}${report.integrity.map((f) => `\n  ${f.summary}${f.problems.map((p) => `\n    ${p.where}: ${p.message}`).join("")}`).join("")}`;
      (report.ok ? io.out : io.err)(text);
      return report.ok ? 0 : 1;
    }
    throw new InputError("expected: backup export --group SLUG --out FILE | backup restore FILE");
  } catch (e) {
    const code = e instanceof InputError ? 2 : 1;
    io.err(`heatbook backup: ${(e as Error).message}${code === 2 ? `\n${USAGE}` : ""}`);
    return code;
  } finally {
    await db?.$disconnect();
  }
}
