import { describe, it, expect } from "vitest";
import { expectClose, logRelativeError } from "../helpers/expectClose";
import { loadNist } from "./nistData";
import { fitTrend, evaluateTrend, freeElectronGammaMJ, type TrendPoint } from "../../lib/engine/series";
import { InputError } from "../../lib/engine/errors";

/** Closed-form weighted straight line (Press et al., Numerical Recipes 3rd ed., eq. 15.2.6 and 15.2.9). */
function closedFormLine(pts: TrendPoint[]) {
  let S = 0, Sx = 0, Sy = 0, Sxx = 0, Sxy = 0;
  for (const p of pts) {
    const w = 1 / (p.sigma! * p.sigma!);
    S += w; Sx += w * p.x; Sy += w * p.y; Sxx += w * p.x * p.x; Sxy += w * p.x * p.y;
  }
  const D = S * Sxx - Sx * Sx;
  return { a: (Sxx * Sy - Sx * Sxy) / D, b: (S * Sxy - Sx * Sy) / D, sa: Math.sqrt(Sxx / D), sb: Math.sqrt(S / D), cov: -Sx / D };
}

/** Seeded normal deviates (LCG + Box–Muller) for the synthetic cases. */
function gauss(seed: number): () => number {
  let s = seed >>> 0;
  const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 1) / (2 ** 32 + 1);
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

const SERIES: TrendPoint[] = [
  { x: 0, y: 7.8, sigma: 0.05 }, { x: 0.1, y: 8.3, sigma: 0.08 }, { x: 0.25, y: 9.1, sigma: 0.06 },
  { x: 0.4, y: 9.75, sigma: 0.1 }, { x: 0.5, y: 10.4, sigma: 0.07 }, { x: 0.75, y: 11.6, sigma: 0.2 },
];

describe("fitTrend (linear, weighted)", () => {
  it("fitTrend matches the closed-form weighted straight line to 1e-12 (analytic identity)", () => {
    const fit = fitTrend(SERIES, { degree: 1 });
    const cf = closedFormLine(SERIES);
    expect(fit.ok && fit.weighting).toBe("absolute");
    expectClose(fit.parameters[0]!.value, cf.a, { rel: 1e-12 });
    expectClose(fit.parameters[1]!.value, cf.b, { rel: 1e-12 });
    expectClose(fit.parameters[0]!.stdError!, cf.sa, { rel: 1e-12 });
    expectClose(fit.parameters[1]!.stdError!, cf.sb, { rel: 1e-12 });
    expectClose(fit.covariance![0]![1]!, cf.cov, { rel: 1e-12 });
  });
  it("fitTrend's band at x is √(σa² + 2x cov + x² σb²), smallest near the weighted mean x", () => {
    const fit = fitTrend(SERIES, { degree: 1, bandPoints: 11 });
    const cf = closedFormLine(SERIES);
    for (const b of fit.band) expectClose(b.sigma!, Math.sqrt(cf.sa ** 2 + 2 * b.x * cf.cov + b.x ** 2 * cf.sb ** 2), { rel: 1e-11 });
    expect(fit.band.length).toBe(11);
    expect(fit.band[0]!.x).toBe(0);
    expect(fit.band[10]!.x).toBe(0.75);
  });
  it("fitTrend with errors 'scaled' multiplies the covariance by χ²_red", () => {
    const abs = fitTrend(SERIES, { degree: 1 });
    const sc = fitTrend(SERIES, { degree: 1, errors: "scaled" });
    expectClose(sc.parameters[1]!.stdError!, abs.parameters[1]!.stdError! * Math.sqrt(abs.reducedChiSquare!), { rel: 1e-12 });
  });
});

describe("fitTrend against NIST StRD (unweighted)", () => {
  // Norris (Lower difficulty): certified values and standard errors, 15 digits published; we ask ≥ 12.
  it("fitTrend reproduces NIST Norris to ≥ 12 digits in values and standard errors", () => {
    const d = loadNist("Norris");
    const fit = fitTrend(d.x!.map((x, i) => ({ x, y: d.y[i]!, sigma: null })), { degree: 1 });
    expect(fit.weighting).toBe("unweighted");
    d.certified.parameters.forEach((c, k) => {
      expect(logRelativeError(fit.parameters[k]!.value, c.value)).toBeGreaterThanOrEqual(12);
      expect(logRelativeError(fit.parameters[k]!.stdError!, c.stdError)).toBeGreaterThanOrEqual(12);
    });
    expect(logRelativeError(fit.chiSquare!, d.certified.residualSumOfSquares)).toBeGreaterThanOrEqual(12);
  });
  // Pontius (Lower difficulty, x up to 3e6 so x² ~ 1e13): we ask ≥ 10 digits.
  it("fitTrend reproduces NIST Pontius (quadratic) to ≥ 10 digits", () => {
    const d = loadNist("Pontius");
    const fit = fitTrend(d.x!.map((x, i) => ({ x, y: d.y[i]!, sigma: null })), { degree: 2 });
    d.certified.parameters.forEach((c, k) => {
      expect(logRelativeError(fit.parameters[k]!.value, c.value)).toBeGreaterThanOrEqual(10);
      expect(logRelativeError(fit.parameters[k]!.stdError!, c.stdError)).toBeGreaterThanOrEqual(10);
    });
  });
});

describe("fitTrend (quadratic, synthetic) and outliers", () => {
  it("fitTrend recovers a seeded quadratic within 3σ per parameter and χ²_red near 1", () => {
    const g = gauss(42);
    const truth = [2.1, -1.3, 0.8];
    const pts = Array.from({ length: 60 }, (_, i) => { const x = i / 59; const s = 0.02 + 0.02 * x; return { x, y: truth[0]! + truth[1]! * x + truth[2]! * x * x + s * g(), sigma: s }; });
    const fit = fitTrend(pts, { degree: 2 });
    fit.parameters.forEach((p, k) => expect(Math.abs(p.value - truth[k]!)).toBeLessThan(3 * p.stdError!));
    expect(fit.reducedChiSquare!).toBeGreaterThan(0.6);
    expect(fit.reducedChiSquare!).toBeLessThan(1.5);
    expect(fit.outliers).toEqual([]);
  });
  it("fitTrend flags a point placed 10σ off a line and only that one", () => {
    // 20 points so the one outlier's pull on the line stays below 1σ elsewhere (a least-squares trend is not robust).
    const pts = Array.from({ length: 20 }, (_, i) => ({ x: i, y: 1 + 0.5 * i + (i === 10 ? 0.5 : 0), sigma: 0.05 }));
    const fit = fitTrend(pts, { degree: 1 });
    expect(fit.outliers).toEqual([10]);
    expect(fit.warnings.some((w) => /3σ/.test(w))).toBe(true);
  });
  it("evaluateTrend gives the polynomial value at x", () => {
    const fit = fitTrend([{ x: 0, y: 1, sigma: 1 }, { x: 1, y: 2, sigma: 1 }, { x: 2, y: 5, sigma: 1 }], { degree: 2 });
    expectClose(evaluateTrend(fit, 3).value, 10, { rel: 1e-12 });
  });
});

describe("fitTrend degenerate cases", () => {
  it("fitTrend returns ok: false for too few points and for one repeated x", () => {
    expect(fitTrend([{ x: 1, y: 1, sigma: 0.1 }], { degree: 1 }).ok).toBe(false);
    const same = fitTrend([{ x: 1, y: 1, sigma: 0.1 }, { x: 1, y: 2, sigma: 0.1 }, { x: 1, y: 3, sigma: 0.1 }], { degree: 1 });
    expect(same.ok).toBe(false);
    expect(same.message).toMatch(/slope/);
  });
  it("fitTrend with exactly two points passes through both; unweighted gives no σ", () => {
    const fit = fitTrend([{ x: 0, y: 1, sigma: null }, { x: 2, y: 5, sigma: null }], { degree: 1 });
    expect(fit.ok).toBe(true);
    expectClose(fit.parameters[1]!.value, 2, { rel: 1e-14 });
    expect(fit.parameters[1]!.stdError).toBeNull();
    expect(fit.dof).toBe(0);
  });
  it("fitTrend throws InputError on a non-finite y or σ ≤ 0, naming the line", () => {
    expect(() => fitTrend([{ x: 0, y: NaN, sigma: 1 }, { x: 1, y: 1, sigma: 1 }], { degree: 1 })).toThrow(InputError);
    expect(() => fitTrend([{ x: 0, y: 0, sigma: 1 }, { x: 1, y: 1, sigma: 0 }], { degree: 1 })).toThrow(/line 2/);
  });
  it("fitTrend unweighted when one σ is missing, and says so", () => {
    const fit = fitTrend([...SERIES.slice(0, 5), { x: 0.75, y: 11.6, sigma: null }], { degree: 1 });
    expect(fit.weighting).toBe("unweighted");
    expect(fit.warnings[0]).toMatch(/no σ/);
  });
});

describe("freeElectronGammaMJ", () => {
  // Kittel, Introduction to Solid State Physics, Table 6.3 (from memory): Cu free-electron γ 0.505 mJ mol⁻¹ K⁻²;
  // computed here from ρ = 8.96 g cm⁻³ (CRC handbook, from memory), M = 63.546 g/mol, z = 1.
  it("freeElectronGammaMJ for copper is 0.505 mJ mol⁻¹ K⁻² within 1 %", () => {
    expectClose(freeElectronGammaMJ({ molarMassGPerMol: 63.546, densityGPerCm3: 8.96, electronsPerFormulaUnit: 1 })!, 0.505, { rel: 0.01 });
  });
  it("freeElectronGammaMJ is null without a density", () => {
    expect(freeElectronGammaMJ({ molarMassGPerMol: 63.546, densityGPerCm3: null, electronsPerFormulaUnit: 1 })).toBeNull();
  });
});
