"use client";
/** The parsed curve of a file being imported: C vs T and C/T vs T², in the file's units, before storing. */
import { useCallback } from "react";
import { previewHeatCapacityPlot, previewSommerfeldPlot } from "@/lib/charts/importPreview";
import type { PreviewChecks } from "./ImportPanel";
import { PlotView } from "./PlotView";

export function ImportCurve({ curve, units }: { curve: PreviewChecks["curve"]; units: { temperature: string; heatCapacity: string } }) {
  const buildC = useCallback((w: number) => previewHeatCapacityPlot(curve, units, w), [curve, units.temperature, units.heatCapacity]); // eslint-disable-line react-hooks/exhaustive-deps
  const buildS = useCallback((w: number) => previewSommerfeldPlot(curve, units, w), [curve, units.temperature, units.heatCapacity]); // eslint-disable-line react-hooks/exhaustive-deps
  return (
    <div data-testid="import-curve">
      <div className="chart-grid">
        <figure className="chart">
          <h3>C vs T, as read</h3>
          <PlotView build={buildC} testId="import-chart-c" label="Heat capacity against temperature, as read from the file" />
        </figure>
        <figure className="chart">
          <h3>C/T vs T², as read</h3>
          <PlotView build={buildS} testId="import-chart-ct" label="C over T against T squared, as read from the file" />
        </figure>
      </div>
      <p className="small muted">
        {curve.reduced
          ? `Drawn: ${curve.temperature.length} of ${curve.total} points (the highest, lowest, first and last of each pixel column); every point is stored.`
          : `All ${curve.total} points drawn.`}
      </p>
    </div>
  );
}
