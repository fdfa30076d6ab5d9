"use client";
/** The two charts of a measurement, with a log-axis switch for C vs T and a T range for C/T vs T². */
import { useCallback, useState } from "react";
import { heatCapacityPlot, sommerfeldPlot, type MeasurementSeries } from "@/lib/charts";
import { reduceSeriesForView } from "@/lib/charts/reduce";
import { PlotView } from "./PlotView";

const RANGES = [
  { value: "", label: "all points" },
  { value: "10", label: "T ≤ 10 K" },
  { value: "5", label: "T ≤ 5 K" },
  { value: "3", label: "T ≤ 3 K" },
];

/** `drawn` of `total` points reach the browser (reduced per pixel column on the server when large). */
export function MeasurementCharts({ series, drawn, total }: { series: MeasurementSeries; drawn?: number; total?: number }) {
  const [log, setLog] = useState(false);
  const [maxT, setMaxT] = useState("");
  // Each chart draws its own pixel columns' extremes of what arrived (one column per CSS pixel of its width).
  const buildC = useCallback((width: number) => heatCapacityPlot(reduceSeriesForView(series, { x: (t) => t, y: (_, c) => c, bins: width, logX: log }), { width, log }), [series, log]);
  const buildS = useCallback((width: number) => {
    const maxTK = maxT ? Number(maxT) : null;
    const shown = reduceSeriesForView(series, { x: (t) => t * t, y: (t, c) => c / t, bins: width, ...(maxTK !== null ? { keep: (t: number) => t <= maxTK } : {}) });
    return sommerfeldPlot(shown, { width, ...(maxTK !== null ? { maxTK } : {}) });
  }, [series, maxT]);
  const reduced = drawn !== undefined && total !== undefined && drawn < total;
  return (
    <>
    {reduced && (
      <p className="small muted" data-testid="chart-reduced">
        {total.toLocaleString("en-GB").replace(/,/g, " ")} points: the page receives {drawn.toLocaleString("en-GB").replace(/,/g, " ")} of them, and each chart draws the first, last, highest and lowest
        in each of its pixel columns, so the curve looks as it would with every point. Fits, exports and the CSV use every point.
      </p>
    )}
    <div className="chart-grid">
      <figure className="chart">
        <h3>Heat capacity C vs temperature T</h3>
        <div className="chart-controls">
          <label className="checkbox">
            <input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} data-testid="log-axes" /> Logarithmic axes
          </label>
          <span className="muted">Hover a point for its values and file line.</span>
        </div>
        <PlotView build={buildC} testId="chart-c-vs-t" label="Heat capacity against temperature" />
      </figure>
      <figure className="chart">
        <h3>C/T vs T² (intercept γ, slope β when C = γT + βT³)</h3>
        <div className="chart-controls">
          <label htmlFor="ct-range">Show</label>
          <select id="ct-range" value={maxT} onChange={(e) => setMaxT(e.target.value)}>
            {RANGES.map((r) => <option key={r.value} value={r.value}>{r.label}</option>)}
          </select>
        </div>
        <PlotView build={buildS} testId="chart-ct-vs-t2" label="C over T against T squared" />
      </figure>
    </div>
    </>
  );
}
