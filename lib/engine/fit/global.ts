/**
 * Global starting values for nonlinear fits, then Levenberg–Marquardt over all parameters.
 *
 * The parameters that enter linearly (amplitudes) are solved exactly for each trial of the
 * nonlinear ones θ (separable.ts). θ is searched either
 *  - on a grid (registry models: axes from the data's temperature range, a few dimensions),
 *    zoomed in around its best minima, or
 *  - by a deterministic multi-start (user expressions, where no scale is known): Halton points
 *    over magnitudes 10⁻⁶…10⁶ of both signs, plus the caller's own starts, each followed by a
 *    reduced LM over θ.
 * The best few end points (and any caller start, e.g. the model's guess) are polished by the
 * full LM; the lowest χ² wins. The lowest χ² met anywhere in the search is handed to the fit,
 * so a fit that ends above it is reported not converged (core.ts). The work is bounded by a
 * budget of model evaluations (each over all points); the message says what was done, and the
 * result's `evaluations` counts every model evaluation spent (search and local fits). Data sets
 * larger than SEARCH_POINTS are searched on an even subset, then polished on all points.
 */
import { fitNonlinear, type CoreOptions, type ModelCore } from "./core";
import type { FitResult } from "./result";
import { gridSearch, projected, reducedFit, type Axis, type Candidate, type SeparableProblem } from "./separable";

export interface GlobalSearch {
  /** Free parameters entering linearly (indices into core.names). */
  readonly linear: readonly number[];
  /** Free parameters entering nonlinearly. */
  readonly nonlinear: readonly number[];
  /** One axis per nonlinear parameter for a grid search, or null for the multi-start. */
  readonly axes: readonly Axis[] | null;
  /** Full parameter vectors to try as well (model guess, the caller's start). */
  readonly extraStarts: readonly Float64Array[];
  /** Budget in model evaluations over all points (search only; the final LM has its own). */
  readonly budget: number;
  /** LM only from extraStarts (the caller's own start); the search only checks the end point. */
  readonly startsOnly?: boolean;
  /** Smallest and largest |x| of the independent variable, for the multi-start when x is not it (default: from x). */
  readonly xScale?: readonly [number, number];
}

const GRID_POINTS: Record<number, number> = { 1: 121, 2: 31, 3: 11 };
/** Points used by the search (spread evenly by index over larger data sets). */
const SEARCH_POINTS = 256;

/** Fit with a global search for the start. See the module comment. */
export function fitGlobal(core: ModelCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt: CoreOptions, search: GlobalSearch): FitResult {
  const m = x.length;
  if (m < opt.fixed.filter((f) => !f).length || search.nonlinear.length === 0) return fitNonlinear(core, x, y, sigma, opt);
  // the search and the first polish run on at most SEARCH_POINTS points spread over the data
  const pick = m > SEARCH_POINTS ? Array.from({ length: SEARCH_POINTS }, (_, k) => Math.round((k * (m - 1)) / (SEARCH_POINTS - 1))) : null;
  const sub = <T extends Float64Array | null>(a: T): T => (pick && a ? (Float64Array.from(pick, (i) => a[i]) as T) : a);
  const [sx, sy, ss] = [sub(x), sub(y), sub(sigma)];
  const base = Float64Array.from(opt.start, (v, j) => (opt.fixed[j] ? v : 0));
  const prob: SeparableProblem = { core, x: sx, y: sy, sigma: ss, base, linear: search.linear, nonlinear: search.nonlinear, lower: opt.lower, upper: opt.upper, evaluations: 0 };
  const found = search.axes && search.axes.length <= 3 ? gridStage(prob, search.axes, search.budget) : multiStart(prob, search);
  const own = search.extraStarts.filter((s) => s.every(Number.isFinite));
  const ownOnly = search.startsOnly === true && own.length > 0;
  const starts: Float64Array[] = ownOnly ? own : [...found.candidates.slice(0, 3).map((c) => c.p), ...own];
  const where = found.candidates.length ? describe(core, search.nonlinear, found.candidates[0].p) : "";
  const seenOn = (chi: number, yy: Float64Array, s: Float64Array | null) => (Number.isFinite(chi) ? { chiSquare: chi, where, floor: roundingFloor(yy, s) } : undefined);
  let winner: FitResult | null = null;
  let lmEvaluations = 0;
  if (!(pick && ownOnly)) {
    const bestSeen = seenOn(Math.min(found.bestSeen, ...found.candidates.map((c) => c.chi)), sy, ss);
    for (const start of starts) {
      const r = fitNonlinear(core, sx, sy, ss, { ...opt, start, bestSeen });
      lmEvaluations += r.evaluations;
      if (!winner || chiOf(r) < chiOf(winner) || (chiOf(r) === chiOf(winner) && r.converged && !winner.converged)) winner = r;
    }
  }
  const full: SeparableProblem = { ...prob, x, y, sigma, evaluations: 0 };
  if (pick) {
    // polish on all points; "seen" is then the best search candidate re-solved on all points
    const seen = Math.min(...found.candidates.slice(0, 3).map((c) => projected(full, search.nonlinear.map((j) => c.p[j])).chi).filter(Number.isFinite));
    const start = winner ? Float64Array.from(winner.parameters, (p) => p.value) : own[0];
    winner = start ? fitNonlinear(core, x, y, sigma, { ...opt, start, bestSeen: seenOn(seen, y, sigma) }) : null;
    lmEvaluations += winner?.evaluations ?? 0;
  }
  if (!winner) return fitNonlinear(core, x, y, sigma, opt);
  const on = pick ? ` on ${SEARCH_POINTS} of the ${m} points` : "";
  const note = ownOnly
    ? `from the given start, checked against a global search${on} (${found.how}; ${prob.evaluations} model evaluations)`
    : `start from a global search${on} (${found.how}; ${prob.evaluations} model evaluations), best of ${starts.length} local fits`;
  // evaluations: everything spent, search and every local fit (Jacobians not counted)
  return Object.freeze({ ...winner, evaluations: prob.evaluations + lmEvaluations + (pick ? full.evaluations : 0), message: `${winner.message}; ${note}` });
}

const chiOf = (r: FitResult) => r.chiSquare ?? Infinity;

/** Σ(8ε|y_i|/σ_i)²: the squared rounding of the weighted residuals (a few ulp of y each). */
function roundingFloor(y: Float64Array, sigma: Float64Array | null): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += ((8 * Number.EPSILON * Math.abs(y[i])) / (sigma ? sigma[i] : 1)) ** 2;
  return s;
}

function describe(core: ModelCore, idx: readonly number[], p: Float64Array): string {
  return idx.map((j) => `${core.names[j]} = ${Number(p[j].toPrecision(6))}${core.units[j] && core.units[j] !== "1" ? ` ${core.units[j]}` : ""}`).join(", ");
}

function gridStage(prob: SeparableProblem, axes: readonly Axis[], budget: number) {
  const d = axes.length;
  const perPoint = prob.linear.length + 1;
  // keep the grid within the budget: points^d × (amplitudes + 1) evaluations, zoom extra
  const points = Math.max(5, Math.min(GRID_POINTS[d] ?? 7, Math.floor((budget / perPoint / 2) ** (1 / d))));
  const keep = d === 1 ? 3 : 2;
  const g = gridSearch(prob, axes, points, keep);
  return { ...g, how: `grid of ${points}${d > 1 ? `^${d}` : ""} points over ${prob.nonlinear.map((j) => prob.core.names[j]).join(", ")}, zoomed around ${keep} minima, amplitudes solved exactly` };
}

/** Halton radical inverse of `i` in base `b`. */
function halton(i: number, b: number): number {
  let f = 1;
  let r = 0;
  for (let k = i; k > 0; k = Math.floor(k / b)) {
    f /= b;
    r += f * (k % b);
  }
  return r;
}

const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61, 67, 71, 73, 79, 83, 89, 97, 101, 103, 107, 109, 113];

/**
 * Deterministic θ starts: all ones, then Halton points alternately over sign × 10^[−6, 6] and
 * over the data's own scale (|x| from a tenth of the smallest to ten times the largest, or its
 * reciprocal: the magnitudes of a centre, width or rate in x).
 */
export function multiStartThetas(q: number, count: number, xScale?: readonly [number, number]): number[][] {
  const out: number[][] = [new Array<number>(q).fill(1)];
  const [lo, hi] = xScale && xScale[0] > 0 && xScale[1] >= xScale[0] ? [Math.log10(xScale[0]) - 1, Math.log10(xScale[1]) + 1] : [-6, 6];
  for (let s = 1; out.length < count; s++) {
    const scaled = s % 2 === 0 && xScale !== undefined;
    out.push(Array.from({ length: q }, (_, i) => {
      const h = halton(s, PRIMES[(3 * i) % PRIMES.length]);
      const sign = halton(s, PRIMES[(3 * i + 1) % PRIMES.length]) < 0.25 ? -1 : 1;
      if (!scaled) return sign * 10 ** (12 * h - 6);
      const mag = 10 ** (lo + (hi - lo) * h);
      return sign * (halton(s, PRIMES[(3 * i + 2) % PRIMES.length]) < 0.5 ? mag : 1 / mag);
    }));
  }
  return out;
}

/** Smallest and largest non-zero |x|. */
function scaleOf(x: Float64Array): [number, number] | undefined {
  let lo = Infinity;
  let hi = 0;
  for (const v of x) if (v !== 0) [lo, hi] = [Math.min(lo, Math.abs(v)), Math.max(hi, Math.abs(v))];
  return hi > 0 ? [lo, hi] : undefined;
}

function multiStart(prob: SeparableProblem, search: GlobalSearch) {
  const q = prob.nonlinear.length;
  const own = search.extraStarts.map((s) => prob.nonlinear.map((j) => s[j])).filter((t) => t.every(Number.isFinite));
  const thetas = [...own, ...multiStartThetas(q, q <= 3 ? 48 : 64, search.xScale ?? scaleOf(prob.x))];
  const candidates: Candidate[] = [];
  let bestSeen = Infinity;
  let tried = 0;
  const perFit = Math.max(40, Math.floor(search.budget / thetas.length / (prob.linear.length + 2)));
  for (const theta of thetas) {
    if (prob.evaluations >= search.budget) break;
    tried++;
    if (!Number.isFinite(projected(prob, theta).chi)) continue;
    const c = reducedFit(prob, theta, Math.min(perFit, 200));
    if (!Number.isFinite(c.chi)) continue;
    bestSeen = Math.min(bestSeen, c.chi);
    if (!candidates.some((o) => close(o, c, prob.nonlinear))) candidates.push(c);
  }
  candidates.sort((a, b) => a.chi - b.chi);
  return { candidates, bestSeen, how: `${tried} of ${thetas.length} starts over ${prob.nonlinear.map((j) => prob.core.names[j]).join(", ")} with the linear parameters solved exactly` };
}

function close(a: Candidate, b: Candidate, idx: readonly number[]): boolean {
  return idx.every((j) => Math.abs(a.p[j] - b.p[j]) <= 1e-6 * Math.max(Math.abs(a.p[j]), Math.abs(b.p[j])));
}
