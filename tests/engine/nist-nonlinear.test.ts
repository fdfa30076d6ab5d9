/**
 * NIST StRD nonlinear least-squares datasets (source: NIST Statistical Reference Datasets,
 * tests/fixtures/nist-strd, used as published), fitted through the user-expression
 * path (mathjs text → whitelisted tree → JS + symbolic Jacobian) with fitCurve.
 *
 * Per dataset: first the certified parameters must reproduce the certified residual sum of
 * squares (tests the model text), then each published start is fitted. Thresholds: values
 * ≥ 6 significant digits (LRE), standard errors ≥ 4, unless the table says otherwise.
 * Outcome per start as measured with this solver (true = converged to the certified
 * minimum; false = reported converged:false with a message — asserted exactly):
 *   BoxBOD start 1: false (b2 runs off to where exp(−b2·x) ≈ 0 and χ² is flat; reported as
 *     not a verified minimum)
 *   all other starts: true (MGH17 start 1 needs ~600 evaluations).
 * Lanczos1: the certified residuals are ~1e-13 (the data are the model rounded to 13 digits),
 * so the residual variance — and every standard error — is at the rounding level of a
 * double-precision evaluation of the model: SE threshold 2 digits (measured ≈ 3), and the
 * RSS check is |RSS(certified params)| < 1e-20 instead of digits (11-digit printed
 * parameters move the residuals by more than they are).
 */
import { describe, it, expect } from "vitest";
import { fitCurve } from "../../lib/engine/fit";
import { compileExpression } from "../../lib/engine/expression";
import { loadNist, lreOrAbs, type NistDataset } from "./nistData";

/** NIST model text → mathjs text: `**` → `^`, brackets → parentheses, arctan → atan. */
export function nistExpression(model: string): string {
  const eq = model.includes(";") ? model.split(";")[1] : model;
  return eq.replace(/^\s*y\s*=/, "").replace(/\+\s*e\s*$/, "").replace(/\*\*/g, "^").replace(/\[/g, "(").replace(/\]/g, ")").replace(/arctan/g, "atan").trim();
}

const NAMES = ["Misra1a", "Chwirut2", "Chwirut1", "Lanczos3", "Gauss1", "Gauss2", "DanWood", "Misra1b", "Kirby2", "MGH17", "Lanczos1", "Lanczos2", "Gauss3", "Misra1c", "Misra1d", "Roszman1", "ENSO", "MGH09", "BoxBOD", "Rat42"];
const NOT_CONVERGING = new Set(["BoxBOD/1"]);
const SE_DIGITS: Record<string, number> = { Lanczos1: 2 };

function rssAt(d: NistDataset, values: number[]): number {
  const c = compileExpression(nistExpression(d.model), { variable: "x" });
  const p = Float64Array.from(c.parameters, (n) => values[d.certified.parameters.findIndex((q) => q.name === n)]);
  const out = new Float64Array(d.y.length);
  c.evaluate(Float64Array.from(d.x!), p, out, 0);
  return out.reduce((s, f, i) => s + (d.y[i] - f) ** 2, 0);
}

describe("NIST StRD nonlinear models through compileExpression", () => {
  it.each(NAMES)("compileExpression(%s model) reproduces the certified RSS at the certified parameters", (name) => {
    const d = loadNist(name);
    const rss = rssAt(d, d.certified.parameters.map((p) => p.value));
    if (name === "Lanczos1") expect(rss).toBeLessThan(1e-20);
    else expect(lreOrAbs(rss, d.certified.residualSumOfSquares, 0)).toBeGreaterThanOrEqual(6);
  });
});

describe("fitCurve on NIST StRD nonlinear datasets from both published starts", () => {
  const cases = NAMES.flatMap((name) => [1, 2].map((start) => [name, start] as const));
  it.each(cases)("fitCurve(%s, start %i) reaches the certified values or says converged:false", (name, start) => {
    const d = loadNist(name);
    const names = d.certified.parameters.map((p) => p.name);
    const st = Object.fromEntries(names.map((n, j) => [n, d.starts![start - 1][j]]));
    const r = fitCurve(d.x!, d.y, undefined, nistExpression(d.model), st);
    if (NOT_CONVERGING.has(`${name}/${start}`)) {
      expect(r.converged).toBe(false);
      expect(r.message.length).toBeGreaterThan(0);
      expect(r.parameters.every((p) => p.stdError === null)).toBe(true);
      return;
    }
    expect(r.converged, r.message).toBe(true);
    expect(r.dof).toBe(d.certified.residualDegreesOfFreedom);
    for (const c of d.certified.parameters) {
      const p = r.parameters.find((q) => q.name === c.name)!;
      expect(lreOrAbs(p.value, c.value, 0), `${name} ${c.name} value ${p.value} vs ${c.value}`).toBeGreaterThanOrEqual(6);
      expect(lreOrAbs(p.stdError!, c.stdError, 0), `${name} ${c.name} SE ${p.stdError} vs ${c.stdError}`).toBeGreaterThanOrEqual(SE_DIGITS[name] ?? 4);
    }
  });
});
