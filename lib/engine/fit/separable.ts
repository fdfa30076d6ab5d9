/**
 * Separable least squares (variable projection, Golub & Pereyra, SIAM J. Numer. Anal. 10
 * (1973) 413): when the model is affine in some parameters a once the others θ are fixed,
 *   f(x; a, θ) = φ₀(x; θ) + Σ_k a_k φ_k(x; θ),
 * the best a(θ) is a weighted linear least-squares solution, and χ² becomes a function of θ
 * alone. The columns φ_k are read off the model itself (f with a_k = 1 minus f with a = 0),
 * which is exact for an affine dependence. Amplitude bounds are kept by an active set (the
 * worst violator is pinned on its bound and the rest solved again).
 * Used for the global start of nonlinear models: a grid over θ (zoomed in around its best
 * cells) and a reduced Levenberg–Marquardt over θ (central differences of the projected
 * residual, which include a(θ)'s dependence on θ).
 */
import { solveLinearLeastSquares } from "../linalg/lstsq";
import type { ModelCore } from "./core";
import { levenbergMarquardt } from "./lm";

export interface SeparableProblem {
  readonly core: ModelCore;
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly sigma: Float64Array | null;
  /** Full parameter vector holding the fixed values (copied, never mutated). */
  readonly base: Float64Array;
  /** Indices of free parameters that enter linearly. */
  readonly linear: readonly number[];
  /** Indices of free parameters that enter nonlinearly (θ). */
  readonly nonlinear: readonly number[];
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  /** Model evaluations so far (each over all points); the callers' work count. */
  evaluations: number;
}

/** A point of the θ search: the full parameter vector and its χ² (NaN when not computable). */
export interface Candidate {
  readonly p: Float64Array;
  readonly chi: number;
}

function evaluate(prob: SeparableProblem, p: Float64Array, out: Float64Array): void {
  prob.evaluations++;
  prob.core.evaluate(prob.x, p, out);
}

/** Fill the amplitudes of `p` (θ already set) by bounded weighted least squares; returns χ². */
export function solveAmplitudes(prob: SeparableProblem, p: Float64Array): number {
  const { x, y, sigma, linear, lower, upper } = prob;
  const m = x.length;
  for (const j of linear) p[j] = 0;
  const phi0 = new Float64Array(m);
  evaluate(prob, p, phi0);
  const cols = linear.map((j) => {
    const c = new Float64Array(m);
    p[j] = 1;
    evaluate(prob, p, c);
    p[j] = 0;
    for (let i = 0; i < m; i++) c[i] -= phi0[i];
    return c;
  });
  if (!phi0.every(Number.isFinite) || !cols.every((c) => c.every(Number.isFinite))) return NaN;
  const pinned = new Map<number, number>();
  for (let pass = 0; pass <= linear.length; pass++) {
    const free = linear.map((_, c) => c).filter((c) => !pinned.has(c));
    const target = Float64Array.from(y, (v, i) => v - phi0[i]);
    pinned.forEach((v, c) => { for (let i = 0; i < m; i++) target[i] -= v * cols[c][i]; });
    if (free.length) {
      const a = new Float64Array(m * free.length);
      free.forEach((c, k) => a.set(cols[c], k * m));
      let sol;
      try {
        sol = solveLinearLeastSquares(a, m, free.length, target, { sigma: sigma ?? undefined, refine: 0 });
      } catch {
        return NaN;
      }
      if (!sol.fullRank) return NaN;
      free.forEach((c, k) => (p[linear[c]] = sol.coefficients[k]));
    }
    pinned.forEach((v, c) => (p[linear[c]] = v));
    let worst = -1;
    let excess = 0;
    for (const c of free) {
      const j = linear[c];
      const over = Math.max(lower[j] - p[j], p[j] - upper[j]);
      if (over > excess) [worst, excess] = [c, over];
    }
    if (worst < 0) break;
    const j = linear[worst];
    pinned.set(worst, p[j] < lower[j] ? lower[j] : upper[j]);
  }
  pinned.forEach((v, c) => (p[linear[c]] = v));
  let chi = 0;
  for (let i = 0; i < m; i++) {
    let f = phi0[i];
    linear.forEach((j, c) => (f += p[j] * cols[c][i]));
    const r = (y[i] - f) / (sigma ? sigma[i] : 1);
    chi += r * r;
  }
  return Number.isFinite(chi) ? chi : NaN;
}

/** χ² at θ (values in `prob.nonlinear` order), amplitudes solved; the full vector is returned. */
export function projected(prob: SeparableProblem, theta: ArrayLike<number>): Candidate {
  const p = new Float64Array(prob.base);
  prob.nonlinear.forEach((j, k) => (p[j] = Math.min(prob.upper[j], Math.max(prob.lower[j], theta[k]))));
  return { p, chi: solveAmplitudes(prob, p) };
}

/** A search axis: log-spaced when both ends are > 0, else even. */
export interface Axis {
  readonly lo: number;
  readonly hi: number;
}

const toU = (a: Axis, v: number) => (a.lo > 0 ? Math.log(v) : v);
const fromU = (a: Axis, u: number) => (a.lo > 0 ? Math.exp(u) : u);

/**
 * Grid over θ with `points` per axis, then each of the best `keep` grid minima zoomed in
 * (5 points per axis over ± one cell, the cell halved `rounds` times). Returns the zoomed
 * candidates (best first) and the lowest χ² met anywhere.
 */
export function gridSearch(prob: SeparableProblem, axes: readonly Axis[], points: number, keep: number, rounds = 5): { candidates: Candidate[]; bestSeen: number } {
  const d = axes.length;
  const steps = axes.map((a) => (toU(a, a.hi) - toU(a, a.lo)) / (points - 1));
  const total = points ** d;
  const chi = new Float64Array(total);
  const thetaOf = (idx: number) => axes.map((a, k) => fromU(a, toU(a, a.lo) + steps[k] * (Math.floor(idx / points ** k) % points)));
  let bestSeen = Infinity;
  for (let idx = 0; idx < total; idx++) {
    chi[idx] = projected(prob, thetaOf(idx)).chi;
    if (chi[idx] < bestSeen) bestSeen = chi[idx];
  }
  const minima = localMinima(chi, points, d).slice(0, keep);
  const candidates = minima.map((idx) => {
    let theta = thetaOf(idx);
    let best = projected(prob, theta);
    let h = steps.slice();
    for (let r = 0; r < rounds; r++) {
      for (let k = 0; k < d; k++) {
        for (const s of [-1, -0.5, 0.5, 1]) {
          const t = theta.slice();
          t[k] = fromU(axes[k], toU(axes[k], theta[k]) + s * h[k]);
          const c = projected(prob, t);
          if (c.chi < best.chi) [best, theta] = [c, t];
        }
      }
      h = h.map((v) => v / 2);
    }
    if (best.chi < bestSeen) bestSeen = best.chi;
    return best;
  });
  return { candidates: candidates.filter((c) => Number.isFinite(c.chi)).sort((a, b) => a.chi - b.chi), bestSeen };
}

/** Grid indices whose χ² is finite and not above any axis neighbour's, lowest χ² first. */
function localMinima(chi: Float64Array, points: number, d: number): number[] {
  const out: number[] = [];
  for (let idx = 0; idx < chi.length; idx++) {
    if (!Number.isFinite(chi[idx])) continue;
    let min = true;
    for (let k = 0; k < d && min; k++) {
      const stride = points ** k;
      const pos = Math.floor(idx / stride) % points;
      if (pos > 0 && chi[idx - stride] < chi[idx]) min = false;
      if (pos < points - 1 && chi[idx + stride] < chi[idx]) min = false;
    }
    if (min) out.push(idx);
  }
  return out.sort((a, b) => chi[a] - chi[b]);
}

/** Reduced Levenberg–Marquardt over θ alone from `theta0` (amplitudes solved at every step). */
export function reducedFit(prob: SeparableProblem, theta0: ArrayLike<number>, maxEvaluations: number): Candidate {
  const q = prob.nonlinear.length;
  const m = prob.x.length;
  let last: Candidate = { p: new Float64Array(prob.base), chi: NaN };
  const model = (theta: Float64Array, out: Float64Array) => {
    const c = projected(prob, theta);
    if (!Number.isFinite(c.chi)) {
      out.fill(NaN);
      return;
    }
    last = c;
    evaluate(prob, c.p, out);
  };
  const lm = levenbergMarquardt(
    { m, n: q, y: prob.y, w: prob.sigma ? Float64Array.from(prob.sigma, (s) => 1 / s) : null, model, lower: Float64Array.from(prob.nonlinear, (j) => prob.lower[j]), upper: Float64Array.from(prob.nonlinear, (j) => prob.upper[j]) },
    theta0,
    { maxEvaluations, xtol: 1e-8, ftol: 1e-12 },
  );
  const c = projected(prob, lm.p);
  return Number.isFinite(c.chi) ? c : last;
}
