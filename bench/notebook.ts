/**
 * Notebook benchmark: server time to open a six-step notebook (data → addenda → normalise →
 * fit with window scan → derived → entropy) on a 2 000-point measurement against the embedded
 * PostgreSQL — cold (every output recomputed) and cached (hashes match, nothing computed) — and
 * to save a new fit window and reopen (the fit step and those below recomputed).
 */
import { importMeasurement } from "../lib/server/measurements";
import { withBenchDatabase } from "./fixture";
import { addStep, createAnalysis, openNotebook, updateStep } from "../lib/server/notebook";

function csv(n: number, f: (T: number) => number, tMin: number, tMax: number): Uint8Array {
  const lines = ["T (K),C (J/K),sigma (J/K)"];
  for (let i = 0; i < n; i++) {
    const T = tMin * (tMax / tMin) ** (i / (n - 1));
    const c = f(T) * (1 + 0.003 * Math.sin(i * 12.9898));
    lines.push(`${T},${c},${c * 0.003}`);
  }
  return new TextEncoder().encode(lines.join("\n"));
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

export async function runNotebookBench(): Promise<string> {
  return withBenchDatabase(".data/bench-nb-pg", async ({ db, member: m, sample }) => {
    const n = 20e-3 / 92.90637;
    const addenda = (T: number) => 1.6e-7 * T + 2.2e-9 * T ** 3;
    const units = { temperature: "K", heatCapacity: "J/K" };
    const mapping = { temperature: 0, heatCapacity: 1, sigma: 2 };
    await importMeasurement(db, m, sample.id, "addenda.csv", csv(300, addenda, 0.4, 25), { kind: "addenda", label: "addenda", mapping, units });
    await importMeasurement(db, m, sample.id, "nb.csv", csv(2000, (T) => n * (7.7e-3 * T + 1.1e-4 * T ** 3) + addenda(T), 0.5, 20), { kind: "sample", label: "0 T", mapping, units });
    const a = await createAnalysis(db, m, { sampleId: sample.id, title: "bench" });
    let nb = await openNotebook(db, m, a.id);
    await addStep(db, m, a.id, { revisionId: nb.revision.id, revisionVersion: nb.revision.version, kind: "entropy", config: {} });
    nb = await openNotebook(db, m, a.id);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    await updateStep(db, m, a.id, fit.id, { version: fit.version, config: { ...(fit.config as object), tMinK: 1, tMaxK: 6, scan: true } });
    const cold: number[] = [], cached: number[] = [], refit: number[] = [];
    for (let k = 0; k < 7; k++) {
      await db.step.updateMany({ where: { revision: { analysisId: a.id } }, data: { inputHash: null } });
      let t0 = performance.now();
      nb = await openNotebook(db, m, a.id);
      cold.push(performance.now() - t0);
      t0 = performance.now();
      nb = await openNotebook(db, m, a.id);
      cached.push(performance.now() - t0);
      const f = nb.steps.find((s) => s.kind === "fit")!;
      t0 = performance.now();
      await updateStep(db, m, a.id, f.id, { version: f.version, config: { ...(f.config as object), tMaxK: 5.5 + (k % 2) } });
      nb = await openNotebook(db, m, a.id);
      refit.push(performance.now() - t0);
    }
    const kinds = nb.steps.map((s) => s.kind).join(" → ");
    const failed = nb.steps.filter((s) => !s.output?.ok).map((s) => `${s.kind}: ${s.output?.error}`);
    const rows = [
      "| case | median | target |", "|---|---:|---:|",
      `| open, cold (all ${nb.steps.length} steps computed) | ${median(cold).toFixed(0)} ms | < 300 ms |`,
      `| open, cached (nothing computed) | ${median(cached).toFixed(1)} ms | < 50 ms |`,
      `| save a new fit window and reopen (fit and below recomputed) | ${median(refit).toFixed(0)} ms | < 100 ms |`,
    ];
    return `### Notebook (server side, 2 000-point measurement, 7 runs)\n\nChain: ${kinds}${failed.length ? `\n\nSTEP ERRORS: ${failed.join("; ")}` : ""}\n\n${rows.join("\n")}`;
  });
}
