/**
 * A series quantity against the series axis as a paper figure (SVG text): the same chart as the
 * series page (reviewed values filled, drafts hollow, weighted trend and its ±1σ band, outliers
 * ringed), laid out for a journal column.
 */
import { seriesFigure, type PaperOptions } from "../../charts/figures";
import { SERIES_CHART_QUANTITIES, type SeriesChartQuantity } from "../../charts/series";
import { chartSvg } from "../../charts/svg";
import { InputError } from "../../engine/errors";
import type { SeriesView } from "../series/view";
import { FIGURE_FONT_FAMILY } from "./fonts";

/** The quantity named in a query, or an InputError naming the choices. */
export function seriesQuantity(value: string | null): SeriesChartQuantity {
  const q = (value ?? "gamma") as SeriesChartQuantity;
  if (!SERIES_CHART_QUANTITIES.includes(q)) throw new InputError(`invalid quantity: ${JSON.stringify(value)} (one of ${SERIES_CHART_QUANTITIES.join(", ")})`, { field: "quantity" });
  return q;
}

export function seriesFigureSvg(view: SeriesView, quantity: SeriesChartQuantity, degree: 1 | 2, paper: PaperOptions): string {
  const t = view.trends[quantity];
  const fit = degree === 1 ? t.linear : t.quadratic;
  const options = seriesFigure({
    quantity, axisLabel: view.axisLabel, showGammaFree: quantity === "gamma",
    primary: { name: view.series.name, rows: view.rows, trend: fit ? { ...fit, degree } : null, trendFrom: view.trendFrom },
  }, paper);
  return chartSvg(options, { fontSize: paper.fontSize ?? 8, fontFamily: `${FIGURE_FONT_FAMILY}, sans-serif`, background: "#ffffff" });
}
