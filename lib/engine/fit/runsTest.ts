/**
 * Wald–Wolfowitz runs test on the signs of residuals in temperature order.
 * With n₊ positive and n₋ negative residuals (zeros dropped) and R runs:
 * μ = 2n₊n₋/n + 1, σ² = (μ − 1)(μ − 2)/(n − 1), z = (R − μ)/σ. Too few runs (z ≪ 0) means
 * the residuals have structure (the model misses a trend). Normal approximation; reported
 * only for n ≥ 10 with both signs present. Reference: Wald & Wolfowitz, Ann. Math. Stat.
 * 11 (1940) 147.
 */

export interface RunsTestResult {
  readonly runs: number;
  readonly expected: number;
  readonly z: number;
}

/** The runs test of `residuals` (already in the order to test), or null when not applicable. */
export function runsTest(residuals: ArrayLike<number>): RunsTestResult | null {
  const signs: boolean[] = [];
  for (let i = 0; i < residuals.length; i++) if (residuals[i] !== 0) signs.push(residuals[i] > 0);
  const n = signs.length;
  const nPos = signs.filter(Boolean).length;
  const nNeg = n - nPos;
  if (n < 10 || nPos === 0 || nNeg === 0) return null;
  let runs = 1;
  for (let i = 1; i < n; i++) if (signs[i] !== signs[i - 1]) runs++;
  const mu = (2 * nPos * nNeg) / n + 1;
  const variance = ((mu - 1) * (mu - 2)) / (n - 1);
  return { runs, expected: mu, z: variance > 0 ? (runs - mu) / Math.sqrt(variance) : 0 };
}
