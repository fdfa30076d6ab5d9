"use client";
/**
 * The sample page's overlay: tick measurements of the sample (all stored per the same basis) and
 * see them on one chart, C vs T or C/T vs T², coloured by measurement. A table beside it gives
 * each curve's range as text (the chart's alternative for screen readers).
 */
import { useCallback, useEffect, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { overlayPlot, OVERLAY_COLOURS, type OverlaySeries } from "@/lib/charts/overlay";
import { PlotView } from "./PlotView";

export interface OverlayChoice { id: string; label: string; kind: "sample" | "addenda"; fieldT: number; basis: "sample" | "molar" | "specific"; pointCount: number; tMinK: number; tMaxK: number }

const BASIS_WORD = { sample: "as measured (J K⁻¹)", molar: "per mole", specific: "per gram" } as const;
const name = (m: OverlayChoice) => `${m.label} (${m.kind === "addenda" ? "addenda" : `${m.fieldT} T`})`;

export function MeasurementOverlay({ apiBase, choices }: { apiBase: string; choices: OverlayChoice[] }) {
  const basis = choices[0]?.basis ?? "sample";
  const usable = choices.filter((c) => c.basis === basis);
  const [on, setOn] = useState<string[]>(usable.slice(0, OVERLAY_COLOURS.length).map((c) => c.id));
  const [data, setData] = useState<Record<string, OverlaySeries>>({});
  const [view, setView] = useState<"c-vs-t" | "ct-vs-t2">("ct-vs-t2");
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    const missing = on.filter((id) => !data[id]);
    if (!missing.length) return;
    let live = true;
    Promise.all(missing.map((id) => callJson<{ measurement: { temperatureK: number[]; heatCapacity: number[] } }>(`${apiBase}/measurements/${id}`, "GET"))).then((rs) => {
      if (!live) return;
      const next = { ...data };
      rs.forEach((r, k) => {
        const c = choices.find((x) => x.id === missing[k])!;
        if (r.ok && r.data) next[c.id] = { label: name(c), basis: c.basis, temperatureK: r.data.measurement.temperatureK, heatCapacity: r.data.measurement.heatCapacity };
        else setError(r.error);
      });
      setData(next);
    });
    return () => { live = false; };
  }, [on]); // eslint-disable-line react-hooks/exhaustive-deps
  const shown = on.map((id) => data[id]).filter((s): s is OverlaySeries => Boolean(s));
  const build = useCallback((width: number) => overlayPlot(shown, { width, view, maxTK: view === "ct-vs-t2" ? 15 : undefined }), [shown.map((s) => s.label).join("|"), view]); // eslint-disable-line react-hooks/exhaustive-deps
  if (usable.length < 2) return null;
  return (
    <section className="sheet" aria-labelledby="overlay" data-testid="overlay">
      <h2 id="overlay">Measurements together</h2>
      <p className="small">Stored {BASIS_WORD[basis]}; {choices.length > usable.length ? `${choices.length - usable.length} measurement(s) stored per another basis are not offered. ` : ""}Each curve is drawn with the extremes of every pixel column kept.</p>
      <div className="chart-controls">
        {usable.map((c) => (
          <label key={c.id} className="checkbox">
            <input type="checkbox" checked={on.includes(c.id)} disabled={!on.includes(c.id) && on.length >= OVERLAY_COLOURS.length}
              onChange={(e) => setOn(e.target.checked ? [...on, c.id] : on.filter((x) => x !== c.id))} /> {name(c)}
          </label>
        ))}
        <label htmlFor="overlay-view">View</label>
        <select id="overlay-view" value={view} onChange={(e) => setView(e.target.value as "c-vs-t" | "ct-vs-t2")}>
          <option value="ct-vs-t2">C/T vs T² (T ≤ 15 K)</option>
          <option value="c-vs-t">C vs T</option>
        </select>
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
      {shown.length > 0 && <PlotView build={build} testId="overlay-chart" label={`Overlay of ${shown.length} measurements: ${view === "ct-vs-t2" ? "C over T against T squared" : "heat capacity against temperature"}`} />}
      <table className="small" data-testid="overlay-table">
        <caption className="sr-only">The overlaid measurements</caption>
        <thead><tr><th>Measurement</th><th className="num">Points</th><th className="num">T range (K)</th></tr></thead>
        <tbody>{usable.filter((c) => on.includes(c.id)).map((c) => <tr key={c.id}><td>{name(c)}</td><td className="num">{c.pointCount}</td><td className="num">{Number(c.tMinK.toPrecision(3))}–{Number(c.tMaxK.toPrecision(3))}</td></tr>)}</tbody>
      </table>
    </section>
  );
}
