/**
 * Window scans by sequential QR row updating (lib/engine/scan/updating.ts) against solving
 * each window afresh with solveLinearLeastSquares (Householder QR).
 * Seeded synthetic data (invented: γ = 7.7 mJ mol⁻¹ K⁻², β = 0.11 mJ mol⁻¹ K⁻⁴, 0.3 % noise).
 * Threshold: 1e-12 relative on γ, β, their standard errors and χ²_red — both methods are
 * backward stable, so on these problems (column-scaled κ ≤ 10³ where updating is used) they
 * may differ by about κ·u ≈ 2e-13.
 */
import { describe, it, expect } from "vitest";
import { scanWindows, solveWindowsByUpdating, weightedRows, type ScanCell } from "../../lib/engine/scan";
import { solveLinearLeastSquares } from "../../lib/engine/linalg";
import { MODELS } from "../../lib/engine/models";
import { InputError } from "../../lib/engine/errors";
import { expectClose } from "../helpers/expectClose";
import { seededNormal as gaussian } from "./uncertainty.random";


const M = 1000;
const T = Array.from({ length: M }, (_, i) => 0.5 * (20 / 0.5) ** (i / (M - 1)));
const noise = gaussian(11);
const CLEAN = T.map((t) => 7.7e-3 * t + 1.1e-4 * t ** 3);
const SIGMA = CLEAN.map((c) => 0.003 * c);
const C = CLEAN.map((c, i) => c + SIGMA[i] * noise());
/** 16 data temperatures evenly spaced in rank between the points nearest a and b. */
const edges = (a: number, b: number) => {
  const i0 = T.findIndex((t) => t >= a);
  const i1 = T.findIndex((t) => t >= b);
  return Array.from({ length: 16 }, (_, k) => T[Math.round(i0 + ((i1 - i0) * k) / 15)]);
};
const GRID = { tMinGridK: edges(0.5, 3.5), tMaxGridK: edges(3.5, 9) };
const LINEAR = Object.values(MODELS).filter((m) => m.linear).map((m) => m.name);

/** The cell as the per-window path computes it: solveLinearLeastSquares on the window's rows. */
function freshCell(model: string, c: ScanCell, sigma: number[] | undefined) {
  const basis = MODELS[model].basis!;
  expect(MODELS[model].parameters.slice(0, 2).map((p) => p.name)).toEqual(["gamma", "beta"]);
  const idx = T.map((t, i) => i).filter((i) => T[i] >= c.tMinK && T[i] <= c.tMaxK);
  const k = idx.length;
  const n = basis.length;
  const a = new Float64Array(k * n);
  basis.forEach((phi, j) => idx.forEach((i, r) => (a[j * k + r] = phi(T[i]))));
  const sol = solveLinearLeastSquares(a, k, n, idx.map((i) => C[i]), { sigma: sigma ? idx.map((i) => sigma[i]) : undefined });
  const red = sol.chiSquare / (k - n);
  const se = (j: number) => Math.sqrt(sol.covariance[j * n + j] * (sigma ? 1 : red));
  return { k, fullRank: sol.fullRank, gamma: sol.coefficients[0], beta: sol.coefficients[1], gammaSe: se(0), betaSe: se(1), red };
}

describe("scanWindows on linear models (row updating)", () => {
  it.each(LINEAR.flatMap((m) => [[m, "σ"], [m, "no σ"]]))("scanWindows(%s, %s) gives every cell of a 16 × 16 grid as solveLinearLeastSquares does on that window, to 1e-12", (model, mode) => {
    const sigma = mode === "σ" ? SIGMA : undefined;
    const s = scanWindows({ temperatureK: T, heatCapacity: C, sigma }, { model, ...GRID });
    expect(s.cells.length).toBeGreaterThan(250);
    s.cells.forEach((c) => {
      const f = freshCell(model, c, sigma);
      const at = `${model} [${c.tMinK}, ${c.tMaxK}]`;
      expect(c.nPoints).toBe(f.k);
      expect(c.converged, at).toBe(f.fullRank);
      if (!f.fullRank) return;
      expectClose(c.gamma!, f.gamma, { rel: 1e-12 }, `${at} γ`);
      expectClose(c.beta!, f.beta, { rel: 1e-12 }, `${at} β`);
      expectClose(c.gammaStdError!, f.gammaSe, { rel: 1e-12 }, `${at} σ(γ)`);
      expectClose(c.betaStdError!, f.betaSe, { rel: 1e-12 }, `${at} σ(β)`);
      expectClose(c.reducedChiSquare!, f.red, { rel: 1e-12 }, `${at} χ²_red`);
    });
  });
});

describe("solveWindowsByUpdating", () => {
  it.each(LINEAR)("solveWindowsByUpdating(%s) matches solveLinearLeastSquares in γ, β, the fitted curve, every variance and χ² on the windows it keeps (κ ≤ 10³)", (model) => {
    const basis = MODELS[model].basis!;
    const n = basis.length;
    const design = new Float64Array(M * n);
    basis.forEach((phi, j) => T.forEach((t, i) => (design[j * M + i] = phi(t))));
    const spans = GRID.tMinGridK.flatMap((a) => GRID.tMaxGridK.map((b) => ({ lo: T.indexOf(a), hi: T.indexOf(b) }))).filter((w) => w.hi - w.lo >= 8);
    const sols = solveWindowsByUpdating(weightedRows(design, M, n, C, SIGMA), spans);
    const kept = spans.filter((_, k) => sols[k].conditionEstimate <= 1e3);
    expect(kept.length).toBeGreaterThan(spans.length / 2);
    spans.forEach((w, k) => {
      if (sols[k].conditionEstimate > 1e3) return;
      const m = w.hi - w.lo + 1;
      const a = new Float64Array(m * n);
      for (let j = 0; j < n; j++) a.set(design.subarray(j * M + w.lo, j * M + w.hi + 1), j * m);
      const ref = solveLinearLeastSquares(a, m, n, C.slice(w.lo, w.hi + 1), { sigma: SIGMA.slice(w.lo, w.hi + 1) });
      const at = `${model} [${w.lo}, ${w.hi}]`;
      // γ and β componentwise; every coefficient through the fitted curve, Σ_j A_ij x_j,
      // since a coefficient that the data do not determine (|x| ≪ σ) has no relative digits
      expectClose(sols[k].coefficients[0], ref.coefficients[0], { rel: 1e-12 }, `${at} γ`);
      expectClose(sols[k].coefficients[1], ref.coefficients[1], { rel: 1e-12 }, `${at} β`);
      let diff = 0;
      let size = 0;
      for (let i = 0; i < m; i++) {
        let d = 0;
        let f = 0;
        for (let j = 0; j < n; j++) {
          d += a[j * m + i] * (sols[k].coefficients[j] - ref.coefficients[j]);
          f += a[j * m + i] * ref.coefficients[j];
        }
        diff += (d / SIGMA[w.lo + i]) ** 2;
        size += (f / SIGMA[w.lo + i]) ** 2;
      }
      expect(Math.sqrt(diff / size), `${at} fitted curve`).toBeLessThan(1e-12);
      for (let j = 0; j < n; j++) expectClose(sols[k].covariance[j * n + j], ref.covariance[j * n + j], { rel: 1e-12 }, `${at} var x${j}`);
      expectClose(sols[k].chiSquare, ref.chiSquare, { rel: 1e-12 }, `${model} [${w.lo}, ${w.hi}] χ²`);
    });
  });

  it.each(LINEAR)("solveWindowsByUpdating(%s) puts γ and β within 5κu of the double-double-refined solution (the correction step at work)", (model) => {
    // κ the window's condition estimate, u the unit roundoff: a backward stable solve is off by
    // about κu; without the corrected-semi-normal-equations step these windows are off by
    // up to 12–73 κu (measured on this data, every model), with it by at most 2.4 κu
    const basis = MODELS[model].basis!;
    const n = basis.length;
    const design = new Float64Array(M * n);
    basis.forEach((phi, j) => T.forEach((t, i) => (design[j * M + i] = phi(t))));
    const spans = GRID.tMinGridK.flatMap((a) => GRID.tMaxGridK.map((b) => ({ lo: T.indexOf(a), hi: T.indexOf(b) }))).filter((w) => w.hi - w.lo >= 8);
    const sols = solveWindowsByUpdating(weightedRows(design, M, n, C, SIGMA), spans);
    spans.forEach((w, k) => {
      if (sols[k].conditionEstimate > 1e3) return;
      const m = w.hi - w.lo + 1;
      const a = new Float64Array(m * n);
      for (let j = 0; j < n; j++) a.set(design.subarray(j * M + w.lo, j * M + w.hi + 1), j * m);
      const ref = solveLinearLeastSquares(a, m, n, C.slice(w.lo, w.hi + 1), { sigma: SIGMA.slice(w.lo, w.hi + 1), refine: 4 });
      const rel = 5 * sols[k].conditionEstimate * 2 ** -53;
      expectClose(sols[k].coefficients[0], ref.coefficients[0], { rel }, `${model} [${w.lo}, ${w.hi}] γ`);
      expectClose(sols[k].coefficients[1], ref.coefficients[1], { rel }, `${model} [${w.lo}, ${w.hi}] β`);
    });
  });

  it("solveWindowsByUpdating returns results in the order of the windows given, whatever their order", () => {
    const design = Float64Array.from([...T, ...T.map((t) => t ** 3)]);
    const rows = weightedRows(design, M, 2, C, SIGMA);
    const spans = [{ lo: 300, hi: 900 }, { lo: 0, hi: 500 }, { lo: 300, hi: 400 }, { lo: 0, hi: 999 }];
    const together = solveWindowsByUpdating(rows, spans);
    spans.forEach((w, k) => expect(Array.from(together[k].coefficients)).toEqual(Array.from(solveWindowsByUpdating(rows, [w])[0].coefficients)));
  });

  it("solveWindowsByUpdating rejects a window outside the rows with an InputError naming it", () => {
    const rows = weightedRows(Float64Array.from(T), M, 1, C);
    expect(() => solveWindowsByUpdating(rows, [{ lo: 0, hi: 10 }, { lo: 5, hi: M }])).toThrow(InputError);
    expect(() => solveWindowsByUpdating(rows, [{ lo: 5, hi: M }])).toThrow(/invalid window: \[5, 1000\]/);
  });
});

describe("rank deficiency and bad input", () => {
  it("scanWindows gives converged:false with nulls for a window whose points all sit at one temperature, as solveLinearLeastSquares does", () => {
    // 12 repeated points at 1.7 K make the T and T³ columns of that window proportional
    const rep = Array.from({ length: 12 }, () => 1.7);
    const temps = [...rep, ...Array.from({ length: 40 }, (_, i) => 1.8 + 0.1 * i)];
    const heat = temps.map((t, i) => (7.7e-3 * t + 1.1e-4 * t ** 3) * (1 + 0.003 * Math.sin(i)));
    const sigma = heat.map((c) => 0.003 * c);
    const s = scanWindows({ temperatureK: temps, heatCapacity: heat, sigma }, { tMinGridK: [1.7], tMaxGridK: [1.7, 3, 5.7], minPoints: 8 });
    expect(s.cells.map((c) => [c.nPoints, c.converged])).toEqual([[12, false], [25, true], [52, true]]);
    const bad = s.cells[0];
    expect([bad.gamma, bad.gammaStdError, bad.beta, bad.betaStdError, bad.reducedChiSquare]).toEqual([null, null, null, null, null]);
    const a = Float64Array.from([...rep, ...rep.map((t) => t ** 3)]);
    expect(solveLinearLeastSquares(a, 12, 2, heat.slice(0, 12), { sigma: sigma.slice(0, 12) }).fullRank).toBe(false);
  });

  it("solveWindowsByUpdating reports a zero column as rank deficient and recovers once later rows fill it", () => {
    const m = 40;
    const x = Array.from({ length: m }, (_, i) => (i < 20 ? 0 : 0.5 + i / 10));
    const y = x.map((v, i) => 2 + 3 * v + 0.01 * Math.cos(i));
    const design = Float64Array.from([...x.map(() => 1), ...x]);
    const [zero, full, short, empty] = solveWindowsByUpdating(weightedRows(design, m, 2, y), [{ lo: 0, hi: 19 }, { lo: 0, hi: 39 }, { lo: 25, hi: 25 }, { lo: 30, hi: 29 }]);
    expect([zero.fullRank, zero.rank, zero.coefficients.length]).toEqual([false, 1, 0]);
    expect([short.fullRank, short.rank]).toEqual([false, 1]);
    expect([empty.fullRank, empty.rank]).toEqual([false, 0]);
    const ref = solveLinearLeastSquares(design, m, 2, y);
    expect(full.fullRank).toBe(true);
    expectClose(full.coefficients[0], ref.coefficients[0], { rel: 1e-13 });
    expectClose(full.coefficients[1], ref.coefficients[1], { rel: 1e-13 });
    expectClose(full.chiSquare, ref.chiSquare, { rel: 1e-12 });
  });

  it("scanWindows rejects minPoints that is not a positive integer", () => {
    expect(() => scanWindows({ temperatureK: T, heatCapacity: C }, { minPoints: 0 })).toThrow(/invalid minPoints: 0/);
    expect(() => scanWindows({ temperatureK: T, heatCapacity: C }, { minPoints: 2.5 })).toThrow(InputError);
  });

  it("scanWindows(nuclear) names the temperature where A/T² is not finite", () => {
    const temps = [0, ...T.slice(1, 40)];
    expect(() => scanWindows({ temperatureK: temps, heatCapacity: C.slice(0, 40) }, { model: "nuclear" })).toThrow(/invalid temperatureK: 0 \(basis function 3/);
  });

  it("weightedRows rejects σ ≤ 0 and names its line", () => {
    expect(() => weightedRows(Float64Array.from([1, 2, 3]), 3, 1, [1, 2, 3], [0.1, 0, 0.1])).toThrow(/invalid sigma: 0 .*line 2/);
  });
});
