/**
 * recommendFit: the recommended model and window for γ and β, with a statistical and a
 * systematic standard uncertainty. Units SI in, SI out (γ J mol⁻¹ K⁻², β J mol⁻¹ K⁻⁴).
 *
 * 1. Candidates (default): C = γT + βT³ ("sommerfeld"), + δT⁵ ("sommerfeld-t5"), + A/T²
 *    ("nuclear"), + a two-level Schottky term with free gap ("schottky", separable least
 *    squares: gapCandidate.ts), and the user's own model when given.
 * 2. Windows: one grid for all candidates (recommendGrid.ts); every candidate is fitted on
 *    every window, linear ones by QR row updating, the Schottky one by its gap profile.
 * 3. A (model, window) fit is acceptable when the model describes the data there
 *    (windowTests.ts: χ² tail probability ≥ α with known σ, runs test, no trend in binned
 *    residuals; without σ only the two residual tests, scaled by the residual scatter).
 * 4. Model: compared by AICc on common data — the common window is the acceptable window
 *    (of any candidate) with the most points; among the candidates acceptable there, the
 *    lowest AICc wins.
 * 5. Window (one sentence): the chosen model's acceptable window with the smallest
 *    statistical σ(γ).
 * 6. Statistical σ: that window's standard errors. Systematic σ: the root-mean-square
 *    deviation of γ (β) over all acceptable fits of all candidates from the recommended
 *    value, each fit weighted by 1/σ_stat², so that the spread over windows and models that
 *    all describe the data is carried as an uncertainty while windows too narrow to say
 *    much count little. Total σ = √(stat² + syst²).
 * 7. No recommendation when the chosen model is acceptable on fewer than MIN_ACCEPTABLE
 *    windows (one or two windows passing among hundreds can be chance, and say nothing
 *    about the window dependence), or when no fit is acceptable at all: no recommendation (recommended: false, no values), the reason
 *    says so and names the likely missing term (diagnose.ts). There is no fallback window.
 * Failure modes: InputError for invalid data (as fitHeatCapacity), an unknown model name, or
 * invalid options.
 */
import { InputError, invalid } from "../errors";
import { checkSeries } from "../fit/curve";
import { getModel } from "../models/registry";
import type { HeatCapacityInput } from "../fit/heatCapacity";
import type { SortedSeries } from "./linearCells";
import { recommendationWindows, type RecommendWindow } from "./recommendGrid";
import { linearCandidateCells } from "./linearCandidate";
import { gapCandidateCells } from "./gapCandidate";
import { generalCandidateCells } from "./generalCandidate";
import type { CandidateCell } from "./candidateCell";
import { DEFAULT_TEST_LEVEL } from "./windowTests";
import { departures, missingTermText } from "./diagnose";
import { describeRecommendation, describeRefusal } from "./recommendText";

/** Fewest acceptable windows of the chosen model for a recommendation. */
export const MIN_ACCEPTABLE = 3;

export const DEFAULT_CANDIDATES = Object.freeze(["sommerfeld", "sommerfeld-t5", "nuclear", "schottky"]);

export interface RecommendOptions {
  /** Registry model names; default DEFAULT_CANDIDATES. */
  readonly candidates?: readonly string[];
  /** The user's own model: a registry name or an expression over T (with `userStart` when nonlinear). */
  readonly userModel?: string | { readonly expression: string };
  readonly userStart?: Readonly<Record<string, number>>;
  /** Lower and upper edges per axis of the default grid; default 14. */
  readonly gridSize?: number;
  readonly tMinGridK?: readonly number[];
  readonly tMaxGridK?: readonly number[];
  /** Smallest window; default 16 points. */
  readonly minPoints?: number;
  /** T_max/T_min of a window at least this; default 2. */
  readonly spanRatio?: number;
  /** Level α of the window tests; default 0.01. */
  readonly level?: number;
  readonly r?: number;
}

export interface CandidateScan {
  readonly model: string;
  readonly title: string;
  readonly cells: readonly CandidateCell[];
  readonly acceptableCount: number;
}

export interface ModelChoiceRow {
  readonly model: string;
  readonly title: string;
  readonly acceptable: boolean;
  readonly aicc: number | null;
  /** AICc − the lowest AICc among the acceptable candidates on the common window. */
  readonly deltaAicc: number | null;
  readonly gamma: number | null;
  readonly gammaStdError: number | null;
}

export interface WindowRef {
  readonly tMinK: number;
  readonly tMaxK: number;
  readonly nPoints: number;
}

export interface Recommendation {
  readonly recommended: boolean;
  readonly model: string | null;
  readonly modelTitle: string | null;
  readonly window: WindowRef | null;
  readonly gamma: number | null;
  readonly gammaStdError: number | null;
  readonly gammaSystematicError: number | null;
  readonly beta: number | null;
  readonly betaStdError: number | null;
  readonly betaSystematicError: number | null;
  /** Of the recommended fit; χ²_red is null without σ (it then means nothing). */
  readonly reducedChiSquare: number | null;
  /** Of the recommended fit, J mol⁻¹ K⁻¹. */
  readonly residualStdDev: number | null;
  readonly weighting: "sigma" | "none";
  readonly commonWindow: WindowRef | null;
  readonly comparison: readonly ModelChoiceRow[];
  readonly acceptableFits: number;
  readonly totalFits: number;
  readonly missingTerm: string | null;
  /** The rules applied, in words. */
  readonly method: string;
  readonly reason: string;
  readonly candidates: readonly CandidateScan[];
}

function sortedSeries(data: HeatCapacityInput): SortedSeries {
  const d = checkSeries(data.temperatureK, data.heatCapacity, data.sigma, ["temperatureK", "heatCapacity", "sigma"]);
  d.x.forEach((t, i) => {
    if (!(t > 0)) throw new InputError(`invalid temperatureK: ${t} at point ${i + 1} (must be > 0 K)`, { field: "temperatureK", line: i + 1 });
  });
  const order = Array.from(d.x, (_, i) => i).sort((a, b) => d.x[a] - d.x[b]);
  const pick = (v: Float64Array) => Float64Array.from(order, (i) => v[i]);
  return { T: pick(d.x), C: pick(d.y), S: d.sigma ? pick(d.sigma) : null };
}

function checkOptions(o: RecommendOptions): void {
  const positiveInt = (name: string, v: number | undefined, min: number) => {
    if (v !== undefined && !(Number.isInteger(v) && v >= min)) throw invalid(name, v, `must be an integer ≥ ${min}`);
  };
  positiveInt("gridSize", o.gridSize, 1);
  positiveInt("minPoints", o.minPoints, 4);
  if (o.spanRatio !== undefined && !(o.spanRatio >= 1 && Number.isFinite(o.spanRatio))) throw invalid("spanRatio", o.spanRatio, "must be a finite number ≥ 1");
  if (o.level !== undefined && !(o.level > 0 && o.level < 0.5)) throw invalid("level", o.level, "must lie in (0, 0.5)");
}

function scanCandidate(name: string, s: SortedSeries, windows: readonly RecommendWindow[], level: number, r: number | undefined): CandidateScan {
  const model = getModel(name);
  let cells: CandidateCell[];
  if (model.linear && model.basis && model.parameters.every((p) => p.fixedByDefault === undefined)) cells = linearCandidateCells(model.basis, model.parameters.map((p) => p.name), s, windows, level);
  else if (name === "schottky") cells = gapCandidateCells(s, windows, level);
  else cells = generalCandidateCells(s, windows, name, { r }, level);
  return freeze(name, model.title, cells);
}

function freeze(model: string, title: string, cells: CandidateCell[]): CandidateScan {
  return Object.freeze({ model, title, cells: Object.freeze(cells), acceptableCount: cells.filter((c) => c.acceptable).length });
}

/** 1/σ²-weighted RMS deviation of `value` over the acceptable cells from `center`. */
export function systematicSpread(cells: readonly CandidateCell[], value: (c: CandidateCell) => number | null, sigma: (c: CandidateCell) => number | null, center: number): number {
  let sw = 0;
  let swd = 0;
  for (const c of cells) {
    const v = value(c);
    const s = sigma(c);
    if (!c.acceptable || v === null || s === null || !(s > 0)) continue;
    const w = 1 / (s * s);
    sw += w;
    swd += w * (v - center) ** 2;
  }
  return sw > 0 ? Math.sqrt(swd / sw) : 0;
}

/** Recommend a model and window; see the module comment. */
export function recommendFit(data: HeatCapacityInput, options: RecommendOptions = {}): Recommendation {
  checkOptions(options);
  const s = sortedSeries(data);
  if (s.T.length === 0) throw new InputError("no data points to scan", { field: "temperatureK" });
  const level = options.level ?? DEFAULT_TEST_LEVEL;
  const windows = recommendationWindows(s.T, {
    size: options.gridSize ?? 14, minPoints: options.minPoints ?? 16, spanRatio: options.spanRatio ?? 2, tMinGridK: options.tMinGridK, tMaxGridK: options.tMaxGridK,
  });
  const names = [...new Set(options.candidates ?? DEFAULT_CANDIDATES)];
  const candidates = names.map((n) => scanCandidate(n, s, windows, level, options.r));
  const user = options.userModel;
  if (user !== undefined && !(typeof user === "string" && names.includes(user))) {
    candidates.push(typeof user === "string"
      ? scanCandidate(user, s, windows, level, options.r)
      : freeze("expression", `user expression ${user.expression}`, generalCandidateCells(s, windows, user, { r: options.r, start: options.userStart }, level)));
  }
  return choose(s, windows, candidates, level);
}

function choose(s: SortedSeries, windows: readonly RecommendWindow[], candidates: CandidateScan[], level: number): Recommendation {
  const weighting = s.S ? "sigma" : "none";
  const all = candidates.flatMap((c) => c.cells);
  const base = { weighting, candidates: Object.freeze(candidates), acceptableFits: all.filter((c) => c.acceptable).length, totalFits: all.length } as const;
  let common = -1;
  windows.forEach((w, k) => {
    if (!candidates.some((c) => c.cells[k].acceptable)) return;
    if (common < 0 || w.hi - w.lo > windows[common].hi - windows[common].lo) common = k;
  });
  const ok = common < 0 ? [] : candidates.filter((c) => c.cells[common].acceptable);
  const minA = Math.min(...ok.map((c) => c.cells[common].aicc ?? Infinity));
  const comparison = common < 0 ? [] : candidates.map((c): ModelChoiceRow => {
    const cell = c.cells[common];
    return Object.freeze({ model: c.model, title: c.title, acceptable: cell.acceptable, aicc: cell.aicc, deltaAicc: cell.aicc === null ? null : cell.aicc - minA, gamma: cell.gamma, gammaStdError: cell.gammaStdError });
  }).sort((a, b) => Number(b.acceptable) - Number(a.acceptable) || (a.aicc ?? Infinity) - (b.aicc ?? Infinity));
  const chosen = common < 0 ? undefined : candidates.find((c) => c.model === comparison[0].model)!;
  if (!chosen || chosen.acceptableCount < MIN_ACCEPTABLE) {
    const missingTerm = missingTermText(departures(s));
    return Object.freeze({
      ...base, recommended: false, model: null, modelTitle: null, window: null, gamma: null, gammaStdError: null, gammaSystematicError: null,
      beta: null, betaStdError: null, betaSystematicError: null, reducedChiSquare: null, residualStdDev: null, commonWindow: null, comparison: Object.freeze([]),
      missingTerm, ...describeRefusal(s, windows, candidates, level, missingTerm, chosen ? { title: chosen.title, count: chosen.acceptableCount } : null),
    });
  }
  const best = chosen.cells.reduce<CandidateCell | null>((a, c) => (c.acceptable && (a === null || c.gammaStdError! < a.gammaStdError!) ? c : a), null)!;
  const gammaSyst = systematicSpread(all, (c) => c.gamma, (c) => c.gammaStdError, best.gamma!);
  const betaSyst = best.beta === null ? null : systematicSpread(all, (c) => c.beta, (c) => c.betaStdError, best.beta);
  const cw = windows[common];
  const rec = {
    ...base, recommended: true, model: chosen.model, modelTitle: chosen.title,
    window: Object.freeze({ tMinK: best.tMinK, tMaxK: best.tMaxK, nPoints: best.nPoints }),
    gamma: best.gamma, gammaStdError: best.gammaStdError, gammaSystematicError: gammaSyst,
    beta: best.beta, betaStdError: best.betaStdError, betaSystematicError: betaSyst,
    reducedChiSquare: s.S ? best.reducedChiSquare : null, residualStdDev: best.residualStdDev,
    commonWindow: Object.freeze({ tMinK: cw.tMinK, tMaxK: cw.tMaxK, nPoints: cw.hi - cw.lo + 1 }), comparison: Object.freeze(comparison), missingTerm: null,
  };
  return Object.freeze({ ...rec, ...describeRecommendation(rec, level) });
}
