/**
 * scanWindows: fit every window of a T_min × T_max grid and find where γ stops depending
 * on the window (plateau.ts). Linear models use one small Householder QR per window on
 * a design built once (no updating of sums — each window is solved afresh); nonlinear
 * models use fitHeatCapacity per window. Units as fitHeatCapacity (SI).
 * Failure modes: InputError as fitHeatCapacity; an empty grid gives no cells and a reason.
 */
import { InputError } from "../errors";
import { solveLinearLeastSquares } from "../linalg/lstsq";
import { getModel } from "../models/registry";
import { debyeTemperatureFromBeta } from "../models/debye";
import { checkSeries } from "../fit/curve";
import { fitHeatCapacity, type HeatCapacityInput } from "../fit/heatCapacity";
import { findPlateau } from "./plateau";
import { lowerIndex, quantileEdges, upperIndex } from "./grid";

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

interface Sorted { T: Float64Array; C: Float64Array; S: Float64Array | null }

function sortData(data: HeatCapacityInput): Sorted {
  const d = checkSeries(data.temperatureK, data.heatCapacity, data.sigma, ["temperatureK", "heatCapacity", "sigma"]);
  const order = Array.from(d.x, (_, i) => i).sort((a, b) => d.x[a] - d.x[b]);
  return { T: Float64Array.from(order, (i) => d.x[i]), C: Float64Array.from(order, (i) => d.y[i]), S: d.sigma ? Float64Array.from(order, (i) => d.sigma![i]) : null };
}

const safe = (v: number | undefined | null) => (v !== undefined && v !== null && Number.isFinite(v) ? v : null);

/** Fit every window of the grid. */
export function scanWindows(data: HeatCapacityInput, options: ScanOptions = {}): ScanResult {
  const modelName = options.model ?? "sommerfeld";
  const model = getModel(modelName);
  const s = sortData(data);
  if (s.T.length === 0) throw new InputError("no data points to scan", { field: "temperatureK" });
  const minPoints = options.minPoints ?? Math.max(8, model.parameters.length + 3);
  const firstUpper = Math.min(1, (minPoints - 1) / Math.max(1, s.T.length - 1));
  const tMinGrid = [...(options.tMinGridK ?? quantileEdges(s.T, 0, 0.5, 20))].sort((a, b) => a - b);
  const tMaxGrid = [...(options.tMaxGridK ?? quantileEdges(s.T, firstUpper, 1, 20))].sort((a, b) => a - b);
  const linear = model.linear && (!options.fixed || Object.keys(options.fixed).length === 0);
  const cells: ScanCell[] = [];
  const pos: [number, number][] = [];
  const design = linear ? buildDesign(model.basis!, s.T) : null;
  tMinGrid.forEach((tMin, i) =>
    tMaxGrid.forEach((tMax, j) => {
      const lo = lowerIndex(s.T, tMin);
      const hi = upperIndex(s.T, tMax);
      if (hi - lo + 1 < minPoints) return;
      const cell = design ? linearCell(design, s, lo, hi, model.parameters.map((p) => p.name)) : nonlinearCell(s, lo, hi, modelName, options);
      cells.push(Object.freeze({ ...cell, tMinK: tMin, tMaxK: tMax, beyondT3Range: beyond(modelName, cell.beta, tMax, options.r ?? 1) }));
      pos.push([i, j]);
    }),
  );
  return summarise(modelName, tMinGrid, tMaxGrid, cells, pos);
}

function beyond(modelName: string, beta: number | null, tMax: number, r: number): boolean {
  return ["sommerfeld", "nuclear", "magnon"].includes(modelName) && beta !== null && beta > 0 && tMax > debyeTemperatureFromBeta(beta, r) / 15;
}

function buildDesign(basis: readonly ((t: number) => number)[], T: Float64Array): Float64Array {
  const m = T.length;
  const a = new Float64Array(m * basis.length);
  basis.forEach((phi, j) => T.forEach((t, i) => (a[j * m + i] = phi(t))));
  return a;
}

type CellCore = Omit<ScanCell, "tMinK" | "tMaxK" | "beyondT3Range">;

function linearCell(design: Float64Array, s: Sorted, lo: number, hi: number, names: string[]): CellCore {
  const m = s.T.length;
  const n = names.length;
  const k = hi - lo + 1;
  const a = new Float64Array(k * n);
  for (let j = 0; j < n; j++) a.set(design.subarray(j * m + lo, j * m + hi + 1), j * k);
  const sol = solveLinearLeastSquares(a, k, n, s.C.subarray(lo, hi + 1), { sigma: s.S ? s.S.subarray(lo, hi + 1) : undefined });
  if (!sol.fullRank) return { nPoints: k, gamma: null, gammaStdError: null, beta: null, betaStdError: null, reducedChiSquare: null, converged: false };
  const red = sol.chiSquare / (k - n);
  const f = s.S ? 1 : red;
  const gi = names.indexOf("gamma");
  const bi = names.indexOf("beta");
  const se = (j: number) => (j >= 0 ? safe(Math.sqrt(sol.covariance[j * n + j] * f)) : null);
  return { nPoints: k, gamma: gi >= 0 ? sol.coefficients[gi] : null, gammaStdError: se(gi), beta: bi >= 0 ? sol.coefficients[bi] : null, betaStdError: se(bi), reducedChiSquare: safe(red), converged: true };
}

function nonlinearCell(s: Sorted, lo: number, hi: number, model: string, options: ScanOptions): CellCore {
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
  const pick = (list: number[]) => list.reduce((a, b) => (cells[b].gammaStdError! < cells[a].gammaStdError! ? b : a));
  const clean = members.filter((k) => !cells[k].beyondT3Range);
  const best = pick(clean.length ? clean : members);
  const rec = cells[best];
  const k4 = (v: number) => Number(v.toPrecision(4));
  const span = (f: (c: ScanCell) => number) => `${k4(Math.min(...members.map((k) => f(cells[k]))))}–${k4(Math.max(...members.map((k) => f(cells[k]))))} K`;
  const g = (v: number) => (v * 1e3).toPrecision(4);
  const reason = members.length > 1
    ? `plateau of ${members.length} adjacent windows (T_min ${span((c) => c.tMinK)}, T_max ${span((c) => c.tMaxK)}) whose γ agree within their σ with the running mean γ̄ = ${g(plateau.mean)} mJ mol⁻¹ K⁻²; recommended the plateau window with the smallest σ(γ)${clean.length ? " inside the T³ range" : ""}: [${k4(rec.tMinK)}, ${k4(rec.tMaxK)}] K, ${rec.nPoints} points, γ = ${g(rec.gamma!)} ± ${g(rec.gammaStdError!)}`
    : `no two adjacent windows agree on γ within σ: γ depends on the window; the window with the smallest σ(γ) is [${k4(rec.tMinK)}, ${k4(rec.tMaxK)}] K (treat with care)`;
  return Object.freeze({ ...base, plateau: Object.freeze({ cells: Object.freeze(members), gammaMean: plateau.mean }), recommended: rec, reason });
}
