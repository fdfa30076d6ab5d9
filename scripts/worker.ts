/**
 * `npm run worker`: one job worker. Start as many as you like (on any machine that reaches the
 * database); they drain the same queue. Needs DATABASE_URL (the runtime role) and the audit key
 * (HEATBOOK_AUDIT_KEY or HEATBOOK_AUDIT_KEY_FILE). SIGINT/SIGTERM stop it after the
 * job in hand (graceful, up to 30 s).
 *
 * Options: --name NAME (recorded in each attempt), --pause-ms N (wait between units of work),
 *          --maintenance-seconds N (how often this worker looks for jobs of dead workers; 30).
 */
import { startWorker } from "../lib/server/jobs";
import { auditKeyFromEnv } from "../lib/server/auditKey";

function option(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("worker: DATABASE_URL is not set (the runtime role's URL, which `npm start` prints)");
  process.exit(2);
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
