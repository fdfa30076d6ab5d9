/**
 * Gauss–Legendre nodes and weights on [−1, 1], computed once by Newton iteration on the
 * Legendre polynomial P_n (three-term recurrence), accurate to a few ulp for n ≤ 100.
 * Reference: Abramowitz & Stegun 25.4.29; Press et al., Numerical Recipes §4.6.
 */

export interface GaussRule {
  readonly nodes: Float64Array;
  readonly weights: Float64Array;
}

const cache = new Map<number, GaussRule>();

/** The n-point Gauss–Legendre rule on [−1, 1]. */
export function gaussLegendre(n: number): GaussRule {
  const hit = cache.get(n);
  if (hit) return hit;
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = 0;
      for (let k = 1; k <= n; k++) {
        const p2 = p1;
        p1 = p0;
        p0 = ((2 * k - 1) * z * p1 - (k - 1) * p2) / k;
      }
      dp = (n * (z * p0 - p1)) / (z * z - 1);
      const dz = p0 / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-16) break;
    }
    nodes[i] = -z;
    nodes[n - 1 - i] = z;
    weights[i] = weights[n - 1 - i] = 2 / ((1 - z * z) * dp * dp);
  }
  const rule = { nodes, weights };
  cache.set(n, rule);
  return rule;
}

/** ∫_a^b f(x) dx by the n-point rule. */
export function integrateGauss(f: (x: number) => number, a: number, b: number, n = 20): number {
  const { nodes, weights } = gaussLegendre(n);
  const half = (b - a) / 2;
  const mid = (a + b) / 2;
  let s = 0;
  for (let i = 0; i < n; i++) s += weights[i] * f(mid + half * nodes[i]);
  return s * half;
}
