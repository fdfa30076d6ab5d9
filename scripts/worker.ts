/**
 * `npm run worker`: one job worker. Start as many as you like (on any machine that reaches the
 * database); they drain the same queue. Uses DATABASE_URL (the runtime role), else the embedded
 * database of `npm start` in --data-dir (default .data; its port and the runtime role's generated
 * login are stored there), and the audit key (HEATBOOK_AUDIT_KEY or HEATBOOK_AUDIT_KEY_FILE, else
 * the data folder's audit-key with the embedded database). SIGINT/SIGTERM stop it after the
 * job in hand (graceful, up to 30 s).
 *
 * Options: --name NAME (recorded in each attempt), --pause-ms N (wait between units of work),
 *          --maintenance-seconds N (how often this worker looks for jobs of dead workers; 30),
 *          --data-dir DIR (the app's data folder, when DATABASE_URL is not set; .data).
 */
import { join } from "node:path";
import { startWorker } from "../lib/server/jobs";
import { existsSync } from "node:fs";
import { auditKeyFromEnv } from "../lib/server/auditKey";
import { embeddedDatabaseUrl } from "../lib/server/db/embedded";

function option(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

// Without DATABASE_URL: the embedded database that `npm start` runs from the same data folder (its stored port).
const dataDir = option("data-dir") ?? ".data";
const url = process.env.DATABASE_URL ?? embeddedDatabaseUrl(join(dataDir, "pg"));
if (!url) {
  console.error(`worker: DATABASE_URL is not set and ${join(dataDir, "pg")} holds no embedded database (start the app once with \`npm start\`, or point DATABASE_URL at the runtime role's URL that it prints)`);
  process.exit(2);
}
if (!process.env.DATABASE_URL && !process.env.HEATBOOK_AUDIT_KEY && !process.env.HEATBOOK_AUDIT_KEY_FILE && existsSync(join(dataDir, "audit-key"))) {
  process.env.HEATBOOK_AUDIT_KEY_FILE = join(dataDir, "audit-key");
}
try {
  auditKeyFromEnv(); // jobs write audit events: without the key they would fail one by one
} catch (err) {
  console.error(`worker: ${(err as Error).message}`);
  process.exit(2);
}
const num = (v: string | undefined, name: string): number | undefined => {
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n) || n < 0) {
    console.error(`worker: invalid --${name}: ${v}`);
    process.exit(2);
  }
  return n;
};

const worker = await startWorker({
  url,
  name: option("name"),
  pauseMs: num(option("pause-ms") ?? process.env.HEATBOOK_JOB_PAUSE_MS, "pause-ms"),
  maintenanceIntervalSeconds: num(option("maintenance-seconds"), "maintenance-seconds"),
});
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  console.log(`worker ${worker.name}: stopping`);
  await worker.stop();
  process.exit(0);
};
process.on("SIGINT", () => void stop());
process.on("SIGTERM", () => void stop());
