/**
 * Heavy work off the request thread: notebook recomputation runs in the worker-thread pool, a
 * step over its time budget is stopped and reported on the step, and the stop is kept by input
 * hash so the next computation does not run it again. Slowness is simulated with the pool's test
 * hook (`__testSlowMs` in a raw step config, honoured only with HEATBOOK_TEST_HOOKS=1), which
 * blocks the worker thread as a heavy fit would.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { createAnalysis, openNotebook, computeRevisionSteps } from "../../lib/server/notebook";
import { computePool, ComputePool, budgetFailureText, isBudgetFailure, memoryFailureText } from "../../lib/server/compute";
import { EMPTY_STATE } from "../../lib/engine/notebook";

process.env.HEATBOOK_TEST_HOOKS = "1";
process.env.HEATBOOK_COMPUTE_BUDGET_MS = "1500";

let t: TestDatabase;
let g: GroupFixture;
let sampleId: string;

function file(): Uint8Array {
  // Invented test curve: C = n(γT + βT³), n = 20 mg / 92.906 g/mol, γ = 7 mJ/(mol K²), β = 0.12 mJ/(mol K⁴).
  const n = 20e-3 / 92.90637;
  const lines = ["T (K),C (J/K),sigma (J/K)"];
  for (let i = 0; i < 60; i++) {
    const T = 1.8 + i * 0.1;
    const c = n * (7e-3 * T + 1.2e-4 * T ** 3);
    lines.push(`${T},${c},${c * 0.003}`);
  }
  return new TextEncoder().encode(lines.join("\n"));
}

/** A new analysis whose fit step's raw config carries the test hook (stored as is, as another writer could). */
async function analysisWithSlowFit(slowMs: number): Promise<string> {
  const a = await createAnalysis(t.db, g.members.analyst, { sampleId, title: `slow ${slowMs}` });
  await openNotebook(t.db, g.members.analyst, a.id);
  const fit = await t.db.step.findFirstOrThrow({ where: { revision: { analysisId: a.id }, kind: "fit" } });
  await t.db.step.update({ where: { id: fit.id }, data: { config: { ...(fit.config as object), __testSlowMs: slowMs }, version: { increment: 1 } } });
  return a.id;
}

const stepsOf = (id: string) => t.db.step.findMany({ where: { revision: { analysisId: id } }, orderBy: { position: "asc" }, select: { id: true, kind: true, inputHash: true, output: true, computedAt: true } });

beforeAll(async () => {
  t = await freshDatabase();
  g = await makeGroup(t.db);
  const s = await createSample(t.db, g.members.analyst, { label: "POOL-1", formula: "Nb", massMg: 20, densityGPerCm3: 8.57 });
  sampleId = s.id;
  await importMeasurement(t.db, g.members.analyst, s.id, "nb.csv", file(), { kind: "sample", label: "0 T", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "J/K" } });
});
afterAll(async () => {
  await computePool().close();
  await t.drop();
});

// First opens start the pool's workers (1–5 s each on a busy machine) before a 1.5 s budget runs.
describe("compute pool", { timeout: 90_000 }, () => {
  it("openNotebook stops a fit step over its time budget, reports 'time budget' on it and still computes the steps above and below", async () => {
    const id = await analysisWithSlowFit(60_000);
    const stopsBefore = computePool().stops;
    const nb = await openNotebook(t.db, g.members.analyst, id);
    const byKind = Object.fromEntries(nb.steps.map((s) => [s.kind, s]));
    expect(byKind.fit!.output).toMatchObject({ ok: false, error: "stopped after 1.5 s: time budget", result: null });
    expect(byKind.data!.output!.ok).toBe(true);
    expect(byKind.normalise!.output!.ok).toBe(true);
    // The derived-quantity step below was computed (it has no fit to read, and says so).
    expect(byKind.derive!.fresh).toBe(true);
    expect(byKind.derive!.output!.ok).toBe(false);
    expect(byKind.derive!.output!.error).not.toMatch(/time budget/);
    expect(computePool().stops).toBe(stopsBefore + 1);
    const stored = await stepsOf(id);
    const fit = stored.find((s) => s.kind === "fit")!;
    expect(fit.output).toMatchObject({ ok: false, error: "stopped after 1.5 s: time budget" });
    const stop = await t.db.computeStop.findUnique({ where: { inputHash: fit.inputHash! } });
    expect(stop).toMatchObject({ kind: "fit", budgetMs: 1500, error: "stopped after 1.5 s: time budget" });
  });

  it("openNotebook after a budget stop runs the stopped step neither on the next open nor when its stored output is lost", async () => {
    const id = await analysisWithSlowFit(60_000);
    await openNotebook(t.db, g.members.analyst, id);
    const stopsBefore = computePool().stops;
    const before = await stepsOf(id);
    await openNotebook(t.db, g.members.analyst, id);
    expect((await stepsOf(id)).map((s) => s.computedAt)).toEqual(before.map((s) => s.computedAt));
    // Lose every stored output: the whole chain is computed again, the fit step answered from ComputeStop.
    await t.db.step.updateMany({ where: { revision: { analysisId: id } }, data: { inputHash: null } });
    const nb = await openNotebook(t.db, g.members.analyst, id);
    expect(nb.steps.find((s) => s.kind === "fit")!.output).toMatchObject({ ok: false, error: "stopped after 1.5 s: time budget" });
    expect(nb.steps.find((s) => s.kind === "data")!.output!.ok).toBe(true);
    expect(computePool().stops).toBe(stopsBefore);
  });

  it("openNotebook of another notebook, and other queries, finish while a slow step computes in the pool", async () => {
    const slow = await analysisWithSlowFit(1000);
    const other = (await createAnalysis(t.db, g.members.analyst, { sampleId, title: "other" })).id;
    await openNotebook(t.db, g.members.analyst, other);
    const order: string[] = [];
    const slowOpen = openNotebook(t.db, g.members.analyst, slow).then((nb) => { order.push("slow"); return nb; });
    // Give the pool time to hand the slow task to a worker.
    await new Promise((ok) => setTimeout(ok, 150));
    let ticks = 0;
    const timer = setInterval(() => ticks++, 20);
    for (let i = 0; i < 3; i++) {
      await openNotebook(t.db, g.members.analyst, other);
      await t.db.$queryRaw`SELECT 1`;
      order.push(`other ${i}`);
    }
    const nb = await slowOpen;
    clearInterval(timer);
    expect(order).toEqual(["other 0", "other 1", "other 2", "slow"]);
    // The event loop kept running while the worker slept (a blocked thread would not tick at all).
    expect(ticks).toBeGreaterThan(5);
    expect(nb.steps.find((s) => s.kind === "fit")!.output!.ok).toBe(true);
  });

  it("computeRevisionSteps with a wait shorter than the computation answers 'computing', then tells when the outputs are written", async () => {
    const id = await analysisWithSlowFit(1500);
    const a = await t.db.analysis.findUniqueOrThrow({ where: { id }, include: { revisions: true } });
    const progress: number[] = [];
    let done!: () => void;
    const ended = new Promise<void>((ok) => { done = ok; });
    const r = await computeRevisionSteps(t.db, g.groupId, a.sampleId, a.revisions[0]!.id, "edit", undefined, { waitMs: 200, budgetMs: 20_000, whenDone: () => done(), onProgress: (p) => progress.push(p.position) });
    expect(r.computing).toBe(true);
    const fit = r.steps.find((s) => s.kind === "fit")!;
    expect(fit).toMatchObject({ fresh: false, output: null });
    expect(r.steps.find((s) => s.kind === "data")!.fresh).toBe(true);
    await ended;
    expect(progress).toContain(fit.position);
    const nb = await openNotebook(t.db, g.members.analyst, id);
    expect(nb.computing).toBe(false);
    expect(nb.steps.find((s) => s.kind === "fit")).toMatchObject({ fresh: true, output: { ok: true } });
  });

  it("ComputePool.run resolves a task within budget with every step's output and no stop", async () => {
    const pool = new ComputePool(1);
    try {
      const r = await pool.run({ steps: [{ id: "n1", kind: "note", config: { text: "hello" } }], context: { sample: { id: "s", label: "s", formula: "Cu", molarMassGPerMol: 63.546, atomsPerFormulaUnit: 1, massMg: null, densityGPerCm3: null, valences: {} }, measurements: {} }, from: 0, state: EMPTY_STATE }, { budgetMs: 10_000 });
      expect(r.stopped).toBeNull();
      expect(r.outputs).toHaveLength(1);
      expect(r.outputs[0]!.kind).toBe("note");
    } finally {
      await pool.close();
    }
  });

  it("ComputePool.run stops a step that outgrows the worker's heap limit and replaces the worker", async () => {
    process.env.HEATBOOK_COMPUTE_MEMORY_MB = "64";
    const pool = new ComputePool(1);
    delete process.env.HEATBOOK_COMPUTE_MEMORY_MB;
    const sample = { id: "s", label: "s", formula: "Cu", molarMassGPerMol: 63.546, atomsPerFormulaUnit: 1, massMg: null, densityGPerCm3: null, valences: {} };
    try {
      const r = await pool.run({ steps: [{ id: "n1", kind: "note", config: { text: "a" } }, { id: "n2", kind: "note", config: { text: "b", __testAllocMb: 2000 } }], context: { sample, measurements: {} }, from: 0, state: EMPTY_STATE }, { budgetMs: 60_000 });
      expect(r.stopped).toMatchObject({ index: 1, reason: "memory", memoryMb: 64 });
      expect(r.outputs).toHaveLength(1);
      // The pool still computes afterwards (a new worker).
      const next = await pool.run({ steps: [{ id: "n3", kind: "note", config: { text: "c" } }], context: { sample, measurements: {} }, from: 0, state: EMPTY_STATE }, { budgetMs: 60_000 });
      expect(next.stopped).toBeNull();
    } finally {
      await pool.close();
    }
  });

  it("budgetFailureText writes the budget in seconds without floating-point artefacts", () => {
    expect(budgetFailureText(5000)).toBe("stopped after 5 s: time budget");
    expect(budgetFailureText(2500)).toBe("stopped after 2.5 s: time budget");
    expect(budgetFailureText(300)).toBe("stopped after 0.3 s: time budget");
    expect(memoryFailureText(1024)).toBe("stopped at 1024 MiB: memory limit");
    expect(isBudgetFailure({ ok: false, error: budgetFailureText(2500) })).toBe(true);
    expect(isBudgetFailure({ ok: false, error: memoryFailureText(64) })).toBe(true);
    expect(isBudgetFailure({ ok: false, error: "stopped after the data step" })).toBe(false);
  });
});
