/**
 * The report's C/T vs T² chart as static SVG text, drawn on the server with linkedom (the
 * report must print and read without JavaScript). The chart itself is the notebook's fitPlot;
 * this only rebuilds its input from the report's stored plot data. Server-only.
 */
import * as Plot from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { fitPlot, type FitStepResult } from "@/lib/charts/notebook";
import type { RevisionReport } from "@/lib/server/review";

type ReportFit = RevisionReport["fits"][number];

/** Standalone SVG of one fit of the report (xmlns set), or null when its plot data are missing. */
export function reportFitSvg(fit: ReportFit, width = 640): string | null {
  const points = fit.plot.points as FitStepResult["points"] | null;
  const curve = fit.plot.curve as FitStepResult["curve"] | null;
  if (!points?.temperatureK?.length || !curve) return null;
  const input = {
    basis: fit.basis === "atom" ? "atom" : "formula-unit",
    window: { tMinK: fit.tMinK, tMaxK: fit.tMaxK, requestedMinK: null, requestedMaxK: null, nPoints: fit.nPoints },
    points, curve,
  } as unknown as FitStepResult;
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  const options = fitPlot(input, { width, height: 340 });
  // Tips need a pointer; a printed page has none.
  options.marks = (options.marks ?? []).filter((m) => (m as { ariaLabel?: string } | null)?.ariaLabel !== "tip");
  const el = Plot.plot({ ...options, document: document as unknown as Document }) as unknown as Element;
  const svg = el.tagName.toLowerCase() === "svg" ? el : el.querySelector("svg");
  if (!svg) return null;
  svg.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  return svg.outerHTML;
}
