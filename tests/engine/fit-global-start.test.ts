/**
 * Default-start fits (no start given) of every nonlinear registry model on seeded synthetic
 * data, invented for the test, with known truth and relative noise σ = 0.5 % of C.
 * The check is independent of the engine's search: this file's own dense grid over the
 * nonlinear parameters, with the amplitudes solved exactly at each grid point by weighted
 * normal equations (small, column-scaled), gives the grid minimum of χ². The engine's χ² must
 * not exceed it by more than 1e-6 relative, the engine must report convergence, and every
 * free parameter must lie within 4σ of the truth (4σ: 15 cases × ~4 parameters, so a
 * 3σ bar would fail by chance for some seed now and then).
 */
import { describe, it, expect } from "vitest";
import { fitHeatCapacity } from "../../lib/engine/fit";
import { MODELS } from "../../lib/engine/models";
import { seededNormal } from "./uncertainty.random";

type P = Record<string, number>;
interface Case {
  model: string;
  truth: P;
  tK: [number, number];
  n: number;
  fixed?: string[];
  /** This test's own grid: nonlinear names, and per name [lo, hi, points] (log-spaced). */
  grid: [string, number, number, number][];
  amplitudes: string[];
}

const CASES: Case[] = [
  { model: "debye", truth: { gamma: 1e-3, thetaD: 250 }, tK: [2, 60], n: 80, grid: [["thetaD", 5, 5000, 6000]], amplitudes: ["gamma"] },
  { model: "einstein", truth: { gamma: 2e-3, beta: 1e-4, nE: 0.3, thetaE: 60 }, tK: [2, 40], n: 80, grid: [["thetaE", 1, 2000, 6000]], amplitudes: ["gamma", "beta", "nE"] },
  { model: "schottky", truth: { gamma: 3e-3, beta: 2e-4, n: 5e-3, gap: 1.5, g: 1 }, tK: [0.3, 10], n: 80, grid: [["gap", 0.01, 400, 6000]], amplitudes: ["gamma", "beta", "n"] },
  { model: "bcs", truth: { gammaN: 5e-3, tc: 9, a: 8.5, b: 1.44, beta: 3e-4 }, tK: [0.8, 3.5], n: 60, fixed: ["gammaN", "tc"], grid: [["b", 0.02, 50, 6000]], amplitudes: ["a", "beta"] },
  { model: "alpha-model", truth: { gammaN: 5e-3, tc: 4, alpha: 2.0, beta: 3e-4 }, tK: [0.5, 8], n: 50, grid: [["tc", 0.6, 7.9, 90], ["alpha", 0.5, 5, 45]], amplitudes: ["gammaN", "beta"] },
];

function synthetic(c: Case, seed: number) {
  const m = MODELS[c.model];
  const z = seededNormal(seed);
  const T = Array.from({ length: c.n }, (_, i) => c.tK[0] * (c.tK[1] / c.tK[0]) ** (i / (c.n - 1)));
  const clean = T.map((t) => m.evaluate(t, c.truth));
  const sigma = clean.map((v) => 0.005 * v);
  return { T, C: clean.map((v, i) => v + sigma[i] * z()), sigma };
}

/** Weighted least squares for a few columns by column-scaled normal equations (Gauss–Jordan). */
function amplitudeChi(cols: number[][], target: number[], sigma: number[]): number {
  const k = cols.length;
  const w = sigma.map((s) => 1 / (s * s));
  const scale = cols.map((col) => Math.sqrt(col.reduce((s, v, i) => s + w[i] * v * v, 0)) || 1);
  const a = Array.from({ length: k }, (_, r) => [...Array.from({ length: k }, (_, c) => cols[r].reduce((s, v, i) => s + (w[i] * v * cols[c][i]) / (scale[r] * scale[c]), 0)), cols[r].reduce((s, v, i) => s + (w[i] * v * target[i]) / scale[r], 0)]);
  for (let c = 0; c < k; c++) {
    let piv = c;
    for (let r = c + 1; r < k; r++) if (Math.abs(a[r][c]) > Math.abs(a[piv][c])) piv = r;
    [a[c], a[piv]] = [a[piv], a[c]];
    if (Math.abs(a[c][c]) < 1e-14) return NaN;
    for (let r = 0; r < k; r++) {
      if (r === c) continue;
      const f = a[r][c] / a[c][c];
      for (let j = c; j <= k; j++) a[r][j] -= f * a[c][j];
    }
  }
  const coef = a.map((row, r) => row[k] / row[r] / scale[r]);
  return target.reduce((s, v, i) => s + w[i] * (v - cols.reduce((f, col, j) => f + coef[j] * col[i], 0)) ** 2, 0);
}

/** This test's grid minimum of χ² (amplitudes exact at every grid point). */
function gridMinimum(c: Case, T: number[], C: number[], sigma: number[]): number {
  const m = MODELS[c.model];
  const axes = c.grid.map(([, lo, hi, n]) => Array.from({ length: n }, (_, i) => lo * (hi / lo) ** (i / (n - 1))));
  let best = Infinity;
  const visit = (d: number, p: P) => {
    if (d === axes.length) {
      const zero = { ...p, ...Object.fromEntries(c.amplitudes.map((a) => [a, 0])) };
      const phi0 = T.map((t) => m.evaluate(t, zero));
      const cols = c.amplitudes.map((a) => T.map((t, i) => m.evaluate(t, { ...zero, [a]: 1 }) - phi0[i]));
      const chi = amplitudeChi(cols, C.map((v, i) => v - phi0[i]), sigma);
      if (chi < best) best = chi;
      return;
    }
    for (const v of axes[d]) visit(d + 1, { ...p, [c.grid[d][0]]: v });
  };
  visit(0, { ...c.truth });
  return best;
}

describe("fitHeatCapacity without a start: global start for every nonlinear model", () => {
  const runs = CASES.flatMap((c) => [1, 2, 3].map((seed) => [c.model, seed, c] as const));
  it.each(runs)("fitHeatCapacity(%s, seed %i, no start) converges to χ² ≤ a dense grid's minimum and to the truth within 4σ", (_name, seed, c) => {
    const { T, C, sigma } = synthetic(c, seed);
    const fixed = Object.fromEntries((c.fixed ?? []).map((k) => [k, c.truth[k]]));
    const r = fitHeatCapacity({ temperatureK: T, heatCapacity: C, sigma }, { model: c.model, fixed });
    expect(r.converged, r.message).toBe(true);
    expect(r.message).toMatch(/global search/);
    const grid = gridMinimum(c, T, C, sigma);
    expect(r.chiSquare!).toBeLessThanOrEqual(grid * (1 + 1e-6));
    for (const p of r.parameters) {
      if (p.fixed) continue;
      expect(p.stdError, p.name).not.toBeNull();
      expect(Math.abs(p.value - c.truth[p.name]), `${p.name} = ${p.value} ± ${p.stdError}, truth ${c.truth[p.name]}`).toBeLessThanOrEqual(4 * p.stdError!);
    }
  });
});
