/**
 * The candidates chart of the model-and-window recommendation: γ ± σ_stat (mJ mol⁻¹ K⁻²)
 * against each window's upper edge T_max (K), one colour per candidate model; windows where
 * the model describes the data (acceptable) are filled, the others small and hollow; the
 * recommended fit is ringed, and a band shows γ ± √(stat² + syst²) of the recommendation.
 * Display scaling only.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { BASIS_TEXT, COLOURS, fmt, frame, xAxis, yAxis } from "./frame";
import type { MoleBasis, StoredRecommendation } from "./types";

export interface CandidateRow {
  model: string;
  title: string;
  tMinK: number;
  tMaxK: number;
  nPoints: number;
  gamma: number;
  lo: number | null;
  hi: number | null;
  acceptable: boolean;
}

const MJ = 1e3;
/** Three significant figures for the label on the chart. */
const k3 = (v: number) => String(Number(v.toPrecision(3)));
/** One colour per candidate, in the order the recommendation lists them (ours). */
const MODEL_COLOURS = ["#4a6d8c", "#2f5d3a", "#5b4a8a", "#9a4519", "#8c6d1f", "#1e2431"];

/** Rows of every candidate window with a γ, in display units. */
export function candidateRows(rec: StoredRecommendation): CandidateRow[] {
  return rec.candidates.flatMap((c) => c.cells.flatMap((x): CandidateRow[] => {
    if (x.gamma === null) return [];
    const g = x.gamma * MJ;
    const s = x.gammaStdError === null ? null : x.gammaStdError * MJ;
    return [{ model: c.model, title: c.title, tMinK: x.tMinK, tMaxK: x.tMaxK, nPoints: x.nPoints, gamma: g, lo: s === null ? null : g - s, hi: s === null ? null : g + s, acceptable: x.acceptable }];
  }));
}

export interface CandidatesPlotOptions {
  width?: number;
  height?: number;
  basis?: MoleBasis;
}

/** γ per window and candidate, acceptable ones filled, the recommendation ringed with its total σ band. */
export function candidatesPlot(rec: StoredRecommendation, opts: CandidatesPlotOptions = {}): PlotOptions {
  const rows = candidateRows(rec);
  const ok = rows.filter((d) => d.acceptable);
  // the y range follows the acceptable windows (rejected ones can lie far off)
  const focus = ok.length ? ok : rows;
  const ys = focus.flatMap((d) => [d.lo ?? d.gamma, d.hi ?? d.gamma]);
  const band = rec.recommended && rec.gamma !== null
    ? [{ lo: (rec.gamma - Math.hypot(rec.gammaStdError ?? 0, rec.gammaSystematicError ?? 0)) * MJ, hi: (rec.gamma + Math.hypot(rec.gammaStdError ?? 0, rec.gammaSystematicError ?? 0)) * MJ }]
    : [];
  const mark = rec.recommended && rec.window && rec.gamma !== null ? [{ tMaxK: rec.window.tMaxK, gamma: rec.gamma * MJ, tMinK: rec.window.tMinK }] : [];
  const xs = rows.map((d) => d.tMaxK);
  const yDomain = ys.length ? [Math.min(...ys, ...band.map((b) => b.lo)), Math.max(...ys, ...band.map((b) => b.hi))] : undefined;
  const title = (d: CandidateRow) => `${d.title}\nwindow ${fmt(d.tMinK)}–${fmt(d.tMaxK)} K (${d.nPoints} points)\nγ = ${fmt(d.gamma)} ± ${d.lo === null ? "—" : fmt(d.gamma - d.lo)} mJ mol⁻¹ K⁻²\n${d.acceptable ? "describes the data" : "rejected by the window tests"}`;
  const basis = opts.basis ? `, ${BASIS_TEXT[opts.basis]}` : "";
  return {
    ...frame(opts.width, opts.height ?? 340),
    x: xAxis("window upper edge T_max (K)", { type: "log", ...(xs.length ? { domain: [Math.min(...xs) / 1.05, Math.max(...xs) * 1.05], nice: false } : {}) }),
    y: yAxis(`γ (mJ mol⁻¹ K⁻²${basis})`, yDomain ? { domain: yDomain } : {}),
    color: { domain: rec.candidates.map((c) => c.title), range: MODEL_COLOURS, legend: true },
    clip: true,
    marks: [
      Plot.frame({ stroke: COLOURS.frame }),
      ...band.map((b) => Plot.rectY([b], { x1: () => Math.min(...xs), x2: () => Math.max(...xs), y1: "lo", y2: "hi", fill: COLOURS.window, fillOpacity: 0.6 })),
      Plot.dot(rows.filter((d) => !d.acceptable), { x: "tMaxK", y: "gamma", r: 1.6, stroke: "title", strokeOpacity: 0.35, fill: "white" }),
      Plot.ruleX(ok.filter((d) => d.lo !== null), { x: "tMaxK", y1: "lo", y2: "hi", stroke: "title", strokeOpacity: 0.35 }),
      Plot.dot(ok, { x: "tMaxK", y: "gamma", r: 2.4, fill: "title" }),
      Plot.dot(mark, { x: "tMaxK", y: "gamma", r: 8, stroke: COLOURS.copper, strokeWidth: 2.2 }),
      Plot.text(mark, { x: "tMaxK", y: "gamma", text: (d: { tMinK: number; tMaxK: number }) => `recommended ${k3(d.tMinK)}–${k3(d.tMaxK)} K`, dy: -16, fill: COLOURS.copper, fontWeight: 600, stroke: "white", strokeWidth: 3, paintOrder: "stroke" }),
      Plot.tip(rows, Plot.pointer({ x: "tMaxK", y: "gamma", title, fontSize: 12 })),
    ],
  };
}
