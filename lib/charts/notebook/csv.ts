/**
 * The data behind each notebook chart as CSV (through the engine's safe writer: units in the
 * headers, formula-like text neutralised). Values in SI, as stored, so a script reading the
 * file needs no display factors; the basis is named in the header.
 */
import { writeCsv, type CsvCell, type CsvColumn } from "../../engine/csv";
import { sourceAt } from "../../engine/notebook/pointSource";
import type { AddendaStepResult, EntropyStepResult, FitPlotData, MoleBasis, ScanResult, TransitionStepResult } from "./types";
import type { DataRow } from "./data";

const per = (b: MoleBasis) => (b === "atom" ? "J mol-1 K-1 (per mole of atoms)" : "J mol-1 K-1 (per mole formula unit)");

/** Points of a fit step: T, C, σ, whether in the window, the model value and the residual. */
export function fitCsv(r: FitPlotData): string {
  const res = new Map(r.fit.window.indices.map((i, k) => [i, r.fit.residuals[k] ?? null]));
  const cols: CsvColumn[] = [{ name: "T", unit: "K" }, { name: "C", unit: per(r.basis) }, { name: "sigma_C", unit: per(r.basis) }, { name: "in_window" }, { name: "residual_C_minus_fit", unit: per(r.basis) }, { name: "measurement_id" }, { name: "point_index" }];
  const rows: CsvCell[][] = r.points.temperatureK.map((t, i) => [t, r.points.heatCapacity[i], r.points.sigma ? r.points.sigma[i] : null, r.points.inWindow[i], res.get(i) ?? null, sourceAt(r.points.source, i)?.measurementId ?? null, sourceAt(r.points.source, i)?.index ?? null]);
  return writeCsv(cols, rows);
}

/** Every scanned window: edges, points, γ ± σ, β ± σ, χ²_red, plateau membership. */
export function scanCsv(scan: ScanResult): string {
  const plateau = new Set(scan.plateau?.cells ?? []);
  const cols: CsvColumn[] = [{ name: "T_min", unit: "K" }, { name: "T_max", unit: "K" }, { name: "points" }, { name: "gamma", unit: "J mol-1 K-2" }, { name: "sigma_gamma", unit: "J mol-1 K-2" }, { name: "beta", unit: "J mol-1 K-4" }, { name: "sigma_beta", unit: "J mol-1 K-4" }, { name: "chi2_reduced" }, { name: "in_plateau" }, { name: "beyond_T3_range" }];
  return writeCsv(cols, scan.cells.map((c, k) => [c.tMinK, c.tMaxK, c.nPoints, c.gamma, c.gammaStdError, c.beta, c.betaStdError, c.reducedChiSquare, plateau.has(k), c.beyondT3Range]));
}

export function addendaCsv(r: AddendaStepResult): string {
  const c = r.curve;
  return writeCsv([{ name: "T", unit: "K" }, { name: "C_total", unit: "J K-1" }, { name: "C_addenda", unit: "J K-1" }, { name: "C_net", unit: "J K-1" }], c.temperatureK.map((t, i) => [t, c.totalJPerK[i], c.addendaJPerK[i], c.netJPerK[i]]));
}

export function transitionCsv(r: TransitionStepResult): string {
  const ideal = new Map(r.idealised.temperatureK.map((t, i) => [t, r.idealised.cElOverT[i]]));
  return writeCsv([{ name: "T", unit: "K" }, { name: "C_el_over_T", unit: "J mol-1 K-2" }, { name: "idealised_C_el_over_T", unit: "J mol-1 K-2" }], [
    ...r.points.temperatureK.map((t, i): CsvCell[] => [t, r.points.cElOverT[i], ideal.get(t) ?? null]),
    ...r.idealised.temperatureK.filter((t) => !r.points.temperatureK.includes(t)).map((t): CsvCell[] => [t, null, ideal.get(t) ?? null]),
  ]);
}

export function entropyCsv(r: EntropyStepResult): string {
  const s = r.entropy, h = r.enthalpy;
  const unitS = r.basis === "atom" ? "J mol-1 K-1 (per mole of atoms)" : "J mol-1 K-1 (per mole formula unit)";
  const unitH = r.basis === "atom" ? "J mol-1 (per mole of atoms)" : "J mol-1 (per mole formula unit)";
  return writeCsv([{ name: "T", unit: "K" }, { name: "S", unit: unitS }, { name: "sigma_S", unit: unitS }, { name: "H_minus_H0", unit: unitH }, { name: "sigma_H", unit: unitH }], s.temperatureK.map((t, i) => [t, s.values[i], s.stdErrors?.[i] ?? null, h.values[i] ?? null, h.stdErrors?.[i] ?? null]));
}

/** The data chart's rows (display units, as labelled in `unit`). */
export function dataCsv(rows: readonly DataRow[], unit: string): string {
  return writeCsv([{ name: "measurement" }, { name: "point" }, { name: "T", unit: "K" }, { name: "C", unit }, { name: "state" }, { name: "reason" }], rows.map((d) => [d.label, d.index + 1, d.t, d.c, d.state, d.reason]));
}
