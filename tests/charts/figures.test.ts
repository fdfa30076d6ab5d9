/**
 * Paper figures (lib/charts/figures.ts) rendered to standalone SVG (lib/charts/svg.ts) on the
 * synthetic chain of notebookFixture.ts (invented data): one SVG per figure with xmlns and a
 * viewBox, no pointer tips, symbol markup typeset as tspans, fit and residual panels on one T²
 * axis. The fit + residuals and window-scan figures carry scientific meaning: normalised SVG
 * snapshots.
 */
import { describe, it, expect } from "vitest";
import { parseHTML } from "linkedom";
import { fitFigure, scanFigure, columnWidthPt, forPaper } from "@/lib/charts/figures";
import { chartSvg } from "@/lib/charts/svg";
import { syntheticFit } from "./notebookFixture";

const r = syntheticFit();
const parse = (svg: string) => parseHTML(`<!doctype html><html><body>${svg}</body></html>`).document.querySelector("svg")!;
const normalised = (svg: string) => svg.replace(/-?\d+\.\d+/g, (m) => String(Math.round(Number(m) * 10) / 10)).replace(/></g, ">\n<");

describe("chartSvg of paper figures", () => {
  it("chartSvg(fitFigure) is one standalone SVG as wide as a single column, fit above residuals", () => {
    const w = columnWidthPt("single");
    const svg = parse(chartSvg(fitFigure(r, { widthPt: w }), { fontSize: 8 }));
    expect(svg.getAttribute("xmlns")).toBe("http://www.w3.org/2000/svg");
    expect(Number(svg.getAttribute("width"))).toBe(w);
    const panels = [...svg.children].filter((c) => c.tagName.toLowerCase() === "svg");
    expect(panels).toHaveLength(2);
    expect(Number(panels[1]!.getAttribute("y"))).toBe(Number(panels[0]!.getAttribute("height")));
    expect(svg.querySelectorAll('[aria-label="tip"]')).toHaveLength(0);
  });

  it("fitFigure puts both panels on the same T² domain, so their x ticks line up", () => {
    const svg = parse(chartSvg(fitFigure(r, { widthPt: 500 }), { fontSize: 8 }));
    const ticks = [...svg.querySelectorAll('g[aria-label="x-axis tick"]')].map((g) => [...g.querySelectorAll("path")].map((p) => /translate\(([\d.]+),/.exec(p.getAttribute("transform") ?? "")?.[1]).join(";"));
    expect(ticks).toHaveLength(2);
    expect(ticks[0]).toBe(ticks[1]);
  });

  it("fitFigure labels C/T with its unit and draws ±σ bars for every point shown", () => {
    const text = chartSvg(fitFigure(r, { widthPt: 500 }), { fontSize: 8 });
    expect(text).toContain("C/T (mJ mol⁻¹ K⁻²)");
    expect(text).toContain("T² (K²)");
    const svg = parse(text);
    const shown = r.points.temperatureK.filter((t) => t <= Math.min(Math.max(...r.points.temperatureK), 1.5 * r.window.tMaxK)).length;
    expect(svg.querySelectorAll('g[aria-label="rule"] line').length).toBeGreaterThanOrEqual(shown);
  });

  it("chartSvg typesets markup: T_max and T_min become tspans with a lowered baseline", () => {
    const text = chartSvg([...fitFigure(r, { widthPt: 500 }), ...scanFigure(r.scan!, r.basis, { widthPt: 500 })], { fontSize: 8 });
    expect(text).toMatch(/<tspan(?=[^>]*dy="0\.3em")(?=[^>]*font-size="72%")[^>]*>max<\/tspan>/);
    expect(text).toMatch(/<tspan(?=[^>]*dy="0\.3em")[^>]*>min<\/tspan>/);
    expect(text).not.toMatch(/[A-Za-z]_[a-z]/);
  });

  it("forPaper scales margins and label offsets with the font size", () => {
    const a = forPaper({ x: {}, y: {} }, 8, 100, 200), b = forPaper({ x: {}, y: {} }, 10, 100, 200);
    expect(b.marginLeft! / a.marginLeft!).toBeCloseTo(10 / 8, 1);
    expect(a.width).toBe(200);
  });

  it("fitFigure and scanFigure keep their normalised SVG (snapshot)", () => {
    expect(normalised(chartSvg(fitFigure(r, { widthPt: columnWidthPt("single") }), { fontSize: 8 }))).toMatchSnapshot();
    expect(normalised(chartSvg(scanFigure(r.scan!, r.basis, { widthPt: columnWidthPt("double") }), { fontSize: 8 }))).toMatchSnapshot();
  });
});
