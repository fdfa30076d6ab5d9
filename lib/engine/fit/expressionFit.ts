/**
 * Fitting a compiled user expression: QR when it is linear in every parameter; otherwise
 *  - every free nonlinear parameter has a start: LM from it; if that does not converge, the
 *    global search (global.ts) takes over with the given start as its first trial, and the
 *    message says so;
 *  - some start is missing: the global multi-start (linear parameters solved exactly inside
 *    the search, the rest from deterministic starts across magnitudes).
 * Linear parameters never need a start (solved exactly at the start of the others).
 * The search budget and each local fit's evaluation limit scale inversely with points ×
 * compiled size, so large expressions on many points do proportionally less (bounded work:
 * about a second on a slow core); a fit stopped by that limit says converged: false.
 */
import type { CompiledExpression } from "../expression/compile";
import { fitCore, type CoreOptions, type ModelCore } from "./core";
import { fitGlobal } from "./global";
import type { FitResult } from "./result";
import { solveAmplitudes } from "./separable";

/** A ModelCore over a compiled expression. */
export function expressionCore(c: CompiledExpression, units?: readonly string[]): ModelCore {
  const n = c.parameters.length;
  let scratch = new Float64Array(0);
  return {
    label: c.text,
    names: c.parameters,
    units: units ?? new Array<string>(n).fill(""),
    linear: c.linear,
    evaluate: (x, p, out) => c.evaluate(x, p, out, 0),
    jacobian: (x, p, out) => {
      if (scratch.length !== x.length) scratch = new Float64Array(x.length);
      c.valueAndJacobian(x, p, scratch, out);
    },
  };
}

/** Work budget of a search, in point × compiled-term units (≈ 1 s on a slow core). */
const WORK = 4e7;

/** Model evaluations a search may spend on m points of `c`. */
export function searchBudget(c: Pick<CompiledExpression, "derivativeTerms">, m: number): number {
  return Math.max(300, Math.min(40000, Math.floor(WORK / (m * (c.derivativeTerms + 8)))));
}

/** Work of one local fit in point × compiled-term units (≈ 0.3 s: a Jacobian pass costs ~10 ns per unit). */
const LM_WORK = 2e7;

/** Evaluation limit of each local LM fit of `c` on m points (at most the usual 2 000). */
export function localFitLimit(c: Pick<CompiledExpression, "derivativeTerms">, m: number): number {
  return Math.max(30, Math.min(2000, Math.floor(LM_WORK / (m * (c.derivativeTerms + 8)))));
}

/** Fit `c` with start values `opt.start` (NaN = none given). */
export function fitExpression(c: CompiledExpression, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt0: CoreOptions): FitResult {
  return fitSeparableCore({ core: expressionCore(c), linearParameters: c.linearParameters, derivativeTerms: c.derivativeTerms }, x, y, sigma, opt0);
}

/**
 * A model core with the structure fitExpression uses: the names in which it is jointly affine
 * (core.linear when that is all of them), its compiled size for the work budget, and
 * optionally the scale of the independent variable for the multi-start (when x is not it,
 * e.g. a point index in a joint fit).
 */
export interface SeparableCore {
  readonly core: ModelCore;
  readonly linearParameters: readonly string[];
  readonly derivativeTerms: number;
  readonly xScale?: readonly [number, number];
}

/** fitExpression's strategy on any SeparableCore (see the module comment). */
export function fitSeparableCore(model: SeparableCore, x: Float64Array, y: Float64Array, sigma: Float64Array | null, opt0: CoreOptions): FitResult {
  const limit = Math.min(opt0.lm?.maxEvaluations ?? 2000, localFitLimit(model, x.length));
  const opt: CoreOptions = { ...opt0, lm: { ...opt0.lm, maxEvaluations: limit } };
  const core = model.core;
  if (core.linear) return fitCore(core, x, y, sigma, opt);
  const free = core.names.map((_, j) => j).filter((j) => !opt.fixed[j]);
  const linear = free.filter((j) => model.linearParameters.includes(core.names[j]));
  const nonlinear = free.filter((j) => !linear.includes(j));
  const search = { linear, nonlinear, axes: null, budget: searchBudget(model, x.length), xScale: model.xScale };
  const start = new Float64Array(opt.start);
  if (nonlinear.some((j) => !Number.isFinite(start[j]))) return fitGlobal(core, x, y, sigma, opt, { ...search, extraStarts: [start] });
  if (linear.some((j) => !Number.isFinite(start[j]))) {
    const prob = { core, x, y, sigma, base: start, linear: linear.filter((j) => !Number.isFinite(start[j])), nonlinear, lower: opt.lower, upper: opt.upper, evaluations: 0 };
    solveAmplitudes(prob, start);
    if (!start.every(Number.isFinite)) return fitGlobal(core, x, y, sigma, opt, { ...search, extraStarts: [] });
  }
  const first = fitCore(core, x, y, sigma, { ...opt, start });
  if (first.converged || nonlinear.length === 0) return first;
  const rescued = fitGlobal(core, x, y, sigma, opt, { ...search, extraStarts: [start] });
  const better = (rescued.chiSquare ?? Infinity) < (first.chiSquare ?? Infinity) || (rescued.converged && rescued.chiSquare === first.chiSquare);
  const chosen = better ? rescued : first;
  return Object.freeze({ ...chosen, evaluations: first.evaluations + rescued.evaluations, message: `the given start ended without convergence (${first.message}); ${better ? "" : "the global search found nothing lower; "}${chosen === rescued ? rescued.message : first.message}` });
}
