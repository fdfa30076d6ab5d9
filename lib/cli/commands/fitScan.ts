/**
 * `heatbook fit FILE --scan`: the model-and-window recommendation (engine recommendFit) over
 * the data inside --t-min/--t-max, and its JSON and text. The JSON block `scan.recommended`
 * carries `recommended` (false: no window of any candidate describes the data; then the
 * values are null and `reason` names the likely missing term), `model`, `tMinK`, `tMaxK`,
 * `nPoints`, `gamma`, `gammaStdError`, `gammaSystematicError`, `beta`, `betaStdError`,
 * `betaSystematicError` (γ in mJ/(mol*K^2), β in mJ/(mol*K^4), as `scan.units` says and as
 * `parameters` prints them), `reducedChiSquare` (null without σ), `residualStdDev`
 * (mJ/(mol*K)), `reason` and `method` (the rules in words). `scan.candidates` lists every
 * candidate's windows with their tests; `scan.cells` the windows of the recommended model.
 */
import { InputError } from "../../engine/errors";
import { MODELS } from "../../engine/models";
import { DEFAULT_CANDIDATES, recommendFit, type CandidateCell, type Recommendation } from "../../engine/scan";

export interface ScanData {
  readonly temperatureK: readonly number[];
  readonly heatCapacity: readonly number[];
  readonly sigma?: readonly number[];
}

/** The recommendation for `model` (added as the user's candidate unless it is one of the defaults). */
export function runRecommendation(
  data: ScanData, model: string | { readonly expression: string }, window: { tMinK?: number; tMaxK?: number }, r: number | undefined, start: Readonly<Record<string, number>> | undefined,
): Recommendation {
  const inRange = data.temperatureK.map((_, i) => i).filter((i) => (window.tMinK === undefined || data.temperatureK[i] >= window.tMinK) && (window.tMaxK === undefined || data.temperatureK[i] <= window.tMaxK));
  if (inRange.length === 0) throw new InputError(`no points in the window [${window.tMinK ?? "−∞"}, ${window.tMaxK ?? "∞"}] K`, { field: "t-min" });
  const sub = (a: readonly number[]) => inRange.map((i) => a[i]);
  const userModel = typeof model === "string" && DEFAULT_CANDIDATES.includes(model) ? undefined : model;
  return recommendFit(
    { temperatureK: sub(data.temperatureK), heatCapacity: sub(data.heatCapacity), sigma: data.sigma ? sub(data.sigma) : undefined },
    { ...(userModel !== undefined ? { userModel, userStart: start } : {}), r },
  );
}

/** The model to fit for the recommendation: a registry name or the user's expression. */
export function recommendedModel(rec: Recommendation, requested: string | { readonly expression: string }): string | { readonly expression: string } {
  return rec.model === "expression" ? requested : rec.model!;
}

const mJ = (v: number | null) => (v === null ? null : v * 1e3);

function cellJson(c: CandidateCell) {
  const extra = Object.fromEntries(Object.entries(c.extra).map(([k, v]) => [k, k === "gap" || k === "n" ? v : v * (MODELS.nuclear.parameters.find((p) => p.name === k)?.displayFactor ?? MODELS["sommerfeld-t5"].parameters.find((p) => p.name === k)?.displayFactor ?? 1)]));
  return {
    tMinK: c.tMinK, tMaxK: c.tMaxK, nPoints: c.nPoints, nFree: c.nFree, gamma: mJ(c.gamma), gammaStdError: mJ(c.gammaStdError), beta: mJ(c.beta), betaStdError: mJ(c.betaStdError),
    extra, reducedChiSquare: c.reducedChiSquare, residualStdDev: mJ(c.residualStdDev), aicc: c.aicc, acceptable: c.acceptable, failedTests: c.tests?.failed ?? [], note: c.note,
  };
}

/** The `scan` block of `heatbook fit --json`. */
export function recommendationJson(rec: Recommendation, sigmaKnown: boolean) {
  const chosen = rec.candidates.find((c) => c.model === rec.model) ?? rec.candidates[0];
  return {
    recommended: {
      recommended: rec.recommended, model: rec.model, modelTitle: rec.modelTitle,
      tMinK: rec.window?.tMinK ?? null, tMaxK: rec.window?.tMaxK ?? null, nPoints: rec.window?.nPoints ?? null,
      gamma: mJ(rec.gamma), gammaStdError: mJ(rec.gammaStdError), gammaSystematicError: mJ(rec.gammaSystematicError),
      beta: mJ(rec.beta), betaStdError: mJ(rec.betaStdError), betaSystematicError: mJ(rec.betaSystematicError),
      reducedChiSquare: sigmaKnown ? rec.reducedChiSquare : null, residualStdDev: mJ(rec.residualStdDev),
      missingTerm: rec.missingTerm, reason: rec.reason, method: rec.method,
    },
    reason: rec.reason,
    comparison: rec.comparison.map((c) => ({ model: c.model, acceptable: c.acceptable, aicc: c.aicc, deltaAicc: c.deltaAicc, gamma: mJ(c.gamma), gammaStdError: mJ(c.gammaStdError) })),
    commonWindow: rec.commonWindow,
    acceptableFits: rec.acceptableFits,
    totalFits: rec.totalFits,
    cells: chosen ? chosen.cells.map(cellJson) : [],
    candidates: rec.candidates.map((c) => ({ model: c.model, title: c.title, acceptableCount: c.acceptableCount, cells: c.cells.map(cellJson) })),
    units: { gamma: "mJ/(mol*K^2)", beta: "mJ/(mol*K^4)", residualStdDev: "mJ/(mol*K)", T: "K", extra: "A in mJ*K/mol, delta in mJ/(mol*K^6), gap in K, n per formula unit" },
  };
}

/** The text lines of the recommendation. */
export function recommendationText(rec: Recommendation): string {
  const head = rec.recommended ? "recommendation" : "NOT RECOMMENDED";
  return `model × window scan: ${rec.totalFits} fits of ${rec.candidates.length} candidate models, ${rec.acceptableFits} acceptable\n${head}: ${rec.reason}\nmethod: ${rec.method}`;
}

/** Starting values (SI) of the recommended fit: the recommendation's own solution, so the refit lands on it. */
export function recommendedStart(rec: Recommendation): Record<string, number> | undefined {
  const cand = rec.candidates.find((c) => c.model === rec.model);
  const cell = cand?.cells.find((c) => c.tMinK === rec.window?.tMinK && c.tMaxK === rec.window?.tMaxK);
  if (!cell || rec.model === "expression") return undefined;
  return { ...cell.extra, ...(cell.gamma !== null ? { gamma: cell.gamma } : {}), ...(cell.beta !== null ? { beta: cell.beta } : {}) };
}
