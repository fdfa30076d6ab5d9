/**
 * The one-sweep Householder kernels (qrFactor, applyQt) against a plain column-by-column
 * Householder QR written here (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 5.2.1:
 * one dot pass and one update pass per reflector and column), on seeded random problems
 * (invented data) and on NIST StRD Longley (source: NIST Statistical Reference Datasets,
 * tests/fixtures/nist-strd/Longley.json as published), whose certified values the
 * solve must also meet. Agreement is to rounding: entry-wise within 1e-13 of its column's norm.
 */
import { describe, it, expect } from "vitest";
import { qrFactor, applyQt, solveLinearLeastSquares } from "../../lib/engine/linalg";
import { applyQtToColumn } from "../../lib/engine/linalg/applyQ";
import { InputError } from "../../lib/engine/errors";
import { expectClose } from "../helpers/expectClose";
import { seededRandom } from "./uncertainty.random";
import { loadNist, lreOrAbs } from "./nistData";

/** Column-by-column Householder QR of the m×cols column-major `a` (first n columns pivots). */
function referenceQR(a0: Float64Array, m: number, n: number, cols: number) {
  const a = new Float64Array(a0);
  const v: Float64Array[] = [];
  const beta: number[] = [];
  for (let k = 0; k < n; k++) {
    let sq = 0;
    for (let i = k; i < m; i++) sq += a[k * m + i] ** 2;
    const alpha = a[k * m + k] > 0 ? -Math.sqrt(sq) : Math.sqrt(sq);
    const vk = new Float64Array(m);
    for (let i = k; i < m; i++) vk[i] = a[k * m + i];
    vk[k] -= alpha;
    const b = 1 / (-alpha * vk[k]);
    for (let j = k; j < cols; j++) {
      let s = 0;
      for (let i = k; i < m; i++) s += vk[i] * a[j * m + i];
      for (let i = k; i < m; i++) a[j * m + i] -= b * s * vk[i];
    }
    v.push(vk);
    beta.push(b);
  }
  return { a, v, beta };
}

function randomMatrix(m: number, cols: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  // columns of very different sizes, as polynomial designs have
  return Float64Array.from({ length: m * cols }, (_, k) => (rand() - 0.5) * 10 ** Math.floor(k / m));
}

function columnNorm(a: Float64Array, m: number, j: number): number {
  let s = 0;
  for (let i = 0; i < m; i++) s += a[j * m + i] ** 2;
  return Math.sqrt(s);
}

/** R (and the first n rows of the extra columns) of qrFactor against the reference, to rounding. */
function expectSameR(a0: Float64Array, m: number, n: number, extra: number, options = {}): void {
  const cols = n + extra;
  const f = qrFactor(new Float64Array(a0), m, n, extra, options);
  const ref = referenceQR(a0, m, n, cols);
  for (let j = 0; j < cols; j++) {
    const tol = 1e-13 * columnNorm(a0, m, j);
    for (let i = 0; i < Math.min(j + 1, n); i++) {
      const ours = i === j ? f.rdiag[j] : f.qr[j * m + i];
      expectClose(ours, ref.a[j * m + i], { abs: tol }, `R[${i},${j}] of ${m}×${n}+${extra}`);
    }
  }
}

describe("qrFactor multi-column sweeps", () => {
  it.each([
    [40, 1, 0], [40, 2, 1], [41, 3, 1], [40, 4, 1], [57, 5, 0], [64, 7, 1], [33, 9, 3], [12, 12, 0],
  ])("qrFactor(%i×%i, extra %i) gives the column-by-column R and Qᵀb to rounding", (m, n, extra) => {
    const a = randomMatrix(m, n + extra, 1000 * m + n);
    expectSameR(a, m, n, extra);
  });
  it("qrFactor with caller-supplied first-column sums and extraHeadOnly gives the same R and leading Qᵀb", () => {
    const m = 50;
    const n = 4;
    const a = randomMatrix(m, n + 1, 7);
    const gram = Float64Array.from({ length: n + 1 }, (_, j) => {
      let s = 0;
      for (let i = 1; i < m; i++) s += a[i] * a[j * m + i];
      return s;
    });
    expectSameR(a, m, n, 1, { gram, extraHeadOnly: true });
  });
  it("qrFactor skips a zero column (β = 0) and still factors the columns after it", () => {
    const m = 20;
    const a = randomMatrix(m, 4, 11);
    a.fill(0, m, 2 * m);
    const f = qrFactor(new Float64Array(a), m, 4);
    expect(f.beta[1]).toBe(0);
    expect(f.rdiag[1]).toBe(0);
    const ref = referenceQR(a.subarray(0, m), m, 1, 1);
    expectClose(Math.abs(f.rdiag[0]), Math.abs(ref.a[0]), { rel: 1e-14 });
    expect(Math.abs(f.rdiag[2])).toBeGreaterThan(0);
  });
});

describe("applyQt", () => {
  it("applyQt gives the reflector-by-reflector Qᵀb, and with headOnly its first n entries", () => {
    const m = 45;
    const n = 5;
    const a = randomMatrix(m, n, 21);
    const b = Float64Array.from(randomMatrix(m, 1, 22));
    const f = qrFactor(new Float64Array(a), m, n);
    const ref = referenceQR(a, m, n, n);
    const expected = new Float64Array(b);
    ref.v.forEach((vk, k) => {
      let s = 0;
      for (let i = k; i < m; i++) s += vk[i] * expected[i];
      for (let i = k; i < m; i++) expected[i] -= ref.beta[k] * s * vk[i];
    });
    const full = new Float64Array(b);
    applyQt(f, full);
    const head = new Float64Array(b);
    applyQt(f, head, true);
    const tol = 1e-13 * Math.hypot(...b);
    expected.forEach((e, i) => expectClose(full[i], e, { abs: tol }, `(Qᵀb)[${i}]`));
    for (let i = 0; i < n; i++) expect(head[i]).toBe(full[i]);
  });
  it("applyQtToColumn on b stored after the factored columns gives the same first n entries as applyQt", () => {
    const m = 45;
    const n = 5;
    const store = new Float64Array(m * (n + 1));
    store.set(randomMatrix(m, n, 21));
    const b = randomMatrix(m, 1, 22);
    store.set(b, n * m);
    const f = qrFactor(store, m, n);
    let t0 = 0;
    for (let i = 0; i < m; i++) t0 += f.qr[i] * b[i];
    applyQtToColumn(f, n, t0);
    const ref = new Float64Array(b);
    applyQt(f, ref, true);
    for (let i = 0; i < n; i++) expect(f.qr[n * m + i]).toBe(ref[i]);
  });
});

describe("solveLinearLeastSquares through the sweep kernels", () => {
  it("solveLinearLeastSquares on Longley (7 columns: blocks of 4 and 3) matches the reference R and the certified values to ≥ 12 digits", () => {
    const d = loadNist("Longley");
    const m = d.y.length;
    const a = new Float64Array(m * 8);
    for (let i = 0; i < m; i++) {
      a[i] = 1;
      for (let j = 0; j < 6; j++) a[(j + 1) * m + i] = d.X![i][j];
      a[7 * m + i] = d.y[i];
    }
    expectSameR(a, m, 7, 1);
    const res = solveLinearLeastSquares(a.subarray(0, 7 * m), m, 7, d.y);
    d.certified.parameters.forEach((p, j) => expect(lreOrAbs(res.coefficients[j], p.value, 1e-12), p.name).toBeGreaterThanOrEqual(12));
  });
  it("solveLinearLeastSquares returns residuals y − Ax and χ² = Σ((y − Ax)/σ)² of its coefficients (n = 6: two column blocks)", () => {
    const m = 80;
    const n = 6;
    const rand = seededRandom(5);
    const x = Array.from({ length: m }, (_, i) => i / (m - 1));
    const a = Float64Array.from({ length: m * n }, (_, k) => Math.cos((Math.floor(k / m) + 1) * x[k % m]));
    const y = x.map((t) => Math.exp(t) + 0.01 * (rand() - 0.5));
    const sigma = x.map((_, i) => 0.01 * (1 + (i % 3)));
    const res = solveLinearLeastSquares(a, m, n, y, { sigma });
    let chi = 0;
    for (let i = 0; i < m; i++) {
      let fit = 0;
      for (let j = 0; j < n; j++) fit += a[j * m + i] * res.coefficients[j];
      expectClose(res.residuals[i], y[i] - fit, { abs: 1e-13 });
      chi += ((y[i] - fit) / sigma[i]) ** 2;
    }
    expectClose(res.chiSquare, chi, { rel: 1e-10 });
  });
  it("solveLinearLeastSquares gives bit-identical results whatever was solved before (reused work memory) and returns no shared arrays", () => {
    const big = randomMatrix(300, 3, 31);
    const yBig = Array.from({ length: 300 }, (_, i) => Math.sin(i));
    const small = randomMatrix(10, 2, 32);
    const ySmall = Array.from({ length: 10 }, (_, i) => i);
    const first = solveLinearLeastSquares(big, 300, 3, yBig);
    const keep = { c: Array.from(first.coefficients), r: Array.from(first.residuals), v: Array.from(first.covariance) };
    solveLinearLeastSquares(small, 10, 2, ySmall, { sigma: ySmall.map((v) => 1 + v) });
    const again = solveLinearLeastSquares(big, 300, 3, yBig);
    expect(Array.from(first.coefficients)).toEqual(keep.c);
    expect(Array.from(first.residuals)).toEqual(keep.r);
    expect(Array.from(first.covariance)).toEqual(keep.v);
    expect(Array.from(again.coefficients)).toEqual(keep.c);
    expect(Array.from(again.residuals)).toEqual(keep.r);
    expect(again.chiSquare).toBe(first.chiSquare);
  });
  it.each([
    ["NaN in the first column", 0, 0, NaN],
    ["infinity inside the design", 2, 17, Infinity],
    ["NaN in the last column", 2, 29, NaN],
  ])("solveLinearLeastSquares throws InputError naming the design row for %s", (_, j, i, value) => {
    const m = 30;
    const a = randomMatrix(m, 3, 41);
    a[j * m + i] = value;
    const solve = () => solveLinearLeastSquares(a, m, 3, new Array(m).fill(1));
    expect(solve).toThrow(InputError);
    expect(solve).toThrow(`invalid design entry: ${value} (not finite) (line ${i + 1}, field design)`);
  });
  it("solveLinearLeastSquares throws InputError for a NaN design entry behind a zero first column, and for y = Infinity", () => {
    const m = 12;
    const a = randomMatrix(m, 3, 43);
    a.fill(0, 0, m);
    a[2 * m + 5] = NaN;
    expect(() => solveLinearLeastSquares(a, m, 3, new Array(m).fill(1))).toThrow(/invalid design entry: NaN/);
    const ok = randomMatrix(m, 2, 44);
    const y = new Array(m).fill(1);
    y[4] = Infinity;
    expect(() => solveLinearLeastSquares(ok, m, 2, y)).toThrow(/invalid y: Infinity/);
  });
});
