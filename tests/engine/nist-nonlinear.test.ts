/**
 * NIST StRD nonlinear least-squares datasets (source: NIST Statistical Reference Datasets,
 * tests/fixtures/nist-strd, used as published), fitted through the user-expression
 * path (mathjs text → whitelisted tree → JS + symbolic Jacobian) with fitCurve.
 *
 * Per dataset: first the certified parameters must reproduce the certified residual sum of
 * squares (tests the model text), then each published start is fitted. Thresholds: values
 * ≥ 6 significant digits (LRE), standard errors ≥ 4, unless the table says otherwise.
 * Every dataset from both starts must converge to the certified minimum. BoxBOD and MGH10 from
 * start 1 do not by plain LM (BoxBOD's b2 runs off to where χ² is flat; MGH10 runs out of
 * evaluations); fitCurve then restarts with the linear parameter b1 solved exactly inside a
 * search over the others (separable least squares), from the given start first, and both reach
 * the certified values. MGH10, Thurber, Eckerle4, Rat43, Bennett5 and Hahn1 were added from
 * lmfit-py's copy of the NIST files (tests/fixtures/nist-strd/README.md).
 * Without any start (global multi-start), the datasets in NO_START_CERTIFIED reach the certified
 * values as well (measured). Those in NO_START_SYMMETRIC reach the certified residual sum of
 * squares (to 1e-6 relative) at an equivalent point: Lanczos2/3 with the three exponential terms
 * in another order, Eckerle4 with b1 and b2 both negated (the model depends on b1/b2 and b2²);
 * Lanczos1's certified RSS is itself at the rounding level. Gauss1–3 and ENSO end in a local
 * minimum (χ² 6–100× and 1.2× the certified one) and must still answer.
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

const NAMES = ["Misra1a", "Chwirut2", "Chwirut1", "Lanczos3", "Gauss1", "Gauss2", "DanWood", "Misra1b", "Kirby2", "MGH17", "Lanczos1", "Lanczos2", "Gauss3", "Misra1c", "Misra1d", "Roszman1", "ENSO", "MGH09", "BoxBOD", "Rat42", "MGH10", "Thurber", "Eckerle4", "Rat43", "Bennett5", "Hahn1"];
const NO_START_SYMMETRIC = ["Lanczos2", "Lanczos3", "Eckerle4"];
const NO_START_CERTIFIED = ["Misra1a", "Misra1b", "Misra1c", "Misra1d", "Chwirut1", "Chwirut2", "DanWood", "Kirby2", "MGH17", "Roszman1", "MGH09", "BoxBOD", "Rat42", "MGH10", "Thurber", "Rat43", "Bennett5", "Hahn1"];
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
  it.each(cases)("fitCurve(%s, start %i) reaches the certified values", (name, start) => {
    const d = loadNist(name);
    const names = d.certified.parameters.map((p) => p.name);
    const st = Object.fromEntries(names.map((n, j) => [n, d.starts![start - 1][j]]));
    const r = fitCurve(d.x!, d.y, undefined, nistExpression(d.model), st);
    expectCertified(d, r, name);
  });
});

describe("fitCurve on NIST StRD nonlinear datasets without a start", () => {
  it.each(NO_START_CERTIFIED)("fitCurve(%s, no start) reaches the certified values by the global search", (name) => {
    const d = loadNist(name);
    expectCertified(d, fitCurve(d.x!, d.y, undefined, nistExpression(d.model)), name);
  });
  it.each(NO_START_SYMMETRIC)("fitCurve(%s, no start) reaches the certified residual sum of squares at an equivalent point", (name) => {
    const d = loadNist(name);
    const r = fitCurve(d.x!, d.y, undefined, nistExpression(d.model));
    expect(r.converged, r.message).toBe(true);
    expect(Math.abs(r.chiSquare! / d.certified.residualSumOfSquares - 1)).toBeLessThan(1e-6);
  });
  it.each(NAMES.filter((n) => !NO_START_CERTIFIED.includes(n) && !NO_START_SYMMETRIC.includes(n)))("fitCurve(%s, no start) answers with a result whose χ² is not below the certified minimum", (name) => {
    const d = loadNist(name);
    const r = fitCurve(d.x!, d.y, undefined, nistExpression(d.model));
    expect(r.message).toMatch(/global search/);
    // Lanczos1's certified RSS (1.4e-25) is at the rounding level of the model's evaluation
    if (r.chiSquare !== null) expect(r.chiSquare).toBeGreaterThanOrEqual(d.certified.residualSumOfSquares * (1 - (name === "Lanczos1" ? 1e-2 : 1e-6)));
  });
});

function expectCertified(d: NistDataset, r: ReturnType<typeof fitCurve>, name: string): void {
  {
    expect(r.converged, r.message).toBe(true);
    // Rat43 prints 9 degrees of freedom, but 15 observations − 4 parameters = 11, and its own
    // residual SD 28.262414662 = √(RSS/11): the printed 9 is inconsistent with the file
    expect(r.dof).toBe(name === "Rat43" ? 11 : d.certified.residualDegreesOfFreedom);
    for (const c of d.certified.parameters) {
      const p = r.parameters.find((q) => q.name === c.name)!;
      expect(lreOrAbs(p.value, c.value, 0), `${name} ${c.name} value ${p.value} vs ${c.value}`).toBeGreaterThanOrEqual(6);
      expect(lreOrAbs(p.stdError!, c.stdError, 0), `${name} ${c.name} SE ${p.stdError} vs ${c.stdError}`).toBeGreaterThanOrEqual(SE_DIGITS[name] ?? 4);
    }
  }
}
