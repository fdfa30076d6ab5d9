/**
 * `npm run bench:load`: signed-in clients against `next start` + PostgreSQL on loopback,
 * with autocannon, bounded in time (--seconds per run, default 5; --rounds, default 3).
 * Scenarios: reading a notebook (cached step outputs), listing samples, and a recompute cycle
 * (read notebook → save a new fit window → read again, which recomputes the fit and the
 * derived step; one analysis per connection so saves never conflict). Each at 8, 32 and 128
 * connections; printed: requests/s, p50/p99 latency, errors (socket errors + non-2xx).
 * The floor in the same run: the same rows read by a bare `pg` query loop (bench/loadFloor.ts).
 * The server's RSS is printed before and after each round; the rounds repeat the same work,
 * so growth between rounds shows a leak. Needs a build (`npx next build`) in
 * HEATBOOK_BENCH_APP_DIR (default this checkout); starts its own embedded PostgreSQL.
 * Invented demo data only (C = γT + βT³ curves, see tests/ops/harness.ts).
 */
import autocannon from "autocannon";
import { readFileSync } from "node:fs";
import { cpus, loadavg } from "node:os";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement } from "../tests/ops/harness";
import { fullChain, writeSteps } from "../tests/server/reviewFixtures";
import { notebookQueries, queryLoop, sampleListQueries, type FloorIds, type LoopResult } from "./loadFloor";

function option(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(process.argv[i + 1]) : fallback;
  if (!Number.isFinite(v) || v <= 0) throw new Error(`invalid --${name}: ${process.argv[i + 1]}`);
  return v;
}

const SECONDS = option("seconds", 5);
const ROUNDS = option("rounds", 3);
const LEVELS = [8, 32, 128];
if (process.env.HEATBOOK_BENCH_APP_DIR) process.env.HEATBOOK_OPS_APP_DIR = process.env.HEATBOOK_BENCH_APP_DIR;

const rssMiB = (pid: number) => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))![1]) / 1024;
const fmt = (v: number, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : "–");

interface Row { scenario: string; connections: number; rps: number; p50: number; p99: number; errors: number; what?: string }

async function cannon(opts: autocannon.Options): Promise<Omit<Row, "scenario" | "connections">> {
  // Let the previous run's last requests finish first: a save still in flight from it would
  // commit after this run read the same step, and the stale save would rightly get a 409.
  await new Promise((ok) => setTimeout(ok, 1500));
  const r = await autocannon({ ...opts, duration: SECONDS, timeout: 30 });
  // What the errors were: socket errors, timeouts and each non-2xx status with its count.
  const statuses = Object.entries((r as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {})
    .filter(([code]) => !code.startsWith("2")).map(([code, s]) => `${s.count}× ${code}`);
  const what = [...(r.errors ? [`${r.errors} socket errors`] : []), ...(r.timeouts ? [`${r.timeouts} timeouts`] : []), ...statuses].join(", ");
  return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, errors: r.errors + r.timeouts + r.non2xx, ...(what ? { what } : {}) };
}

async function main(): Promise<void> {
  process.env.HEATBOOK_BCRYPT_COST = "4";
  const d = await opsDatabase("bench");
  const f = await opsFixture(d.db, "bench");
  const measurementId = await storeMeasurement(d.db, f, 400);
  for (let k = 0; k < 40; k++) await d.db.sample.create({ data: { groupId: f.analyst.group.id, label: `LIST-${k}`, formula: "Cu", molarMassGPerMol: 63.546, atomsPerFormulaUnit: 1 } });
  const analyses: { id: string; revisionId: string; stepId: string }[] = [];
  for (let k = 0; k < 130; k++) {
    const a = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title: `bench ${k}`, createdById: f.analyst.userId } });
    const rev = await d.db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: f.analyst.userId } });
    await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(measurementId, 12));
    analyses.push({ id: a.id, revisionId: rev.id, stepId: (await d.db.step.findFirstOrThrow({ where: { revisionId: rev.id, kind: "fit" } })).id });
  }
  const app = await startApp(d.url);
  const { cookie } = await signIn(app.base, f.analyst.email);
  const api = `${app.base}/api/groups/${f.slug}`;
  const read = analyses[0]!;
  const headers = { cookie };
  const ids: FloorIds = { userId: f.analyst.userId, slug: f.slug, groupId: f.analyst.group.id, analysisId: read.id, revisionId: read.revisionId, sampleId: f.sampleId, measurementId };

  // Recompute cycle: each cycle takes a free analysis, reads it, saves a new window with the
  // version it read, reads again (recomputes fit + derive), and frees the analysis.
  // Refilled before each run: a cycle cut off by the end of a run never frees its analysis.
  // A connection keeps the analysis it holds until its cycle ends: autocannon may build a
  // cycle's first request again (after a reconnect), and taking a second analysis then would
  // leak the first until the free list ran dry and two connections shared one (409 conflicts
  // of the bench's own making, seen at 128 connections).
  const free: number[] = [];
  const refill = () => free.splice(0, free.length, ...analyses.slice(1).map((_, i) => i + 1));
  let flip = 0;
  const cycle: autocannon.Request[] = [
    { method: "GET", setupRequest: (req, ctx) => { if (!ctx.held) { ctx.k = free.shift() ?? 1; ctx.held = true; } return { ...req, path: `/api/groups/${f.slug}/analyses/${analyses[ctx.k as number]!.id}` }; },
      onResponse: (status, body, ctx) => { if (status === 200) ctx.version = (JSON.parse(body).notebook.steps as { id: string; version: number }[]).find((s) => s.id === analyses[ctx.k as number]!.stepId)!.version; } },
    { method: "PATCH", setupRequest: (req, ctx) => ({ ...req, path: `/api/groups/${f.slug}/analyses/${analyses[ctx.k as number]!.id}/steps/${analyses[ctx.k as number]!.stepId}`, headers: { ...req.headers, "content-type": "application/json" }, body: JSON.stringify({ version: ctx.version ?? 1, config: { model: "sommerfeld", tMaxK: (flip++ % 2) ? 10 : 12, compare: [] } }) }) },
    { method: "GET", setupRequest: (req, ctx) => ({ ...req, path: `/api/groups/${f.slug}/analyses/${analyses[ctx.k as number]!.id}` }), onResponse: (_s, _b, ctx) => { free.push(ctx.k as number); ctx.held = false; } },
  ];

  const scenarios: [string, (n: number) => Promise<Omit<Row, "scenario" | "connections">>, ((c: import("pg").Pool) => Promise<void>) | null][] = [
    ["notebook read", (n) => cannon({ url: `${api}/analyses/${read.id}`, connections: n, headers }), (c) => notebookQueries(c, ids)],
    ["sample list", (n) => cannon({ url: `${api}/samples`, connections: n, headers }), (c) => sampleListQueries(c, ids)],
    ["recompute cycle (read, save window, read)", (n) => (refill(), cannon({ url: app.base, connections: Math.min(n, analyses.length - 1), headers, requests: cycle })), null],
  ];

  const pid = app.child.pid!;
  const rss: string[] = [`| start | ${fmt(rssMiB(pid))} MiB |`];
  const rows: Row[] = [];
  const floor: (Row & { label: string })[] = [];
  // Warm-up (first use of each route, JIT, connection pool): every scenario once at 8 connections.
  for (const [, run] of scenarios) await run(8);
  const one = await fetch(`${api}/analyses/${read.id}`, { headers });
  const notebookBytes = (await one.arrayBuffer()).byteLength;
  rss.push(`| after warm-up | ${fmt(rssMiB(pid))} MiB |`);
  for (let round = 1; round <= ROUNDS; round++) {
    for (const [name, run] of scenarios) for (const n of LEVELS) rows.push({ scenario: `${name} · round ${round}`, connections: n, ...(await run(n)) });
    rss.push(`| after round ${round} | ${fmt(rssMiB(pid))} MiB |`);
  }
  for (const [name, , op] of scenarios) {
    if (!op) continue;
    for (const n of LEVELS) {
      const r: LoopResult = await queryLoop(d.url, n, SECONDS, op);
      floor.push({ label: name, scenario: `${name} · bare pg`, connections: n, rps: r.requestsPerSecond, p50: r.p50Ms, p99: r.p99Ms, errors: r.errors });
    }
  }
  await app.kill("SIGTERM");
  await d.close();

  console.log(`Heatbook load benchmark — ${new Date().toISOString().slice(0, 16)}Z, Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? "CPU"}, load average at the end ${loadavg().map((l) => l.toFixed(1)).join(" / ")}, ${SECONDS} s per run, next start (1 process, pool 10) + embedded PostgreSQL 18 on loopback; one notebook response is ${(notebookBytes / 1024).toFixed(0)} KiB (400 points, 4 steps)\n`);
  console.log("| scenario | connections | requests/s | p50 ms | p99 ms | errors |\n|---|---:|---:|---:|---:|---:|");
  for (const r of [...rows, ...floor]) console.log(`| ${r.scenario} | ${r.connections} | ${fmt(r.rps, 0)} | ${fmt(r.p50)} | ${fmt(r.p99)} | ${r.errors}${r.what ? ` (${r.what})` : ""} |`);
  console.log("\nApp throughput as a share of the bare-query floor (last round):\n\n| scenario | connections | app / floor |\n|---|---:|---:|");
  for (const fl of floor) {
    const app = rows.filter((r) => r.scenario.startsWith(fl.label) && r.connections === fl.connections).at(-1)!;
    console.log(`| ${fl.label} | ${fl.connections} | ${fmt((100 * app.rps) / fl.rps, 0)} % |`);
  }
  console.log("\nServer memory (RSS of the next start process):\n\n| moment | RSS |\n|---|---:|");
  console.log(rss.join("\n"));
}

main().then(() => process.exit(0), (err) => {
  console.error(`bench:load: ${(err as Error).stack ?? err}`);
  process.exit(1);
});
