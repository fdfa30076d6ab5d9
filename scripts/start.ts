/**
 * `npm start`: the whole app with one command. Without DATABASE_URL it starts the embedded
 * PostgreSQL (data under .data/pg), applies migrations, seeds the invented demo scenario once,
 * builds the app if the build is missing or older than the sources, and serves it on
 * http://localhost:3000. Ctrl-C stops the server and the database cleanly.
 *
 * Options: --port N (or PORT), --data-dir DIR (default .data), --fresh (wipe DIR first),
 *          --no-seed, --dev (next dev instead of a production build), --no-build (serve the
 *          existing build as it is; the test runner builds just before the browser tests),
 *          --no-worker (do not start the one background-job worker that `npm start` runs).
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync, statSync, readdirSync, rmSync } from "node:fs";
import { join } from "node:path";
import { randomBytes } from "node:crypto";
import { startEmbeddedDatabase, type EmbeddedDatabase } from "../lib/server/db/embedded";
import { migrate } from "../lib/server/db/migrate";
import { SERVER_NODE_FLAGS } from "../lib/server/nodeFlags";

function flag(name: string): boolean {
  return process.argv.includes(`--${name}`);
}
function option(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const port = Number(option("port") ?? process.env.PORT ?? 3000);
const dataDir = option("data-dir") ?? ".data";
const dev = flag("dev");
process.env.NEXT_TELEMETRY_DISABLED = "1";

function secret(): string {
  if (process.env.NEXTAUTH_SECRET) return process.env.NEXTAUTH_SECRET;
  const file = join(dataDir, "nextauth-secret");
  if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString("base64url"), { mode: 0o600 });
  return readFileSync(file, "utf8").trim();
}

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === "generated" || entry.name.startsWith(".")) continue;
    const path = join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(path) : statSync(path).mtimeMs);
  }
  return newest;
}

/** Seconds of a cold `next build` on a 2-core machine (measured for this app: about 2 minutes). */
const TYPICAL_BUILD_S = 120;
const PROGRESS_EVERY_MS = 10_000;

/**
 * Build when `.next/BUILD_ID` is missing or older than the sources. Says that it builds and roughly
 * how long it takes (the last build's time on this machine, kept in DIR/last-build.json, else the
 * typical figure), shows the build's own output, and prints a line every 10 s while it runs.
 */
async function buildIfStale(): Promise<void> {
  const marker = join(".next", "BUILD_ID");
  const sources = Math.max(newestMtime("app"), newestMtime("lib"), statSync("next.config.js").mtimeMs);
  if (existsSync(marker) && statSync(marker).mtimeMs > sources) return;
  const record = join(dataDir, "last-build.json");
  let lastS: number | null = null;
  try {
    lastS = (JSON.parse(readFileSync(record, "utf8")) as { seconds?: number }).seconds ?? null;
  } catch {
    lastS = null;
  }
  const expect = lastS !== null ? `the last build here took ${Math.round(lastS)} s` : `about ${Math.round(TYPICAL_BUILD_S / 60)} minutes on a 2-core machine`;
  console.log(`heatbook: building the app (${existsSync(marker) ? "sources changed" : "first start"}): ${expect}; the build's own output follows`);
  const t0 = Date.now();
  const child = spawn(process.execPath, ["node_modules/next/dist/bin/next", "build"], { stdio: "inherit", env: process.env });
  const ticker = setInterval(() => {
    const s = Math.round((Date.now() - t0) / 1000);
    const total = lastS ?? TYPICAL_BUILD_S;
    console.log(`heatbook: still building … ${s} s${s < total ? ` of about ${Math.round(total)} s` : ""}`);
  }, PROGRESS_EVERY_MS);
  const code = await new Promise<number | null>((resolve) => child.once("exit", (c) => resolve(c)));
  clearInterval(ticker);
  if (code !== 0) throw new Error("next build failed (its output is above)");
  const seconds = (Date.now() - t0) / 1000;
  writeFileSync(record, JSON.stringify({ seconds, at: new Date().toISOString() }) + "\n");
  console.log(`heatbook: built in ${Math.round(seconds)} s`);
}

async function main(): Promise<void> {
  if (flag("fresh")) rmSync(dataDir, { recursive: true, force: true });
  mkdirSync(dataDir, { recursive: true });
  let embedded: EmbeddedDatabase | undefined;
  if (!process.env.DATABASE_URL) {
    embedded = await startEmbeddedDatabase({ dir: join(dataDir, "pg"), port: process.env.HEATBOOK_PG_PORT ? Number(process.env.HEATBOOK_PG_PORT) : undefined });
    process.env.DATABASE_URL = embedded.url;
    console.log(`heatbook: embedded PostgreSQL on port ${embedded.port} (data in ${embedded.dir})`);
  }
  const applied = await migrate(process.env.DATABASE_URL!);
  if (applied.length) console.log(`heatbook: applied migrations ${applied.join(", ")}`);
  if (!flag("no-seed")) {
    const { seedDemo } = await import("../lib/server/demo/seed");
    const { createDb } = await import("../lib/server/db/client");
    const db = createDb(process.env.DATABASE_URL!, 4);
    const seeded = await seedDemo(db);
    console.log(seeded ? "heatbook: demo data seeded (invented data, see README)" : "heatbook: demo data already present");
    await db.$disconnect();
  }
  process.env.NEXTAUTH_SECRET = secret();
  process.env.NEXTAUTH_URL ??= `http://localhost:${port}`;
  if (!dev && flag("no-build")) {
    if (!existsSync(join(".next", "BUILD_ID"))) throw new Error("--no-build, but there is no build: run `npx next build` first");
  } else if (!dev) await buildIfStale();
  const args = [...SERVER_NODE_FLAGS, "node_modules/next/dist/bin/next", dev ? "dev" : "start", "-H", "127.0.0.1", "-p", String(port)];
  const child: ChildProcess = spawn(process.execPath, args, { stdio: "inherit", env: process.env });
  console.log(`heatbook: serving on http://localhost:${port}`);
  // One job worker beside the app, so background jobs (series refits, large scans) run in the demo too.
  const worker: ChildProcess | null = flag("no-worker")
    ? null
    : spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--name", "npm-start"], { stdio: ["ignore", "inherit", "inherit"], env: process.env });
  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    if (child.exitCode === null) child.kill("SIGTERM");
    if (worker && worker.exitCode === null) worker.kill("SIGTERM");
    await new Promise((r) => (child.exitCode === null ? child.once("exit", r) : r(null)));
    if (worker) await new Promise((r) => (worker.exitCode === null ? worker.once("exit", r) : r(null)));
    if (embedded) await embedded.stop();
    process.exit(code);
  };
  process.on("SIGINT", () => void stop(0));
  process.on("SIGTERM", () => void stop(0));
  child.on("exit", (code) => void stop(code ?? 1));
}

main().catch((err) => {
  console.error(`heatbook: ${(err as Error).message}`);
  process.exit(1);
});
