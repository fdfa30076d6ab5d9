/**
 * Givens row-updating kernels (lib/engine/scan/givens.ts): analytic identities.
 * R from rotating rows in must satisfy RᵀR = AᵀA and Qᵀb must satisfy Rᵀ(Qᵀb) = Aᵀb (exact
 * in exact arithmetic, as Q is orthogonal); scaling every row by a power of two scales R
 * exactly, also where the squares leave the exponent range and the rotation comes from a ratio.
 */
import { describe, it, expect } from "vitest";
import { appendRow, invertUpper, covarianceFromInverse, solveUpper, solveUpperTransposed } from "../../lib/engine/scan/givens";
import { expectClose } from "../helpers/expectClose";

// invented rows: a smooth 3-column design with an offset right-hand side
const N = 3;
const ROWS = Array.from({ length: 25 }, (_, i) => [1, 0.3 + i / 7, Math.cos(i)]);
const RHS = ROWS.map((r, i) => r[0] - 2 * r[1] + 0.5 * r[2] + 0.01 * Math.sin(3 * i));

function factor(scale: number) {
  const a = Float64Array.from(ROWS.flat(), (v) => v * scale);
  const r = new Float64Array(N * N);
  const qtb = new Float64Array(N);
  const work = new Float64Array(N);
  let rss = 0;
  ROWS.forEach((_, i) => (rss += appendRow(r, qtb, N, a, i * N, RHS[i] * scale, work) ** 2));
  return { r, qtb, rss };
}

describe("appendRow", () => {
  it("appendRow builds R with RᵀR = AᵀA and Rᵀ(Qᵀb) = Aᵀb", () => {
    const { r, qtb } = factor(1);
    for (let i = 0; i < N; i++) {
      for (let j = 0; j < N; j++) {
        let rtr = 0;
        for (let k = 0; k < N; k++) rtr += r[k * N + i] * r[k * N + j];
        const ata = ROWS.reduce((s, row) => s + row[i] * row[j], 0);
        expectClose(rtr, ata, { rel: 1e-13 }, `RᵀR[${i}][${j}]`);
      }
      let rtq = 0;
      for (let k = 0; k < N; k++) rtq += r[k * N + i] * qtb[k];
      expectClose(rtq, ROWS.reduce((s, row, k) => s + row[i] * RHS[k], 0), { rel: 1e-13 }, `RᵀQᵀb[${i}]`);
    }
    for (let i = 1; i < N; i++) for (let j = 0; j < i; j++) expect(r[i * N + j]).toBe(0);
  });

  it.each([[2 ** -600], [2 ** 600]])("appendRow on rows scaled by %d gives R scaled by the same power of two (squares out of range)", (scale) => {
    const ref = factor(1);
    const big = factor(scale);
    for (let k = 0; k < N * N; k++) expectClose(big.r[k] / scale, ref.r[k], { rel: 1e-14, abs: 1e-300 }, `R[${k}]`);
    for (let k = 0; k < N; k++) expectClose(big.qtb[k] / scale, ref.qtb[k], { rel: 1e-14 }, `Qᵀb[${k}]`);
  });
});

describe("triangular solves", () => {
  it("solveUpper, solveUpperTransposed and covarianceFromInverse invert R, Rᵀ and RᵀR", () => {
    const { r } = factor(1);
    const x = Float64Array.from([0.7, -1.3, 2.1]);
    const y = new Float64Array(N);
    for (let i = 0; i < N; i++) for (let k = i; k < N; k++) y[i] += r[i * N + k] * x[k];
    solveUpper(r, N, y);
    y.forEach((v, i) => expectClose(v, x[i], { rel: 1e-14 }));
    const z = new Float64Array(N);
    for (let i = 0; i < N; i++) for (let k = 0; k <= i; k++) z[i] += r[k * N + i] * x[k];
    solveUpperTransposed(r, N, z);
    z.forEach((v, i) => expectClose(v, x[i], { rel: 1e-14 }));
    const cov = covarianceFromInverse(invertUpper(r, N), N);
    // (RᵀR)·cov = I
    for (let i = 0; i < N; i++) {
      for (let j = 0; j < N; j++) {
        let s = 0;
        for (let k = 0; k < N; k++) {
          let rtr = 0;
          for (let l = 0; l < N; l++) rtr += r[l * N + i] * r[l * N + k];
          s += rtr * cov[k * N + j];
        }
        expectClose(s, i === j ? 1 : 0, { abs: 1e-12 }, `(RᵀR·cov)[${i}][${j}]`);
      }
    }
  });
});
