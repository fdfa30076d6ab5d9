/**
 * The composition-series chart: one result (γ, Θ_D, D(E_F), m* / m or T_c) against the series
 * axis (x or electrons per atom). Reviewed (sealed) values are filled dots with solid ±1σ bars;
 * values from unreviewed revisions are hollow dots with dashed bars; the weighted trend is a
 * copper line inside its ±1σ band (standard error of the fitted mean); points more than the
 * trend's outlier threshold (3σ) away wear a ring; the free-electron γ_free is a dotted line of
 * crosses; a second series overlaid on the same axis is drawn in squares. The legend is drawn
 * inside the SVG (below the x axis), so an exported SVG or PNG keeps it.
 *
 * Pure: from plain rows (the shape lib/server/series' SeriesView has) to Observable Plot options.
 * Display only; every number is the server's.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { invalid } from "../engine/errors";

export type SeriesChartQuantity = "gamma" | "thetaD" | "dosEF" | "massRatio" | "tc";
export const SERIES_CHART_QUANTITIES: readonly SeriesChartQuantity[] = ["gamma", "thetaD", "dosEF", "massRatio", "tc"];

export interface ValueWithError { value: number; stdError: number | null }

/** One table row of a series view (structural copy of the server's SeriesRow). */
export interface SeriesChartRow {
  sample: { label: string };
  axisValue: number | null;
  draft: boolean;
  revision: { revisionNumber: number; state: string } | null;
  gammaFree: number | null;
  gamma: ValueWithError | null;
  thetaD: ValueWithError | null;
  dosEF: ValueWithError | null;
  massRatio: ValueWithError | null;
  tc: ValueWithError | null;
}

/** The part of an engine TrendFit the chart reads. */
export interface SeriesChartTrend {
  ok: boolean;
  degree: 1 | 2;
  band: readonly { x: number; y: number; sigma: number | null }[];
  outliers: readonly number[];
  outlierSigma: number;
}

export interface SeriesChartLayer {
  name: string;
  rows: readonly SeriesChartRow[];
  /** The trend to draw for this quantity (linear or quadratic), or null for none. */
  trend: SeriesChartTrend | null;
  /** Which rows the server fitted the trend to (sealed only, or every shown row). */
  trendFrom: "sealed" | "shown";
}

export interface SeriesPlotOptions {
  quantity: SeriesChartQuantity;
  axisLabel: string;
  primary: SeriesChartLayer;
  overlay?: SeriesChartLayer | null;
  /** Draw γ_free (only meaningful, and only drawn, for quantity "gamma"). */
  showGammaFree?: boolean;
  width?: number;
  height?: number;
}

/** Axis text of each quantity, per mole formula unit (the series view's convention). */
export const QUANTITY_LABEL: Readonly<Record<SeriesChartQuantity, { symbol: string; unit: string; axis: string }>> = {
  gamma: { symbol: "γ", unit: "mJ mol⁻¹ K⁻²", axis: "γ (mJ mol⁻¹ K⁻², per mole formula unit)" },
  thetaD: { symbol: "Θ_D", unit: "K", axis: "Θ_D (K)" },
  dosEF: { symbol: "D(E_F)", unit: "states eV⁻¹ f.u.⁻¹", axis: "D(E_F) (states eV⁻¹ f.u.⁻¹, both spins)" },
  massRatio: { symbol: "m*/m", unit: "", axis: "m*/m (thermal mass ratio)" },
  tc: { symbol: "T_c", unit: "K", axis: "T_c (K)" },
};

export const SERIES_COLOURS = {
  ink: "#1e2431", errorBar: "#8f846f", copper: "#9a4519", band: "#e9c9ad", overlay: "#3f6584",
  overlayBar: "#9db3c6", free: "#2f5d3a", alarm: "#8e1b33", frame: "#d9cfbc",
} as const;

/** One plotted point, in display units, with its flags. */
export interface SeriesPoint {
  label: string;
  x: number;
  y: number;
  lo: number | null;
  hi: number | null;
  draft: boolean;
  revision: string;
  /** More than the trend's threshold from it (only rows the trend was fitted to). */
  outlier: boolean;
}

/**
 * The points of one layer for one quantity: rows with a value and an axis value, in row order;
 * `outlier` maps the trend's outlier indices back to rows the same way the server chose them
 * (rows with a revision, sealed ones only unless trendFrom is "shown", with a value and an axis
 * value). Throws InputError for an outlier index past the fitted rows.
 */
export function seriesPoints(layer: SeriesChartLayer, quantity: SeriesChartQuantity): SeriesPoint[] {
  const usable = (r: SeriesChartRow) => r[quantity] !== null && r.axisValue !== null;
  const fitted = layer.rows.filter((r) => r.revision !== null && (layer.trendFrom === "shown" || !r.draft) && usable(r));
  const flagged = new Set<SeriesChartRow>();
  for (const i of layer.trend?.outliers ?? []) {
    const row = fitted[i];
    if (!row) throw invalid("trend.outliers", i, `only ${fitted.length} rows were fitted`, { field: "trend.outliers" });
    flagged.add(row);
  }
  return layer.rows.filter(usable).map((r) => {
    const v = r[quantity]!;
    const s = v.stdError;
    return {
      label: r.sample.label, x: r.axisValue!, y: v.value, lo: s === null ? null : v.value - s, hi: s === null ? null : v.value + s, draft: r.draft,
      revision: r.revision ? `revision ${r.revision.revisionNumber} (${r.revision.state})` : "no revision", outlier: flagged.has(r),
    };
  });
}

function num(v: number): string {
  return Math.abs(v) >= 1e-3 && Math.abs(v) < 1e5 ? String(Number(v.toPrecision(4))) : v.toExponential(3);
}

interface LegendEntry { glyph: "dot" | "hollow" | "square" | "ring" | "cross" | "line"; colour: string; text: string }

/** Legend marks laid out in rows below the x axis (an estimate of 6.3 px per character at 11 px). */
function legendMarks(entries: LegendEntry[], width: number, left: number, top: number): { marks: Plot.Markish[]; rows: number } {
  const marks: Plot.Markish[] = [];
  let dx = 0, row = 0;
  for (const e of entries) {
    const w = 22 + e.text.length * 6.3 + 18;
    if (dx > 0 && left + dx + w > width - 10) { dx = 0; row++; }
    const at = { frameAnchor: "bottom-left" as const, dx: dx + 6, dy: top + row * 17 };
    if (e.glyph === "line") marks.push(Plot.text(["━━"], { ...at, fill: e.colour, fontSize: 11 }));
    else if (e.glyph === "cross") marks.push(Plot.dot([0], { ...at, dx: at.dx + 6, symbol: "times", r: 3.5, stroke: e.colour }));
    else if (e.glyph === "ring") marks.push(Plot.dot([0], { ...at, dx: at.dx + 6, r: 6, stroke: e.colour, strokeWidth: 1.5, fill: "none" }));
    else if (e.glyph === "square") marks.push(Plot.dot([0], { ...at, dx: at.dx + 6, symbol: "square", r: 3.6, fill: e.colour }));
    else marks.push(Plot.dot([0], { ...at, dx: at.dx + 6, r: 3.2, fill: e.glyph === "dot" ? e.colour : "white", stroke: e.colour, strokeWidth: 1.3 }));
    marks.push(Plot.text([e.text], { ...at, dx: at.dx + 20, fill: SERIES_COLOURS.ink, fontSize: 11, textAnchor: "start" }));
    dx += w;
  }
  return { marks, rows: entries.length ? row + 1 : 0 };
}

function trendMarks(trend: SeriesChartTrend | null, colour: string, band: boolean): Plot.Markish[] {
  if (!trend?.ok || trend.band.length === 0) return [];
  const withSigma = trend.band.filter((b) => b.sigma !== null);
  return [
    ...(band && withSigma.length ? [Plot.areaY(withSigma, { x: "x", y1: (b: { y: number; sigma: number }) => b.y - b.sigma, y2: (b: { y: number; sigma: number }) => b.y + b.sigma, fill: SERIES_COLOURS.band, fillOpacity: 0.55 })] : []),
    Plot.line(trend.band, { x: "x", y: "y", stroke: colour, strokeWidth: 1.8, ...(band ? {} : { strokeDasharray: "6,3" }) }),
  ];
}

function pointMarks(points: SeriesPoint[], colour: string, barColour: string, square: boolean, unit: string): Plot.Markish[] {
  const sealed = points.filter((p) => !p.draft), drafts = points.filter((p) => p.draft);
  const bars = (ps: SeriesPoint[]) => ps.filter((p) => p.lo !== null);
  const title = (p: SeriesPoint) => `${p.label}\n${num(p.x)} → ${num(p.y)}${p.lo !== null ? ` ± ${num(p.y - p.lo)}` : ""} ${unit}\n${p.revision}${p.draft ? ", not reviewed" : ""}${p.outlier ? "\n> 3σ from the trend" : ""}`;
  return [
    Plot.ruleX(bars(sealed), { x: "x", y1: "lo", y2: "hi", stroke: barColour, strokeWidth: 1.4 }),
    Plot.ruleX(bars(drafts), { x: "x", y1: "lo", y2: "hi", stroke: barColour, strokeWidth: 1.2, strokeDasharray: "3,2" }),
    Plot.dot(sealed, { x: "x", y: "y", r: square ? 3.8 : 3.6, symbol: square ? "square" : "circle", fill: colour, stroke: "white", strokeWidth: 0.8 }),
    Plot.dot(drafts, { x: "x", y: "y", r: square ? 3.8 : 3.6, symbol: square ? "square" : "circle", fill: "white", stroke: colour, strokeWidth: 1.4 }),
    Plot.dot(points.filter((p) => p.outlier), { x: "x", y: "y", r: 8, stroke: SERIES_COLOURS.alarm, strokeWidth: 1.6, fill: "none" }),
    Plot.tip(points, Plot.pointer({ x: "x", y: "y", title, fontSize: 12 })),
  ];
}

/**
 * The series chart's Plot options (see the module comment). x: `axisLabel`; y: the quantity in
 * its display unit. Throws InputError when the overlay is drawn for a quantity with no points
 * mapping (see seriesPoints) or a width below 200 px.
 */
export function seriesPlot(opts: SeriesPlotOptions): PlotOptions {
  const width = opts.width ?? 640;
  if (!(width >= 200)) throw invalid("width", width, "the series chart needs at least 200 px");
  const q = QUANTITY_LABEL[opts.quantity];
  const main = seriesPoints(opts.primary, opts.quantity);
  const over = opts.overlay ? seriesPoints(opts.overlay, opts.quantity) : [];
  const free = opts.showGammaFree && opts.quantity === "gamma"
    ? opts.primary.rows.filter((r) => r.gammaFree !== null && r.axisValue !== null && !r.draft).map((r) => ({ x: r.axisValue!, y: r.gammaFree!, label: r.sample.label }))
    : [];
  const trend = opts.primary.trend?.ok ? opts.primary.trend : null;
  const entries: LegendEntry[] = [
    { glyph: "dot", colour: SERIES_COLOURS.ink, text: `${opts.primary.name}: reviewed (sealed)` },
    ...(main.some((p) => p.draft) ? [{ glyph: "hollow" as const, colour: SERIES_COLOURS.ink, text: "not reviewed yet (draft)" }] : []),
    ...(trend ? [{ glyph: "line" as const, colour: SERIES_COLOURS.copper, text: `${trend.degree === 1 ? "linear" : "quadratic"} trend ±1σ${opts.primary.trendFrom === "shown" ? " (incl. drafts)" : ""}` }] : []),
    ...(main.some((p) => p.outlier) ? [{ glyph: "ring" as const, colour: SERIES_COLOURS.alarm, text: `> ${trend?.outlierSigma ?? 3}σ from the trend` }] : []),
    ...(free.length ? [{ glyph: "cross" as const, colour: SERIES_COLOURS.free, text: "γ_free (free electrons)" }] : []),
    ...(opts.overlay ? [{ glyph: "square" as const, colour: SERIES_COLOURS.overlay, text: opts.overlay.name }] : []),
  ];
  const marginLeft = 68, axisBottom = 44;
  const legend = legendMarks(entries, width, marginLeft, axisBottom);
  return {
    width, height: (opts.height ?? 360) + legend.rows * 17, marginLeft, marginRight: 18, marginTop: 18, marginBottom: axisBottom + legend.rows * 17 + 6,
    style: { fontSize: "12px", fontFamily: "inherit", background: "transparent", overflow: "visible" },
    x: { label: opts.axisLabel, labelAnchor: "center", labelArrow: "none", labelOffset: 38, grid: true, nice: true },
    y: { label: q.axis, labelAnchor: "center", labelArrow: "none", labelOffset: 56, grid: true, nice: true },
    marks: [
      Plot.frame({ stroke: SERIES_COLOURS.frame }),
      ...trendMarks(trend, SERIES_COLOURS.copper, true),
      ...trendMarks(opts.overlay?.trend ?? null, SERIES_COLOURS.overlay, false),
      ...(free.length ? [Plot.line(free, { x: "x", y: "y", stroke: SERIES_COLOURS.free, strokeDasharray: "1.5,3", strokeWidth: 1.4 }), Plot.dot(free, { x: "x", y: "y", symbol: "times", r: 3.5, stroke: SERIES_COLOURS.free })] : []),
      ...pointMarks(over, SERIES_COLOURS.overlay, SERIES_COLOURS.overlayBar, true, q.unit),
      ...pointMarks(main, SERIES_COLOURS.ink, SERIES_COLOURS.errorBar, false, q.unit),
      ...legend.marks,
    ],
  };
}
