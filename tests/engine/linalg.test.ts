import { describe, it, expect } from "vitest";
import { qrFactor, applyQ, applyQt, solveLinearLeastSquares } from "../../lib/engine/linalg";
import { InputError } from "../../lib/engine/errors";
import { expectClose } from "../helpers/expectClose";

describe("qrFactor", () => {
  it("qrFactor gives an orthogonal Q: QᵀQb = b and ‖Qᵀb‖ = ‖b‖", () => {
    const m = 7;
    const a = Float64Array.from({ length: m * 3 }, (_, k) => Math.sin(k * 1.7) + (k % m === k / m ? 2 : 0));
    const f = qrFactor(new Float64Array(a), m, 3);
    const b = Float64Array.from({ length: m }, (_, i) => Math.cos(i));
    const c = new Float64Array(b);
    applyQt(f, c);
    expectClose(Math.hypot(...c), Math.hypot(...b), { rel: 1e-14 });
    applyQ(f, c);
    c.forEach((v, i) => expectClose(v, b[i], { abs: 1e-15 }));
  });
});

describe("solveLinearLeastSquares", () => {
  it("solveLinearLeastSquares reproduces an exact line and its weighted covariance (analytic 2×2 inverse)", () => {
    const x = [1, 2, 3, 4, 5];
    const sigma = [0.1, 0.2, 0.1, 0.3, 0.2];
    const a = Float64Array.from([...x.map(() => 1), ...x]);
    const res = solveLinearLeastSquares(a, 5, 2, x.map((v) => 2 + 3 * v), { sigma });
    expectClose(res.coefficients[0], 2, { rel: 1e-14 });
    expectClose(res.coefficients[1], 3, { rel: 1e-14 });
    const w = sigma.map((s) => 1 / s ** 2);
    const S = w.reduce((p, q) => p + q, 0);
    const Sx = w.reduce((p, q, i) => p + q * x[i], 0);
    const Sxx = w.reduce((p, q, i) => p + q * x[i] ** 2, 0);
    const det = S * Sxx - Sx * Sx;
    expectClose(res.covariance[0], Sxx / det, { rel: 1e-13 });
    expectClose(res.covariance[1], -Sx / det, { rel: 1e-13 });
    expectClose(res.covariance[3], S / det, { rel: 1e-13 });
  });
  it("solveLinearLeastSquares reports rank deficiency for dependent or zero columns", () => {
    const dep = Float64Array.from([1, 2, 3, 2, 4, 6]);
    expect(solveLinearLeastSquares(dep, 3, 2, [1, 2, 3]).fullRank).toBe(false);
    expect(solveLinearLeastSquares(Float64Array.from([1, 2, 3, 0, 0, 0]), 3, 2, [1, 2, 3]).fullRank).toBe(false);
    expect(solveLinearLeastSquares(Float64Array.from([1]), 1, 1, [2]).fullRank).toBe(true);
    expect(solveLinearLeastSquares(Float64Array.from([1, 1]), 1, 2, [2]).fullRank).toBe(false);
  });
  it("solveLinearLeastSquares throws InputError for shape mismatches, non-finite values and σ ≤ 0", () => {
    expect(() => solveLinearLeastSquares(new Float64Array(6), 3, 2, [1, 2])).toThrow(InputError);
    expect(() => solveLinearLeastSquares(new Float64Array(5), 3, 2, [1, 2, 3])).toThrow(/design/);
    expect(() => solveLinearLeastSquares(Float64Array.from([1, 1, 1]), 3, 1, [1, NaN, 3])).toThrow(/line 2/);
    expect(() => solveLinearLeastSquares(Float64Array.from([1, 1, 1]), 3, 1, [1, 2, 3], { sigma: [1, -1, 1] })).toThrow(/sigma/);
  });
  it("solveLinearLeastSquares refines ill-conditioned problems and leaves well-conditioned ones alone", () => {
    const m = 30;
    const x = Array.from({ length: m }, (_, i) => 10 + i / m);
    const a = new Float64Array(m * 4);
    x.forEach((v, i) => [0, 1, 2, 3].forEach((j) => (a[j * m + i] = v ** j)));
    const hard = solveLinearLeastSquares(a, m, 4, x.map((v) => 1 + v + v * v + v ** 3));
    expect(hard.conditionEstimate).toBeGreaterThan(1e3);
    expect(hard.refinementSteps).toBeGreaterThan(0);
    [1, 1, 1, 1].forEach((c, j) => expectClose(hard.coefficients[j], c, { rel: 1e-9 }));
    const easy = solveLinearLeastSquares(Float64Array.from([1, 1, 1, 0, 1, 2]), 3, 2, [1, 2, 3]);
    expect(easy.refinementSteps).toBe(0);
  });
});
