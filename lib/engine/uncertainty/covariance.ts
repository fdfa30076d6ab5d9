/**
 * Covariance matrices for first-order error propagation: building one from standard errors
 * and correlations, and checking one that was supplied (square, symmetric, non-negative
 * diagonal, |ρ| ≤ 1).
 */
import { invalid } from "../errors";

export type Matrix = readonly (readonly number[])[];

/**
 * Covariance from standard errors σ_i and an optional correlation matrix ρ_ij:
 * Σ_ij = ρ_ij σ_i σ_j (ρ = identity when omitted). Throws InputError on a negative or
 * non-finite σ, or a correlation matrix of the wrong shape or with |ρ| > 1.
 */
export function covarianceFromErrors(stdErrors: readonly number[], correlation?: Matrix): number[][] {
  stdErrors.forEach((s, i) => {
    if (!Number.isFinite(s) || s < 0) throw invalid(`stdErrors[${i}]`, s, "a standard error must be finite and ≥ 0");
  });
  const n = stdErrors.length;
  if (correlation) checkSquare(correlation, n, "correlation");
  return stdErrors.map((si, i) =>
    stdErrors.map((sj, j) => {
      const rho = correlation ? correlation[i][j] : i === j ? 1 : 0;
      if (Math.abs(rho) > 1 + 1e-12) throw invalid(`correlation[${i}][${j}]`, rho, "|ρ| must be ≤ 1");
      return (i === j ? 1 : rho) * si * sj;
    }),
  );
}

/** Covariance of two quantities with standard errors σa, σb and covariance cov (default 0). */
export function covariance2(sigmaA: number, sigmaB: number, cov = 0): number[][] {
  return [
    [sigmaA * sigmaA, cov],
    [cov, sigmaB * sigmaB],
  ];
}

/** Correlation ρ_ij = Σ_ij / √(Σ_ii Σ_jj); 0 where a variance is 0. */
export function correlationOf(cov: Matrix, i: number, j: number): number {
  const d = Math.sqrt(cov[i][i] * cov[j][j]);
  return d > 0 ? cov[i][j] / d : 0;
}

/**
 * Check a covariance matrix for n parameters: n×n, finite, symmetric to 1e-9 relative,
 * diagonal ≥ 0, |ρ_ij| ≤ 1 (+1e-9). Throws InputError naming the offending entry.
 */
export function checkCovariance(cov: Matrix, n: number, name = "covariance"): void {
  checkSquare(cov, n, name);
  for (let i = 0; i < n; i++) {
    if (cov[i][i] < 0) throw invalid(`${name}[${i}][${i}]`, cov[i][i], "a variance must be ≥ 0");
    for (let j = 0; j < i; j++) {
      const scale = Math.max(Math.abs(cov[i][j]), Math.abs(cov[j][i]), 1e-300);
      if (Math.abs(cov[i][j] - cov[j][i]) > 1e-9 * scale) throw invalid(`${name}[${i}][${j}]`, cov[i][j], "matrix is not symmetric");
      if (Math.abs(correlationOf(cov, i, j)) > 1 + 1e-9) throw invalid(`${name}[${i}][${j}]`, cov[i][j], "implies |correlation| > 1");
    }
  }
}

function checkSquare(m: Matrix, n: number, name: string): void {
  if (m.length !== n) throw invalid(name, `${m.length} rows`, `expected ${n}×${n}`);
  m.forEach((row, i) => {
    if (row.length !== n) throw invalid(`${name}[${i}]`, `${row.length} columns`, `expected ${n}`);
    row.forEach((v, j) => {
      if (!Number.isFinite(v)) throw invalid(`${name}[${i}][${j}]`, v, "not a finite number");
    });
  });
}
