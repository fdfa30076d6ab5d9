/**
 * scanWindows: fit every window of a T_min × T_max grid and find where γ stops depending
 * on the window (plateau.ts). Units as fitHeatCapacity (SI).
 * Linear models (no fixed parameters) are solved by sequential QR row updating
 * (updating.ts): the weighted design is built once, and for each lower edge the rows are
 * rotated upward into one triangular factor, each upper edge of the grid reading its
 * solution, covariance and χ² from it after one corrected-semi-normal-equations step.
 * A window whose column-scaled condition estimate exceeds 10³ (linearCells.ts) is solved afresh
 * by solveLinearLeastSquares instead (which refines such problems in double-double; one
 * fixed-precision correction keeps only ~16 − log10 κ digits there). Nonlinear models, and
 * linear ones with fixed parameters, use fitHeatCapacity per window.
 * Failure modes: InputError as fitHeatCapacity, for a linear model whose basis is not finite
 * at a data temperature (anywhere in the data, not only inside a window), or for minPoints not
 * a positive integer; an empty grid gives no cells and a reason.
 */
import { InputError, invalid } from "../errors";
import { getModel } from "../models/registry";
import { debyeTemperatureFromBeta } from "../models/debye";
import { checkSeries } from "../fit/curve";
import { fitHeatCapacity, type HeatCapacityInput } from "../fit/heatCapacity";
import { findPlateau } from "./plateau";
import { lowerIndex, quantileEdges, upperIndex } from "./grid";
import { linearCells, type CellCore, type SortedSeries } from "./linearCells";
import type { WindowSpan } from "./updating";

export interface ScanOptions {
  readonly model?: string;
  readonly tMinGridK?: readonly number[];
  readonly tMaxGridK?: readonly number[];
  /** Smallest window size fitted; default max(8, parameters + 3). */
  readonly minPoints?: number;
  readonly r?: number;
  readonly fixed?: Readonly<Record<string, number>>;
}

export interface ScanCell {
  readonly tMinK: number;
  readonly tMaxK: number;
  readonly nPoints: number;
  readonly gamma: number | null;
  readonly gammaStdError: number | null;
  readonly beta: number | null;
  readonly betaStdError: number | null;
  readonly reducedChiSquare: number | null;
  readonly converged: boolean;
  /** T_max beyond Θ_D/15 for a pure T³ lattice model. */
  readonly beyondT3Range: boolean;
}

export interface ScanResult {
  readonly model: string;
  readonly tMinGridK: readonly number[];
  readonly tMaxGridK: readonly number[];
  readonly cells: readonly ScanCell[];
  readonly plateau: { readonly cells: readonly number[]; readonly gammaMean: number } | null;
  readonly recommended: ScanCell | null;
  readonly reason: string;
}

function sortData(data: HeatCapacityInput): SortedSeries {
  const d = checkSeries(data.temperatureK, data.heatCapacity, data.sigma, ["temperatureK", "heatCapacity", "sigma"]);
  let sorted = true;
  for (let i = 1; i < d.x.length && sorted; i++) sorted = d.x[i - 1] <= d.x[i];
  // checkSeries returned fresh copies: already ascending data (the usual case) needs no reorder
  if (sorted) return { T: d.x, C: d.y, S: d.sigma };
  const order = Array.from(d.x, (_, i) => i).sort((a, b) => d.x[a] - d.x[b]);
  const pick = (v: Float64Array) => {
    const out = new Float64Array(v.length);
    for (let i = 0; i < v.length; i++) out[i] = v[order[i]];
    return out;
  };
  return { T: pick(d.x), C: pick(d.y), S: d.sigma ? pick(d.sigma) : null };
}

const safe = (v: number | undefined | null) => (v !== undefined && v !== null && Number.isFinite(v) ? v : null);

/** A window of the grid: its grid position and inclusive row range in the sorted data. */
interface GridWindow extends WindowSpan {
  readonly i: number;
  readonly j: number;
}

/** Fit every window of the grid. */
export function scanWindows(data: HeatCapacityInput, options: ScanOptions = {}): ScanResult {
  const modelName = options.model ?? "sommerfeld";
  const model = getModel(modelName);
  const s = sortData(data);
  if (s.T.length === 0) throw new InputError("no data points to scan", { field: "temperatureK" });
  const minPoints = options.minPoints ?? Math.max(8, model.parameters.length + 3);
  if (!Number.isInteger(minPoints) || minPoints < 1) throw invalid("minPoints", minPoints, "must be an integer ≥ 1");
  const firstUpper = Math.min(1, (minPoints - 1) / Math.max(1, s.T.length - 1));
  const tMinGrid = [...(options.tMinGridK ?? quantileEdges(s.T, 0, 0.5, 20))].sort((a, b) => a - b);
  const tMaxGrid = [...(options.tMaxGridK ?? quantileEdges(s.T, firstUpper, 1, 20))].sort((a, b) => a - b);
  const windows: GridWindow[] = [];
  tMinGrid.forEach((tMin, i) =>
    tMaxGrid.forEach((tMax, j) => {
      const lo = lowerIndex(s.T, tMin);
      const hi = upperIndex(s.T, tMax);
      if (hi - lo + 1 >= minPoints) windows.push({ i, j, lo, hi });
    }),
  );
  const linear = model.linear && (!options.fixed || Object.keys(options.fixed).length === 0);
  const cores = linear
    ? linearCells(model.basis!, model.parameters.map((p) => p.name), s, windows)
    : windows.map((w) => nonlinearCell(s, w.lo, w.hi, modelName, options));
  const cells = cores.map((c, k): ScanCell => {
    const tMaxK = tMaxGrid[windows[k].j];
    // an explicit literal: spreading `c` costs ~40× more per cell
    return Object.freeze({
      tMinK: tMinGrid[windows[k].i], tMaxK, nPoints: c.nPoints, gamma: c.gamma, gammaStdError: c.gammaStdError, beta: c.beta, betaStdError: c.betaStdError,
      reducedChiSquare: c.reducedChiSquare, converged: c.converged, beyondT3Range: beyond(modelName, c.beta, tMaxK, options.r ?? 1),
    });
  });
  return summarise(modelName, tMinGrid, tMaxGrid, cells, windows.map((w): [number, number] => [w.i, w.j]));
}

function beyond(modelName: string, beta: number | null, tMax: number, r: number): boolean {
  return ["sommerfeld", "nuclear", "magnon"].includes(modelName) && beta !== null && beta > 0 && tMax > debyeTemperatureFromBeta(beta, r) / 15;
}

function nonlinearCell(s: SortedSeries, lo: number, hi: number, model: string, options: ScanOptions): CellCore {
  const sl = (a: Float64Array) => a.subarray(lo, hi + 1);
  const r = fitHeatCapacity({ temperatureK: sl(s.T), heatCapacity: sl(s.C), sigma: s.S ? sl(s.S) : undefined }, { model, r: options.r, fixed: options.fixed });
  const p = (name: string) => r.parameters.find((q) => q.name === name);
  const g = p("gamma") ?? p("gammaN");
  const b = p("beta");
  return { nPoints: hi - lo + 1, gamma: safe(g?.value), gammaStdError: g?.stdError ?? null, beta: safe(b?.value), betaStdError: b?.stdError ?? null, reducedChiSquare: r.reducedChiSquare, converged: r.converged };
}

function summarise(model: string, tMinGridK: number[], tMaxGridK: number[], cells: ScanCell[], pos: [number, number][]): ScanResult {
  const usable = cells.map((c, k) => ({ c, k })).filter(({ c }) => c.converged && c.gamma !== null && c.gammaStdError !== null && c.gammaStdError > 0);
  const plateau = findPlateau(usable.map(({ c, k }) => ({ i: pos[k][0], j: pos[k][1], value: c.gamma!, sigma: c.gammaStdError! })));
  const base = { model, tMinGridK: Object.freeze(tMinGridK), tMaxGridK: Object.freeze(tMaxGridK), cells: Object.freeze(cells) };
  if (!plateau) return Object.freeze({ ...base, plateau: null, recommended: null, reason: cells.length ? "no window gave a γ with a standard error" : "no window of the grid holds enough points" });
  const members = plateau.members.map((m) => usable[m].k);
  const k4 = (v: number) => Number(v.toPrecision(4));
  const g = (v: number) => (v * 1e3).toPrecision(4);
  if (members.length < 2) {
    // no fallback: the window with the smallest σ(γ) is the widest one, where a missing term biases γ most
    return Object.freeze({ ...base, plateau: null, recommended: null, reason: "no two adjacent windows agree on γ within σ: γ depends on the window and no window is recommended (a term is likely missing from the model: the model-and-window recommendation tests candidates with an upturn or curvature term)" });
  }
  const pick = (list: number[]) => list.reduce((a, b) => (cells[b].gammaStdError! < cells[a].gammaStdError! ? b : a));
  const clean = members.filter((k) => !cells[k].beyondT3Range);
  const best = pick(clean.length ? clean : members);
  const rec = cells[best];
  const span = (f: (c: ScanCell) => number) => `${k4(Math.min(...members.map((k) => f(cells[k]))))}–${k4(Math.max(...members.map((k) => f(cells[k]))))} K`;
  const reason = `plateau of ${members.length} adjacent windows (T_min ${span((c) => c.tMinK)}, T_max ${span((c) => c.tMaxK)}) whose γ agree within their σ with the running mean γ̄ = ${g(plateau.mean)} mJ mol⁻¹ K⁻²; recommended the plateau window with the smallest σ(γ)${clean.length ? " inside the T³ range" : ""}: [${k4(rec.tMinK)}, ${k4(rec.tMaxK)}] K, ${rec.nPoints} points, γ = ${g(rec.gamma!)} ± ${g(rec.gammaStdError!)}`;
  return Object.freeze({ ...base, plateau: Object.freeze({ cells: Object.freeze(members), gammaMean: plateau.mean }), recommended: rec, reason });
}
