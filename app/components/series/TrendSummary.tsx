"use client";
/** The numbers of the drawn trend: coefficients with standard errors, χ²_red, weighting, points, warnings (display only). */
import type { TrendFit } from "@/lib/engine/series";
import { QUANTITY_LABEL, type SeriesChartQuantity } from "@/lib/charts/series";
import { Sym } from "../Sym";
import type { ReactNode } from "react";
import { formatNumber, formatValue } from "@/lib/display";

const WEIGHTING: Record<TrendFit["weighting"], ReactNode> = {
  absolute: "weighted by 1/σ², σ taken as absolute",
  scaled: <>weighted by 1/σ², errors scaled by √<Sym m="χ²_red" /></>,
  unweighted: "unweighted (some values have no σ), errors from the scatter",
};

interface Props { fit: TrendFit | null; degree: 1 | 2; quantity: SeriesChartQuantity; axisLabel: string; trendFrom: "sealed" | "shown" }

export function TrendSummary({ fit, degree, quantity, axisLabel, trendFrom }: Props) {
  const q = QUANTITY_LABEL[quantity];
  const kind = degree === 1 ? "Linear" : "Quadratic";
  if (!fit) return <p className="sx-trend" data-testid="trend-summary">{kind} trend: not enough {trendFrom === "sealed" ? "reviewed " : ""}values of <Sym m={q.symbol} /> with an axis value.</p>;
  if (!fit.ok) return <p className="sx-trend" data-testid="trend-summary">{kind} trend not fitted: {fit.message}</p>;
  const formula = <><Sym m={q.symbol} />{degree === 1 ? ` = a₀ + a₁·${axisLabel}` : ` = a₀ + a₁·${axisLabel} + a₂·${axisLabel}²`}</>;
  return (
    <div className="sx-trend" data-testid="trend-summary">
      <div><strong>{kind} trend</strong> {formula}{q.unit ? ` (${q.unit})` : ""}</div>
      <div className="mono">
        {fit.parameters.map((p, i) => <span key={p.name}>{i > 0 ? "; " : ""}{p.name} = {formatValue(p.value, p.stdError)}</span>)}
      </div>
      <div className="small">
        n = {fit.n} {trendFrom === "sealed" ? "sealed" : "shown"} values, {WEIGHTING[fit.weighting]}; <Sym m="χ²_red" /> = {fit.reducedChiSquare === null ? "—" : formatNumber(fit.reducedChiSquare, 3)}; shaded band: ±1σ of the fitted trend.
        {fit.warnings.length > 0 && <> {fit.warnings.join("; ")}.</>}
        {fit.weighting === "absolute" && fit.reducedChiSquare !== null && fit.reducedChiSquare > 3 && <> The values scatter far more than their σ&apos;s (<Sym m="χ²_red" /> ≫ 1, threshold 3 by common practice): this {degree === 1 ? "straight line" : "parabola"} does not describe the series within its errors, and the band understates the trend&apos;s uncertainty.</>}
      </div>
    </div>
  );
}
