/**
 * bench:load's heavy-work scenario: 32 clients read a notebook (autocannon) while one client
 * recomputes a heavy fit step in a loop (save a new window, read: the fit is computed again in
 * the server's worker-thread pool), beside the same 32 readers without the heavy client. The
 * pair runs back to back, round by round, so both halves see the same state of the machine.
 * The heavy step (a user expression with five parameters, a window scan and a three-model
 * comparison over 400 points) took 250–520 ms on the request thread before the pool existed.
 */
import autocannon from "autocannon";
import type { Db } from "../lib/server/db/client";

export const HEAVY_FIT = { model: "expression", expression: "g*T + b*T^3 + d*T^5 + a*exp(-e/T) + n/T^2", scan: true, compare: ["sommerfeld", "sommerfeld-t5", "nuclear"] };

export interface HeavyRound { round: number; aloneP99: number; withP99: number; aloneRps: number; withRps: number; recomputes: number; recomputeMeanMs: number; errors: number }

/** One heavy client: read, save a new window, read again (which recomputes), until `stop()`. */
function heavyClient(base: string, slug: string, analysisId: string, stepId: string, cookie: string) {
  let running = true;
  let k = 0;
  const times: number[] = [];
  let errors = 0;
  const url = `${base}/api/groups/${slug}/analyses/${analysisId}`;
  const headers = { cookie, origin: base };
  const done = (async () => {
    while (running) {
      const nb = (await (await fetch(url, { headers })).json()) as { notebook: { steps: { id: string; version: number }[] } };
      const version = nb.notebook.steps.find((s) => s.id === stepId)!.version;
      // A window edge never used before, so every read after the save has a fit to compute.
      const tMaxK = 10 + (k++ % 1000) * 0.002;
      const t0 = performance.now();
      const saved = await fetch(`${url}/steps/${stepId}`, { method: "PATCH", headers: { ...headers, "content-type": "application/json" }, body: JSON.stringify({ version, config: { ...HEAVY_FIT, tMaxK } }) });
      await saved.arrayBuffer();
      const read = await fetch(url, { headers });
      const body = (await read.json()) as { notebook?: { steps: { kind: string; output: { ok: boolean; error: string | null } | null }[] } };
      if (!saved.ok || !read.ok || !body.notebook?.steps.find((s) => s.kind === "fit")?.output?.ok) errors++;
      times.push(performance.now() - t0);
    }
  })();
  return { stop: async () => { running = false; await done; return { times, errors }; } };
}

/** Run `rounds` pairs (readers alone, readers beside the heavy client), `seconds` each. */
export async function heavyScenario(opts: { base: string; slug: string; cookie: string; readId: string; heavy: { id: string; stepId: string }; rounds: number; seconds: number }): Promise<HeavyRound[]> {
  const readers = () => autocannon({ url: `${opts.base}/api/groups/${opts.slug}/analyses/${opts.readId}`, connections: 32, headers: { cookie: opts.cookie }, duration: opts.seconds, timeout: 30 });
  const out: HeavyRound[] = [];
  for (let round = 1; round <= opts.rounds; round++) {
    await new Promise((ok) => setTimeout(ok, 1500));
    const alone = await readers();
    await new Promise((ok) => setTimeout(ok, 1500));
    const client = heavyClient(opts.base, opts.slug, opts.heavy.id, opts.heavy.stepId, opts.cookie);
    const beside = await readers();
    const h = await client.stop();
    out.push({
      round, aloneP99: alone.latency.p99, withP99: beside.latency.p99, aloneRps: alone.requests.average, withRps: beside.requests.average,
      recomputes: h.times.length, recomputeMeanMs: h.times.reduce((a, b) => a + b, 0) / Math.max(1, h.times.length),
      errors: alone.errors + alone.timeouts + alone.non2xx + beside.errors + beside.timeouts + beside.non2xx + h.errors,
    });
  }
  return out;
}

/** The analysis the heavy client recomputes: data → normalise → the heavy fit. */
export async function heavyAnalysis(db: Db, writeSteps: (db: Db, groupId: string, sampleId: string, revisionId: string, steps: { id: string; kind: string; config: unknown }[]) => Promise<unknown>, groupId: string, sampleId: string, userId: string, measurementId: string): Promise<{ id: string; stepId: string }> {
  const a = await db.analysis.create({ data: { groupId, sampleId, title: "bench heavy fit", createdById: userId } });
  const rev = await db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: userId } });
  await writeSteps(db, groupId, sampleId, rev.id, [
    { id: "", kind: "data", config: { measurementIds: [measurementId] } },
    { id: "", kind: "normalise", config: { per: "formula-unit" } },
    { id: "", kind: "fit", config: { ...HEAVY_FIT, tMaxK: 12 } },
  ]);
  return { id: a.id, stepId: (await db.step.findFirstOrThrow({ where: { revisionId: rev.id, kind: "fit" } })).id };
}

/** The scenario's table and its target line. */
export function printHeavy(rounds: HeavyRound[], seconds: number): void {
  const f = (v: number, d = 1) => (Number.isFinite(v) ? v.toFixed(d) : "–");
  console.log(`\nHeavy work beside readers: 32 connections reading one notebook for ${seconds} s, alone and then beside one client recomputing a heavy fit step in a loop (${HEAVY_FIT.expression}, window scan, 3-model comparison, 400 points; computed in the worker-thread pool).\n`);
  console.log("| round | readers alone p99 ms | beside the heavy client p99 ms | ratio | readers alone req/s | beside req/s | heavy recomputes (save + read) | mean save + read ms | errors |\n|---:|---:|---:|---:|---:|---:|---:|---:|---:|");
  for (const r of rounds) console.log(`| ${r.round} | ${f(r.aloneP99)} | ${f(r.withP99)} | ${f(r.withP99 / r.aloneP99, 2)}× | ${f(r.aloneRps, 0)} | ${f(r.withRps, 0)} | ${r.recomputes} | ${f(r.recomputeMeanMs, 0)} | ${r.errors} |`);
  const ratios = rounds.map((r) => r.withP99 / r.aloneP99);
  const met = ratios.filter((x) => x <= 2).length;
  console.log(`\n| target | measured | verdict |\n|---|---|---|\n| readers' p99 beside the heavy client within 2× of their p99 alone | ${ratios.map((x) => `${f(x, 2)}×`).join(", ")} (round by round) | ${met === ratios.length ? "met" : `**not met**${met ? ` (met in ${met} of ${ratios.length})` : ""}`} |`);
}
