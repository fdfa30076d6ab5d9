/**
 * NIST StRD linear least-squares datasets (source: NIST Statistical Reference Datasets,
 * Statistical Engineering Division, files in tests/fixtures/nist-strd used as
 * published) solved as one full-range window by sequential QR row updating
 * (lib/engine/scan/updating.ts). Thresholds, per dataset (LRE = significant digits of
 * values, standard errors and residual SD against the certified ones):
 *   Norris, Pontius, NoInt1, NoInt2 (Lower/Average difficulty) ≥ 12;
 *   Longley (Higher, κ ≈ 4e4 after column scaling) ≥ 11;
 *   Wampler2 ≥ 12, Wampler3 ≥ 9, Wampler1 values ≥ 10 (an exact fit: its certified standard
 *   errors and residual SD are 0, checked as |SE| ≤ 1e-9);
 *   Filip (degree 10, κ ≈ 5e9 after column scaling) ≥ 7.
 * The scan itself solves windows with κ > 10³ afresh by solveLinearLeastSquares; these
 * checks show what the updating path alone keeps.
 */
import { describe, it, expect } from "vitest";
import { solveWindowsByUpdating, weightedRows } from "../../lib/engine/scan";
import { appendRow } from "../../lib/engine/scan/givens";
import { loadNist, lreOrAbs, nistLinearDesign as design } from "./nistData";
import { logRelativeError } from "../helpers/expectClose";


const CASES: [string, number][] = [
  ["Norris", 12], ["Pontius", 12], ["NoInt1", 12], ["NoInt2", 12], ["Longley", 11],
  ["Wampler1", 10], ["Wampler2", 12], ["Wampler3", 9], ["Filip", 7],
];

describe("solveWindowsByUpdating on NIST StRD linear datasets (one full-range window)", () => {
  it.each([["Norris", 13], ["Pontius", 12], ["NoInt1", 14], ["NoInt2", 14]] as [string, number][])("the certified %s parameters give the certified residual sum of squares to ≥ %i digits (model check)", (name, digits) => {
    const d = loadNist(name);
    const { a, n } = design(name);
    const m = d.y.length;
    let rss = 0;
    for (let i = 0; i < m; i++) {
      let f = 0;
      d.certified.parameters.forEach((p, j) => (f += a[j * m + i] * p.value));
      rss += (d.y[i] - f) ** 2;
    }
    expect(n).toBe(d.certified.parameters.length);
    expect(logRelativeError(rss, d.certified.residualSumOfSquares)).toBeGreaterThanOrEqual(digits);
  });

  it.each(CASES)("solveWindowsByUpdating(%s, [0, m − 1]) meets the certified values to ≥ %i digits", (name, digits) => {
    const d = loadNist(name);
    const { a, n } = design(name);
    const m = d.y.length;
    const [sol] = solveWindowsByUpdating(weightedRows(a, m, n, d.y), [{ lo: 0, hi: m - 1 }]);
    expect(sol.fullRank).toBe(true);
    expect(m - n).toBe(d.certified.residualDegreesOfFreedom);
    const s2 = sol.chiSquare / (m - n);
    d.certified.parameters.forEach((p, j) => {
      const se = Math.sqrt(s2 * sol.covariance[j * n + j]);
      expect(lreOrAbs(sol.coefficients[j], p.value, 1e-12), `${name} ${p.name} ${sol.coefficients[j]} vs ${p.value}`).toBeGreaterThanOrEqual(digits);
      expect(lreOrAbs(se, p.stdError, 1e-9), `${name} ${p.name} SE ${se} vs ${p.stdError}`).toBeGreaterThanOrEqual(digits);
    });
    expect(lreOrAbs(Math.sqrt(s2), d.certified.residualSD, 1e-9)).toBeGreaterThanOrEqual(digits);
  });

  it("appendRow's rotated-out components of Pontius sum to its certified residual sum of squares (≥ 11 digits)", () => {
    // identity: appending a row to [R | Qᵀb] grows the residual sum of squares by exactly the
    // square of the component rotated out (here with the rows' power-of-two scaling undone)
    const d = loadNist("Pontius");
    const { a, n } = design("Pontius");
    const m = d.y.length;
    const rows = weightedRows(a, m, n, d.y);
    const r = new Float64Array(n * n);
    const qtb = new Float64Array(n);
    const work = new Float64Array(n);
    let rss = 0;
    for (let i = 0; i < m; i++) rss += appendRow(r, qtb, n, rows.a, i * n, rows.b[i], work) ** 2;
    expect(logRelativeError(rss / rows.rhsScale ** 2, d.certified.residualSumOfSquares)).toBeGreaterThanOrEqual(11);
  });
});
