"use client";
/**
 * The data step's chart: the chosen measurements as stored (fetched from the measurement route),
 * with the range and hand-excluded points. Clicking a point chooses it in the exclusion panel
 * below (which works by keyboard too: choose, say why, leave out; every exclusion listed with
 * "Put back"); dragging comments on a temperature range.
 */
import { useCallback, useEffect, useMemo, useState } from "react";
import { dataPlot, dataRows, dataCsv, type DataSeries } from "@/lib/charts/notebook";
import { callJson } from "@/app/_lib/api";
import { ChartBox, type ClickPick, type RangePick } from "./ChartBox";
import { ExclusionPanel, type Exclusion } from "./ExclusionPanel";
import type { NotebookContext, StepView } from "./types";

type Excluded = { measurementId: string; index: number; reason: string };

export function DataView({ step, ctx, save }: { step: StepView; ctx: NotebookContext; save: (config: Record<string, unknown>) => Promise<boolean> }) {
  const ids = (step.config.measurementIds as string[] | undefined) ?? [];
  const [series, setSeries] = useState<DataSeries[] | null>(null);
  const [log, setLog] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [picked, setPicked] = useState<string | null>(null);
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
    if (best && best.state !== "excluded") setPicked(`${best.measurementId}:${best.index}`);
  }

  const exclude = async (e: Exclusion) => { await save({ ...step.config, excluded: [...excluded, e] }); };
  const restore = async (e: Exclusion) => { await save({ ...step.config, excluded: excluded.filter((x) => !(x.measurementId === e.measurementId && x.index === e.index)) }); };

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
        dragHint={`${ctx.editable ? "Click a point to choose it for leaving out (below). " : ""}Drag across the chart to comment on a temperature range.`}
        controls={<label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic axes</label>} />
      <ExclusionPanel rows={dataRows(series, opts).rows} excluded={excluded} editable={ctx.editable} picked={picked} onExclude={exclude} onRestore={restore} />
    </div>
  );
}
