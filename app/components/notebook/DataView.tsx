"use client";
/**
 * The data step's chart: the chosen measurements as stored (fetched from the measurement route),
 * with the range and hand-excluded points. Clicking a point asks for a reason and leaves it out
 * (saved as a step edit); dragging comments on a temperature range.
 */
import { useCallback, useEffect, useMemo, useState } from "react";
import { dataPlot, dataRows, dataCsv, type DataSeries } from "@/lib/charts/notebook";
import { callJson } from "@/app/_lib/api";
import { ChartBox, type ClickPick, type RangePick } from "./ChartBox";
import type { NotebookContext, StepView } from "./types";

type Excluded = { measurementId: string; index: number; reason: string };

export function DataView({ step, ctx, save }: { step: StepView; ctx: NotebookContext; save: (config: Record<string, unknown>) => Promise<boolean> }) {
  const ids = (step.config.measurementIds as string[] | undefined) ?? [];
  const [series, setSeries] = useState<DataSeries[] | null>(null);
  const [log, setLog] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const key = ids.join(",");
  useEffect(() => {
    let live = true;
    Promise.all(ids.map((id) => callJson<{ measurement: DataSeries & { id: string } }>(`${ctx.apiBase}/measurements/${id}`, "GET"))).then((rs) => {
      if (!live) return;
      const bad = rs.find((x) => !x.ok);
      if (bad) setError(bad.error);
      setSeries(rs.filter((x) => x.ok).map((x) => x.data!.measurement));
    });
    return () => { live = false; };
  }, [key, ctx.apiBase]); // eslint-disable-line react-hooks/exhaustive-deps
  const excluded = (step.config.excluded as Excluded[] | undefined) ?? [];
  const tMinK = (step.config.tMinK as number | null) ?? null, tMaxK = (step.config.tMaxK as number | null) ?? null;
  const anchors = useMemo(() => ctx.threads.filter((t) => t.stepId === step.id && t.anchor?.plot === "c-vs-t").map((t) => ({ xMin: t.anchor!.xMin, xMax: t.anchor!.xMax, label: `#${ctx.threads.indexOf(t) + 1}` })), [ctx.threads, step.id]);
  const opts = useMemo(() => ({ log, tMinK, tMaxK, excluded, anchors }), [log, tMinK, tMaxK, excluded, anchors]);
  const build = useCallback((width: number) => dataPlot(series ?? [], { width, ...opts }), [series, opts]);

  async function onClick(pick: ClickPick) {
    if (!series || !ctx.editable) return;
    const { rows } = dataRows(series, opts);
    let best = null as (typeof rows)[number] | null, bestD = 8;
    for (const d of rows) {
      const dist = pick.distance(d.t, d.c);
      if (dist < bestD) { best = d; bestD = dist; }
    }
    if (!best) return;
    if (best.state === "excluded") {
      if (window.confirm(`Put point ${best.index + 1} (T = ${best.t} K) back into the analysis?`)) await save({ ...step.config, excluded: excluded.filter((e) => !(e.measurementId === best!.measurementId && e.index === best!.index)) });
      return;
    }
    const reason = window.prompt(`Leave out point ${best.index + 1} of ${best.label} (T = ${best.t} K)? Say why:`);
    if (reason && reason.trim()) await save({ ...step.config, excluded: [...excluded, { measurementId: best.measurementId, index: best.index, reason: reason.trim() }] });
  }

  function onRange(pick: RangePick) {
    if (!series) return;
    const { rows } = dataRows(series, opts);
    const points = rows.filter((d) => d.t >= pick.xMin && d.t <= pick.xMax).map((d) => ({ measurementId: d.measurementId, index: d.index }));
    ctx.startThread(step.id, { plot: "c-vs-t", xMin: pick.xMin, xMax: pick.xMax, points });
  }

  if (error) return <p className="form-error">The measurement could not be loaded: {error}</p>;
  if (!series) return <p className="muted small">Loading the measurement…</p>;
  return (
    <div className="nb-result">
      <ChartBox title="Heat capacity as measured" name="data-c-vs-t" label="Heat capacity against temperature" testId="chart-data" build={build}
        csv={() => { const d = dataRows(series, opts); return dataCsv(d.rows, d.unit); }}
        onClick={onClick} onRange={onRange}
        dragHint={`${ctx.editable ? "Click a point to leave it out (you will be asked why). " : ""}Drag across the chart to comment on a temperature range.`}
        controls={<label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic axes</label>} />
    </div>
  );
}
