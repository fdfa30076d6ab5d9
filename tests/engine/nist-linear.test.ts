/**
 * NIST StRD linear least-squares datasets (source: NIST Statistical Reference Datasets,
 * files in ../shared/reference/nist-strd as published). Thresholds, per dataset: parameters
 * and standard errors to ≥ 9 significant digits (LRE), Filip (degree-10, ill-conditioned) ≥ 7.
 * Wampler1 has an exact fit: its certified standard errors are 0, checked with |SE| ≤ 1e-9.
 */
import { describe, it, expect } from "vitest";
import { solveLinearLeastSquares } from "../../lib/engine/linalg";
import { loadNist, lreOrAbs } from "./nistData";

function polyDesign(x: number[], degree: number): Float64Array {
  const m = x.length;
  const a = new Float64Array(m * (degree + 1));
  for (let i = 0; i < m; i++) {
    let p = 1;
    for (let j = 0; j <= degree; j++) {
      a[j * m + i] = p;
      p *= x[i];
    }
  }
  return a;
}

function design(name: string): { a: Float64Array; n: number } {
  const d = loadNist(name);
  const m = d.y.length;
  if (name === "Longley") {
    const a = new Float64Array(m * 7);
    for (let i = 0; i < m; i++) {
      a[i] = 1;
      for (let j = 0; j < 6; j++) a[(j + 1) * m + i] = d.X![i][j];
    }
    return { a, n: 7 };
  }
  const degree: Record<string, number> = { Norris: 1, Pontius: 2, Filip: 10, Wampler1: 5, Wampler2: 5, Wampler3: 5, Wampler4: 5, Wampler5: 5 };
  if (name.startsWith("NoInt")) return { a: Float64Array.from(d.x!), n: 1 };
  return { a: polyDesign(d.x!, degree[name]), n: degree[name] + 1 };
}

const CASES: [string, number][] = [
  ["Norris", 9], ["Pontius", 9], ["NoInt1", 9], ["NoInt2", 9], ["Filip", 7],
  ["Longley", 9], ["Wampler1", 9], ["Wampler2", 9], ["Wampler3", 9],
];

describe("solveLinearLeastSquares on NIST StRD linear datasets", () => {
  it.each(CASES)("solveLinearLeastSquares(%s) meets the certified values to ≥ %i digits", (name, digits) => {
    const d = loadNist(name);
    const { a, n } = design(name);
    const m = d.y.length;
    const res = solveLinearLeastSquares(a, m, n, d.y);
    expect(res.fullRank).toBe(true);
    const dof = m - n;
    expect(dof).toBe(d.certified.residualDegreesOfFreedom);
    const s2 = res.chiSquare / dof;
    d.certified.parameters.forEach((p, j) => {
      const se = Math.sqrt(s2 * res.covariance[j * n + j]);
      const lreValue = lreOrAbs(res.coefficients[j], p.value, 1e-12);
      const lreSe = lreOrAbs(se, p.stdError, 1e-9);
      expect(lreValue, `${name} ${p.name} value ${res.coefficients[j]} vs ${p.value}`).toBeGreaterThanOrEqual(digits);
      expect(lreSe, `${name} ${p.name} SE ${se} vs ${p.stdError}`).toBeGreaterThanOrEqual(digits);
    });
    expect(lreOrAbs(Math.sqrt(s2), d.certified.residualSD, 1e-9)).toBeGreaterThanOrEqual(digits);
  });
});
