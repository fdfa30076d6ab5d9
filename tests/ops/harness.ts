/**
 * Scripted fault tests' plumbing: an embedded PostgreSQL of their own (started, stopped and
 * restarted on the same folder and port), real `next start` servers (one PID each, so SIGKILL
 * hits the server itself) on the built app in HEATBOOK_OPS_APP_DIR (default: this checkout;
 * run `npx next build` first), signing in over HTTP through next-auth's credentials flow, and
 * a fixture of users with passwords, a group and a measured sample with an analysis.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, rmSync, mkdirSync } from "node:fs";
import { join, resolve } from "node:path";
import { randomBytes } from "node:crypto";
import { startEmbeddedDatabase, freePort, type EmbeddedDatabase } from "../../lib/server/db/embedded";
import { prepareDatabase } from "../../lib/server/db/prepare";
import { RUNTIME_ROLE } from "../../lib/server/db/roles";
import { auditKeyFromText } from "../../lib/server/auditKey";
import { SERVER_NODE_FLAGS } from "../../lib/server/nodeFlags";
import { createDb, type Db } from "../../lib/server/db/client";
import { hashPassword } from "../../lib/server/auth/password";
import { createGroup } from "../../lib/server/groups";
import { memberOf, type Member } from "../../lib/server/access";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";

export const APP_DIR = resolve(process.env.HEATBOOK_OPS_APP_DIR ?? ".");
export const PASSWORD = "ops-test-password-1";

export interface OpsDatabase {
  /** The runtime role's URL (what the app and workers use); `ownerUrl` the owner's. */
  url: string;
  ownerUrl: string;
  port: number;
  dir: string;
  db: Db;
  /** Stop PostgreSQL (fast shutdown) and start it again on the same folder and port. */
  stop(): Promise<void>;
  start(): Promise<void>;
  close(): Promise<void>;
}

export async function opsDatabase(name: string): Promise<OpsDatabase> {
  const dir = resolve(`.data/ops-${name}-${process.pid}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(resolve(".data"), { recursive: true });
  let server: EmbeddedDatabase | null = await startEmbeddedDatabase({ dir, database: "heatbook" });
  const port = server.port;
  const url = server.runtimeUrl;
  const ownerUrl = server.ownerUrl;
  await prepareDatabase({ ownerUrl, runtimeRole: RUNTIME_ROLE, key: auditKeyFromText(AUDIT_KEY) });
  const db = createDb(url, 4);
  return {
    url, ownerUrl, port, dir, db,
    async stop() {
      await server?.stop();
      server = null;
    },
    async start() {
      server = await startEmbeddedDatabase({ dir, port, database: "heatbook" });
    },
    async close() {
      await db.$disconnect().catch(() => undefined);
      await server?.stop();
      rmSync(dir, { recursive: true, force: true });
      rmSync(`${dir}.log`, { force: true });
      rmSync(`${dir}.credentials.json`, { force: true });
    },
  };
}

export interface AppServer {
  base: string;
  port: number;
  child: ChildProcess;
  output: string[];
  kill(signal?: NodeJS.Signals): Promise<void>;
}

const SECRET = randomBytes(24).toString("base64url");
/** The audit key of this test process and the servers it starts. */
export const AUDIT_KEY = (process.env.HEATBOOK_AUDIT_KEY ??= randomBytes(32).toString("base64url"));

/**
 * Start `next start` on a free port against `url`; resolves when /signin answers.
 * The server gets the same Node flags as under `npm start` (lib/server/nodeFlags.ts); `nodeArgs`
 * add more before the script (e.g. `--trace-gc`, which NODE_OPTIONS refuses). The server's
 * stdout and stderr collect in `output`.
 */
export async function startApp(url: string, opts: { https?: boolean; port?: number; nodeArgs?: string[] } = {}): Promise<AppServer> {
  if (!existsSync(join(APP_DIR, ".next", "BUILD_ID"))) throw new Error(`no build in ${APP_DIR}/.next: run \`npx next build\` first (or set HEATBOOK_OPS_APP_DIR)`);
  const port = opts.port ?? (await freePort());
  const base = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, [...SERVER_NODE_FLAGS, ...(opts.nodeArgs ?? []), join(APP_DIR, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: APP_DIR,
    env: { ...process.env, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1", DATABASE_URL: url, NEXTAUTH_SECRET: SECRET, NEXTAUTH_URL: `${opts.https ? "https" : "http"}://127.0.0.1:${port}`, HEATBOOK_BCRYPT_COST: "4", HEATBOOK_DB_POOL: "10", HEATBOOK_AUDIT_KEY: AUDIT_KEY },
    stdio: ["ignore", "pipe", "pipe"],
  });
  const output: string[] = [];
  child.stdout!.on("data", (d) => output.push(String(d)));
  child.stderr!.on("data", (d) => output.push(String(d)));
  const server: AppServer = {
    base, port, child, output,
    async kill(signal = "SIGKILL") {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const exited = new Promise((ok) => child.once("exit", ok));
      child.kill(signal);
      await exited;
    },
  };
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`next start exited (${child.exitCode}): ${output.join("")}`);
    try {
      const r = await fetch(`${base}/signin`);
      if (r.status === 200) return server;
    } catch {
      /* not listening yet */
    }
    await new Promise((ok) => setTimeout(ok, 200));
  }
  await server.kill();
  throw new Error(`next start did not answer within 120 s: ${output.join("")}`);
}

function cookiesOf(res: Response): string[] {
  return res.headers.getSetCookie().map((c) => c.split(";")[0]!);
}

/** Sign in over HTTP; returns the Cookie header and the raw Set-Cookie lines of the session. */
export async function signIn(base: string, email: string, password = PASSWORD): Promise<{ cookie: string; setCookie: string[] }> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const jar = cookiesOf(csrf);
  const res = await fetch(`${base}/api/auth/callback/password`, {
    method: "POST", redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; "), origin: base },
    body: new URLSearchParams({ csrfToken, email, password, json: "true", callbackUrl: base }),
  });
  const setCookie = res.headers.getSetCookie();
  const session = setCookie.find((c) => /next-auth\.session-token=/.test(c));
  if (!session) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  return { cookie: [...jar, ...cookiesOf(res)].join("; "), setCookie };
}

export interface OpsFixture {
  slug: string;
  owner: Member & { email: string };
  analyst: Member & { email: string };
  reviewer: Member & { email: string };
  sampleId: string;
}

async function userWithPassword(db: Db, email: string, name: string): Promise<string> {
  const u = await db.user.create({ data: { email, name, passwordHash: await hashPassword(PASSWORD) } });
  return u.id;
}

/** Owner, analyst and reviewer with passwords, a group, and an empty sample. */
export async function opsFixture(db: Db, tag: string): Promise<OpsFixture> {
  process.env.HEATBOOK_BCRYPT_COST ??= "4";
  const ownerId = await userWithPassword(db, `owner-${tag}@ops.example`, "Ops owner");
  const group = await createGroup(db, ownerId, { name: `Ops ${tag}` });
  const add = async (role: "analyst" | "reviewer") => {
    const id = await userWithPassword(db, `${role}-${tag}@ops.example`, `Ops ${role}`);
    await db.membership.create({ data: { userId: id, groupId: group.id, role } });
    return { ...(await memberOf(db, id, group.slug)), email: `${role}-${tag}@ops.example` };
  };
  const owner = { ...(await memberOf(db, ownerId, group.slug)), email: `owner-${tag}@ops.example` };
  const analyst = await add("analyst");
  const reviewer = await add("reviewer");
  const sample = await createSample(db, analyst, { label: `OPS-${tag}`, formula: "Cu", massMg: 0.2 * 63.546 });
  return { slug: group.slug, owner, analyst, reviewer, sampleId: sample.id };
}

/**
 * An invented curve (C = γT + βT³ with γ = 1.3, β = 0.05 mJ mol⁻¹ K⁻² / K⁻⁴ on 0.2 mmol, 1 % σ;
 * not a measurement) of `rows` points between 1 and 20 K, as CSV text.
 */
export function inventedCsv(rows: number): string {
  const lines = ["T (K),C (mJ/K),err (mJ/K)"];
  for (let i = 0; i < rows; i++) {
    const t = 1 + (19 * i) / Math.max(1, rows - 1);
    const c = 2e-4 * (1.3 * t + 0.05 * t ** 3);
    lines.push(`${t.toPrecision(10)},${c.toPrecision(8)},${(c * 0.01).toPrecision(3)}`);
  }
  return lines.join("\n") + "\n";
}

export const IMPORT_OPTIONS = { kind: "sample", label: "zero field (invented)", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "mJ/K" } };

/** Store a measurement directly (not over HTTP) and return its id. */
export async function storeMeasurement(db: Db, f: OpsFixture, rows: number): Promise<string> {
  const m = await importMeasurement(db, f.analyst, f.sampleId, "invented.csv", new TextEncoder().encode(inventedCsv(rows)), IMPORT_OPTIONS);
  return m.id;
}

/** Poll `probe` every 100 ms until it returns something truthy (generous default: 120 s). */
export async function until<T>(what: string, probe: () => Promise<T | null | undefined | false>, seconds = 120): Promise<T> {
  for (let i = 0; i < seconds * 10; i++) {
    const v = await probe().catch(() => null);
    if (v) return v;
    await new Promise((ok) => setTimeout(ok, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}
