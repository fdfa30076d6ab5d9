/**
 * NIST StRD linear least-squares datasets (source: NIST Statistical Reference Datasets,
 * files in tests/fixtures/nist-strd as published). Thresholds, per dataset: parameters
 * and standard errors to ≥ 9 significant digits (LRE), Filip (degree-10, ill-conditioned) ≥ 7.
 * Wampler1 has an exact fit: its certified standard errors are 0, checked with |SE| ≤ 1e-9.
 */
import { describe, it, expect } from "vitest";
import { solveLinearLeastSquares } from "../../lib/engine/linalg";
import { loadNist, lreOrAbs, nistLinearDesign as design } from "./nistData";



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
