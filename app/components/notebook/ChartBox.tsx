"use client";
/**
 * One notebook chart: Observable Plot drawn in an effect, a toolbar to export SVG, PNG and the
 * data as CSV, and pointer gestures over the SVG. Dragging horizontally selects an x range (pixel
 * → data through the chart's own x scale, `plot.scale("x").invert`); a short press is a click
 * at a data position. The parent decides what a range or a click means (a fit window, a
 * discussion range, a point to leave out).
 */
import * as Plot from "@observablehq/plot";
import { useEffect, useRef, useState, type ReactNode } from "react";
import { useContainerWidth } from "@/app/components/useContainerWidth";
import { downloadPng, downloadText, mainSvg, svgText } from "./exportChart";
import { ChartTable } from "../ChartTable";

export interface RangePick {
  xMin: number;
  xMax: number;
  /** Shift held during the drag (a discussion range rather than the primary use). */
  shift: boolean;
}

export interface ClickPick {
  x: number;
  y: number;
  /** Pixel distance from the click to a data position, for nearest-point search. */
  distance: (x: number, y: number) => number;
}

interface Props {
  title: ReactNode;
  /** File name stem for exports, e.g. "fit-ct-vs-t2". */
  name: string;
  label: string;
  testId?: string;
  build: (width: number) => Plot.PlotOptions;
  csv?: () => string;
  /** Enables dragging; the hint says what it does. */
  onRange?: (pick: RangePick) => void;
  dragHint?: string;
  onClick?: (pick: ClickPick) => void;
  /** Called after each draw with the x domain, so another chart can line up with this one. */
  onDrawn?: (xDomain: [number, number]) => void;
  controls?: ReactNode;
  footer?: ReactNode;
}

type Scales = { x: Plot.Scale; y: Plot.Scale };

export function ChartBox({ title, name, label, testId, build, csv, onRange, dragHint, onClick, onDrawn, controls, footer }: Props) {
  const host = useRef<HTMLDivElement>(null);
  const scales = useRef<Scales | null>(null);
  const drag = useRef<{ x0: number; shift: boolean; id: number } | null>(null);
  const [overlay, setOverlay] = useState<{ left: number; width: number } | null>(null);
  const width = useContainerWidth(host);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    const el = host.current;
    if (!el || width < 50) return;
    let chart: (Element & { scale?: (n: string) => Plot.Scale | undefined }) | null = null;
    try {
      chart = Plot.plot(build(width)) as unknown as Element & { scale?: (n: string) => Plot.Scale | undefined };
      el.querySelector(".chart-canvas")?.replaceChildren(chart);
      const x = chart.scale?.("x"), y = chart.scale?.("y");
      scales.current = x && y ? { x, y } : null;
      const dom = x?.domain ? [...x.domain] : [];
      if (dom.length >= 2 && onDrawn) onDrawn([Number(dom[0]), Number(dom[dom.length - 1])]);
      setError(null);
    } catch (err) {
      setError((err as Error).message);
    }
    return () => chart?.remove();
  }, [build, width, onDrawn]);

  /** Pixel position inside the main SVG (CSS scaling undone). */
  function local(e: React.PointerEvent | React.MouseEvent): { px: number; py: number } | null {
    const svg = host.current ? mainSvg(host.current) : null;
    if (!svg) return null;
    const box = svg.getBoundingClientRect();
    const k = Number(svg.getAttribute("width") ?? box.width) / box.width;
    return { px: (e.clientX - box.left) * k, py: (e.clientY - box.top) * k };
  }

  const invertX = (px: number) => Number(scales.current?.x.invert?.(px));

  function onPointerDown(e: React.PointerEvent) {
    if (!onRange || e.button !== 0) return;
    const p = local(e);
    if (!p) return;
    drag.current = { x0: p.px, shift: e.shiftKey, id: e.pointerId };
    (e.currentTarget as Element).setPointerCapture(e.pointerId);
  }

  function onPointerMove(e: React.PointerEvent) {
    const d = drag.current;
    const p = local(e);
    if (!d || !p) return;
    const svg = host.current ? mainSvg(host.current) : null;
    const offset = svg ? svg.getBoundingClientRect().left - host.current!.querySelector(".chart-canvas")!.getBoundingClientRect().left : 0;
    const k = svg ? svg.getBoundingClientRect().width / Number(svg.getAttribute("width") ?? 1) : 1;
    setOverlay({ left: offset + Math.min(d.x0, p.px) * k, width: Math.abs(p.px - d.x0) * k });
  }

  function finish(e: React.PointerEvent) {
    const d = drag.current;
    drag.current = null;
    setOverlay(null);
    const p = local(e);
    if (!p) return;
    if (d && Math.abs(p.px - d.x0) >= 4 && onRange) {
      const a = invertX(d.x0), b = invertX(p.px);
      if (Number.isFinite(a) && Number.isFinite(b)) onRange({ xMin: Math.min(a, b), xMax: Math.max(a, b), shift: d.shift || e.shiftKey });
      return;
    }
    click(p);
  }

  function click(p: { px: number; py: number }) {
    const s = scales.current;
    if (!onClick || !s?.x.apply || !s.y.apply || !s.x.invert || !s.y.invert) return;
    const apply = { x: s.x.apply, y: s.y.apply };
    onClick({ x: Number(s.x.invert(p.px)), y: Number(s.y.invert(p.py)), distance: (x, y) => Math.hypot(Number(apply.x(x)) - p.px, Number(apply.y(y)) - p.py) });
  }

  function exportSvg() {
    const svg = host.current ? mainSvg(host.current) : null;
    if (svg) downloadText(`${name}.svg`, svgText(svg), "image/svg+xml");
  }

  async function exportPng() {
    const svg = host.current ? mainSvg(host.current) : null;
    if (!svg) return;
    try {
      await downloadPng(`${name}.png`, svg);
    } catch (err) {
      setError((err as Error).message);
    }
  }

  return (
    <figure className="chart nb-chart" data-testid={testId}>
      <div className="nb-chart-head">
        <h4>{title}</h4>
        <div className="nb-chart-tools" role="group" aria-label={`Export ${label}`}>
          <button type="button" className="quiet small" onClick={exportSvg}>SVG</button>
          <button type="button" className="quiet small" onClick={exportPng}>PNG</button>
          {csv && <button type="button" className="quiet small" onClick={() => downloadText(`${name}.csv`, csv(), "text/csv")}>CSV</button>}
        </div>
      </div>
      {controls && <div className="chart-controls">{controls}</div>}
      <div
        ref={host}
        className={`plot-host nb-plot${onRange ? " nb-draggable" : ""}`}
        role="img"
        aria-label={label}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={finish}
        onPointerCancel={() => { drag.current = null; setOverlay(null); }}
        onClick={onRange ? undefined : (e) => { const p = local(e); if (p) click(p); }}
      >
        <div className="chart-canvas" />
        {overlay && <div className="nb-drag-band" style={{ left: overlay.left, width: overlay.width }} />}
      </div>
      {dragHint && <p className="small muted nb-hint">{dragHint}</p>}
      {csv && <ChartTable label={label} csv={csv} />}
      {error && <p className="form-error" role="alert">Chart could not be drawn: {error}</p>}
      {footer}
    </figure>
  );
}
