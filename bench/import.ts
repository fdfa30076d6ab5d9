/**
 * Import benchmark: a 100 000-row delimited file through the whole server path (parse, validate,
 * convert to SI, store original bytes + packed points + audit row in one transaction) against the
 * embedded PostgreSQL. Prints wall time and peak RSS / heap growth.
 */
import { importMeasurement } from "../lib/server/measurements";
import { withBenchDatabase } from "./fixture";

function bigFile(rows: number): Uint8Array {
  const lines = ["# benchmark file (synthetic)", "Temperature (K),Heat capacity (µJ/K),Uncertainty (µJ/K)"];
  for (let i = 0; i < rows; i++) {
    const T = 0.4 + (i * 29.6) / rows;
    const c = (7.7e-3 * T + 1e-4 * T ** 3) * 2e-4 * 1e6;
    lines.push(`${T.toFixed(6)},${c.toPrecision(8)},${(c * 0.004).toPrecision(3)}`);
  }
  return new TextEncoder().encode(lines.join("\n") + "\n");
}

export async function runImportBench(): Promise<string> {
  return withBenchDatabase(".data/bench-pg", async ({ db, member, sample }) => {
    const rows: string[] = ["| rows | file size | wall time | peak RSS | RSS growth |", "|---:|---:|---:|---:|---:|"];
    for (const n of [10_000, 100_000]) {
      const bytes = bigFile(n);
      if (global.gc) global.gc();
      const rss0 = process.memoryUsage().rss;
      let peak = rss0;
      const timer = setInterval(() => { peak = Math.max(peak, process.memoryUsage().rss); }, 5);
      const t0 = performance.now();
      await importMeasurement(db, member, sample.id, `bench-${n}.csv`, bytes, {
        kind: "sample", label: `bench ${n}`, mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "µJ/K" },
      });
      const ms = performance.now() - t0;
      clearInterval(timer);
      peak = Math.max(peak, process.memoryUsage().rss);
      rows.push(`| ${n.toLocaleString("en")} | ${(bytes.byteLength / 1e6).toFixed(1)} MB | ${(ms / 1000).toFixed(2)} s | ${(peak / 2 ** 20).toFixed(0)} MiB | +${((peak - rss0) / 2 ** 20).toFixed(0)} MiB |`);
    }
    return "### Measurement import (parse → validate → SI → one transaction)\n\n" + rows.join("\n");
  });
}
