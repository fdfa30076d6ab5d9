"use client";
/**
 * The live part of a series page: axis (x ↔ electrons per atom), quantity, trend degree,
 * drafts shown or not (and whether the trend uses them), γ_free, a second series overlaid on
 * the same axis; the chart (lib/charts/series) with its trend summary, the value tables, and
 * exports (CSV from the server's route, SVG and PNG of the drawn chart). Every number comes from
 * the server's series view; nothing is computed here but display.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { PlotView } from "@/app/components/PlotView";
import { downloadPng, downloadText, mainSvg, svgText } from "@/app/components/notebook/exportChart";
import { seriesPlot, seriesPoints, QUANTITY_LABEL, SERIES_CHART_QUANTITIES, type SeriesChartLayer, type SeriesChartQuantity } from "@/lib/charts/series";
import type { SeriesView } from "@/lib/server/series";
import { SeriesTable, ALL_COLUMNS } from "./SeriesTable";
import { TrendSummary } from "./TrendSummary";
import { Sym } from "../Sym";
import { plainSymbol } from "@/lib/display";

interface Props { slug: string; initial: SeriesView; others: { id: string; name: string }[] }

type Axis = "x" | "ea";

function Seg<T extends string>({ value, options, onChange, label }: { value: T; options: [T, string][]; onChange: (v: T) => void; label: string }) {
  return (
    <span className="sx-seg" role="group" aria-label={label}>
      {options.map(([v, text]) => <button key={v} type="button" aria-pressed={v === value} onClick={() => onChange(v)} data-testid={`${label.toLowerCase().replace(/\W+/g, "-")}-${v}`}>{text}</button>)}
    </span>
  );
}

function layerOf(view: SeriesView, q: SeriesChartQuantity, degree: 1 | 2): SeriesChartLayer {
  const t = view.trends[q];
  const fit = degree === 1 ? t.linear : t.quadratic;
  return { name: view.series.name, rows: view.rows, trend: fit ? { ...fit, degree } : null, trendFrom: view.trendFrom };
}

export function SeriesExplorer({ slug, initial, others }: Props) {
  const api = `/api/groups/${encodeURIComponent(slug)}/series`;
  const [view, setView] = useState(initial);
  const [overlay, setOverlay] = useState<SeriesView | null>(null);
  const [axis, setAxis] = useState<Axis>(initial.axis);
  const [drafts, setDrafts] = useState(initial.includeDrafts);
  const [trendFromShown, setTrendFromShown] = useState(initial.trendFrom === "shown");
  const [quantity, setQuantity] = useState<SeriesChartQuantity>("gamma");
  const [degree, setDegree] = useState<1 | 2>(1);
  const [showFree, setShowFree] = useState(true);
  const [overlayId, setOverlayId] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(false);
  const chartHost = useRef<HTMLDivElement>(null);
  const query = `?axis=${axis}${drafts ? "&include=drafts" : ""}${drafts && trendFromShown ? "&trendFrom=shown" : ""}`;

  useEffect(() => {
    let stale = false;
    setLoading(true);
    (async () => {
      const [a, b] = await Promise.all([
        callJson<{ view: SeriesView }>(`${api}/${initial.series.id}${query}`, "GET"),
        overlayId ? callJson<{ view: SeriesView }>(`${api}/${overlayId}${query}`, "GET") : Promise.resolve(null),
      ]);
      if (stale) return;
      setLoading(false);
      if (!a.ok) { setError(a.error); return; }
      setError(b && !b.ok ? `overlay: ${b.error}` : null);
      setView(a.data!.view);
      setOverlay(b?.ok ? b.data!.view : null);
    })();
    return () => { stale = true; };
  }, [api, initial.series.id, query, overlayId]);

  const primary = useMemo(() => layerOf(view, quantity, degree), [view, quantity, degree]);
  const second = useMemo(() => (overlay ? layerOf(overlay, quantity, degree) : null), [overlay, quantity, degree]);
  const flagged = useMemo(() => new Set(seriesPoints(primary, quantity).filter((p) => p.outlier).map((p) => `${p.label}|${p.draft}`)), [primary, quantity]);
  const build = useCallback((width: number) => seriesPlot({ quantity, axisLabel: view.axisLabel, primary, overlay: second, showGammaFree: showFree, width: Math.max(width, 320) }), [quantity, view.axisLabel, primary, second, showFree]);
  const stem = `${view.series.name.replace(/[^A-Za-z0-9._-]+/g, "_")}-${quantity}-vs-${axis}`;
  const svg = () => (chartHost.current ? mainSvg(chartHost.current) : null);
  const fit = degree === 1 ? view.trends[quantity].linear : view.trends[quantity].quadratic;
  const q = QUANTITY_LABEL[quantity];

  return (
    <>
      <div className="sx-controls" data-testid="series-controls">
        <span>Axis <Seg label="Axis" value={axis} onChange={setAxis} options={[["x", view.series.compositionVariable], ["ea", "electrons per atom"]]} /></span>
        <label>Quantity <select value={quantity} onChange={(e) => setQuantity(e.target.value as SeriesChartQuantity)} data-testid="series-quantity">
          {SERIES_CHART_QUANTITIES.map((k) => <option key={k} value={k}>{plainSymbol(QUANTITY_LABEL[k].symbol)}</option>)}
        </select></label>
        <span>Trend <Seg label="Trend" value={String(degree) as "1" | "2"} onChange={(v) => setDegree(v === "2" ? 2 : 1)} options={[["1", "linear"], ["2", "quadratic"]]} /></span>
        <label className="checkbox"><input type="checkbox" checked={drafts} onChange={(e) => setDrafts(e.target.checked)} data-testid="series-drafts" /> show unreviewed drafts</label>
        {drafts && <label className="checkbox"><input type="checkbox" checked={trendFromShown} onChange={(e) => setTrendFromShown(e.target.checked)} /> fit the trend to drafts too</label>}
        {quantity === "gamma" && <label className="checkbox"><input type="checkbox" checked={showFree} onChange={(e) => setShowFree(e.target.checked)} /> <span><Sym m="γ_free" /></span></label>}
        {others.length > 0 && <label>Overlay <select value={overlayId} onChange={(e) => setOverlayId(e.target.value)} data-testid="series-overlay"><option value="">— none —</option>{others.map((o) => <option key={o.id} value={o.id}>{o.name}</option>)}</select></label>}
        {loading && <span className="small muted">updating…</span>}
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
      <div className="sx-layout">
        <section className="chart">
          <h3><Sym m={q.symbol} /> against {view.axisLabel}</h3>
          <div ref={chartHost}><PlotView build={build} testId="series-chart" label={`${plainSymbol(q.symbol)} against ${view.axisLabel}, with the weighted trend`} /></div>
          <TrendSummary fit={fit} degree={degree} quantity={quantity} axisLabel={axis === "x" ? view.series.compositionVariable : "e/a"} trendFrom={view.trendFrom} />
          <div className="actions small">
            <a className="button quiet small" href={`${api}/${view.series.id}/export${query}`} download data-testid="export-csv">CSV of the table</a>
            <a className="button quiet small" href={`${api}/${view.series.id}/export${query}${query ? "&" : "?"}format=latex`} download data-testid="export-latex">LaTeX table</a>
            {(["single", "double"] as const).map((col) => <a key={col} className="button quiet small" href={`${api}/${view.series.id}/export${query}${query ? "&" : "?"}format=pdf&quantity=${quantity}&degree=${degree}&column=${col}`} download data-testid={`export-figure-${col}`}>Figure PDF {col === "single" ? "8.5" : "17.5"} cm</a>)}
            <a className="button quiet small" href={`${api}/${view.series.id}/export${query}${query ? "&" : "?"}format=svg&quantity=${quantity}&degree=${degree}&column=single`} download>Figure SVG 8.5 cm</a>
            <button type="button" className="quiet small" onClick={() => { const s = svg(); if (s) downloadText(`${stem}.svg`, svgText(s), "image/svg+xml"); }} data-testid="export-svg">SVG</button>
            <button type="button" className="quiet small" onClick={() => { const s = svg(); if (s) void downloadPng(`${stem}.png`, s).catch((e: Error) => setError(e.message)); }} data-testid="export-png">PNG</button>
          </div>
        </section>
        <section>
          <h3><Sym m={q.symbol} /> by sample</h3>
          <SeriesTable rows={view.rows} slug={slug} flagged={flagged} testId="series-table" caption={`${plainSymbol(q.symbol)} by sample`}
            columns={[ALL_COLUMNS[0]!, ALL_COLUMNS.find((c) => c.key === (axis === "x" ? "x" : "ea"))!, ALL_COLUMNS.find((c) => c.key === quantity)!, ALL_COLUMNS[ALL_COLUMNS.length - 1]!]} />
        </section>
      </div>
      <h2>All values</h2>
      <p className="small muted">Per mole formula unit; value(σ) with one standard error in the last digits. Rows in italics come from revisions not reviewed yet.</p>
      <SeriesTable rows={view.rows} slug={slug} flagged={flagged} testId="series-table-all" caption="All values of the series" columns={ALL_COLUMNS} />
    </>
  );
}
