/**
 * The series chart builder rendered with linkedom. Data are INVENTED for the test: γ falling
 * linearly with x as γ = 7.8 − 9x mJ mol⁻¹ K⁻² (a transition-metal-like magnitude, common
 * practice), σ = 0.1, seeded noise, one sealed member pushed 0.6 (6σ) off the line so the
 * trend flags it, one draft row and one member without an analysis. Trends come from the real
 * engine (fitTrend). The trend chart carries scientific meaning, so its normalised SVG is kept as
 * a snapshot.
 */
import { describe, it, expect } from "vitest";
import * as Plot from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { seriesPlot, seriesPoints, type SeriesChartLayer, type SeriesChartRow } from "@/lib/charts/series";
import { fitTrend } from "@/lib/engine/series";
import { InputError } from "@/lib/engine/errors";
import { expectClose } from "../helpers/expectClose";
import { normals } from "./notebookFixture";

const XS = [0, 0.1, 0.2, 0.3, 0.4, 0.5];
const OFF = 3; // index of the member pushed off the line

function rows(): SeriesChartRow[] {
  const next = normals(2024);
  const out: SeriesChartRow[] = XS.map((x, i) => ({
    sample: { label: `S-${i + 1}` }, axisValue: x, draft: false, revision: { revisionNumber: 1, state: "sealed" }, gammaFree: 0.5 + 0.3 * x,
    gamma: { value: 7.8 - 9 * x + 0.1 * next() + (i === OFF ? 0.6 : 0), stdError: 0.1 },
    thetaD: { value: 275 + 100 * x, stdError: 3 }, dosEF: null, massRatio: null, tc: null,
  }));
  // The server sorts rows by axis value, a draft right after the sealed row of its sample.
  out.splice(2, 0, { ...out[1]!, sample: { label: "S-2" }, draft: true, revision: { revisionNumber: 2, state: "open" }, gamma: { value: 7.0, stdError: 0.2 } });
  out.push({ sample: { label: "S-7" }, axisValue: 0.6, draft: false, revision: null, gammaFree: null, gamma: null, thetaD: null, dosEF: null, massRatio: null, tc: null });
  return out;
}

function layer(name = "Demo series", over: Partial<SeriesChartLayer> = {}): SeriesChartLayer {
  const rs = rows();
  const fitted = rs.filter((r) => r.revision && !r.draft && r.gamma);
  const trend = fitTrend(fitted.map((r) => ({ x: r.axisValue!, y: r.gamma!.value, sigma: r.gamma!.stdError })), { degree: 1 });
  return { name, rows: rs, trend, trendFrom: "sealed", ...over };
}

/** SVG text with random class names removed and coordinates rounded to 0.1 px. */
function normalisedSvg(el: Element): string {
  return el.outerHTML.replace(/plot-[0-9a-f]+/g, "plot").replace(/-?\d+\.\d+/g, (m) => String(Math.round(Number(m) * 10) / 10)).replace(/></g, ">\n<");
}

function render(options: Plot.PlotOptions): Element {
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  return Plot.plot({ ...options, document: document as unknown as Document }) as unknown as Element;
}

const texts = (el: Element) => [...el.querySelectorAll("text")].map((t) => t.textContent ?? "");
const dotGroups = (el: Element) => [...el.querySelectorAll('g[aria-label="dot"]')];
const filled = (el: Element, colour: string) => dotGroups(el).filter((g) => g.getAttribute("fill") === colour).reduce((n, g) => n + g.children.length, 0);

describe("seriesPoints", () => {
  it("seriesPoints maps the trend's outlier index to the sealed row it was fitted to, skipping drafts and empty rows", () => {
    const l = layer();
    expect(l.trend!.outliers).toEqual([OFF]);
    const pts = seriesPoints(l, "gamma");
    expect(pts).toHaveLength(7); // six sealed + one draft; the member without a value is left out
    expect(pts.filter((p) => p.outlier).map((p) => p.label)).toEqual([`S-${OFF + 1}`]);
    expect(pts.filter((p) => p.draft).map((p) => p.label)).toEqual(["S-2"]);
  });

  it("seriesPoints keeps value ± σ as the bar ends", () => {
    const p = seriesPoints(layer(), "gamma").find((q) => q.draft)!;
    expectClose(p.lo!, 6.8, { rel: 1e-12 });
    expectClose(p.hi!, 7.2, { rel: 1e-12 });
  });

  it("seriesPoints with trendFrom 'shown' counts the draft among the fitted rows", () => {
    const l = layer("x", { trendFrom: "shown", trend: { ok: true, degree: 1, band: [], outliers: [2], outlierSigma: 3 } });
    // fitted order: S-1, S-2, S-2 (draft), S-3 …: index 2 is the draft row
    expect(seriesPoints(l, "gamma").filter((p) => p.outlier).map((p) => [p.label, p.draft])).toEqual([["S-2", true]]);
  });

  it("seriesPoints throws InputError for an outlier index past the fitted rows", () => {
    const l = layer("x", { trend: { ok: true, degree: 1, band: [], outliers: [6], outlierSigma: 3 } });
    expect(() => seriesPoints(l, "gamma")).toThrow(InputError);
  });
});

describe("seriesPlot", () => {
  it("seriesPlot draws sealed points filled, the draft hollow with a dashed bar, and rings the outlier", () => {
    const el = render(seriesPlot({ quantity: "gamma", axisLabel: "x", primary: layer() }));
    const rules = [...el.querySelectorAll('g[aria-label="rule"]')];
    const dashed = rules.filter((g) => g.getAttribute("stroke-dasharray") === "3,2");
    expect(dashed.reduce((n, g) => n + g.children.length, 0)).toBe(1);
    expect(rules.filter((g) => !g.getAttribute("stroke-dasharray")).reduce((n, g) => n + g.children.length, 0)).toBe(6);
    expect(filled(el, "#1e2431")).toBe(6 + 1); // six points + the legend swatch
    const rings = dotGroups(el).filter((g) => g.getAttribute("stroke") === "#8e1b33");
    expect(rings.reduce((n, g) => n + g.children.length, 0)).toBe(2); // the ring + its legend swatch
  });

  it("seriesPlot labels the axes and writes the legend into the SVG", () => {
    const t = texts(render(seriesPlot({ quantity: "gamma", axisLabel: "x (Mo fraction)", primary: layer(), showGammaFree: true })));
    expect(t).toContain("x (Mo fraction)");
    expect(t).toContain("γ (mJ mol⁻¹ K⁻², per mole formula unit)");
    for (const s of ["Demo series: reviewed (sealed)", "not reviewed yet (draft)", "linear trend ±1σ", "> 3σ from the trend", "γ_free (free electrons)"]) expect(t).toContain(s);
  });

  it("seriesPlot draws the trend band as one area and the γ_free overlay only for γ", () => {
    const g = render(seriesPlot({ quantity: "gamma", axisLabel: "x", primary: layer(), showGammaFree: true }));
    expect(g.querySelectorAll('g[aria-label="area"] path')).toHaveLength(1);
    expect(dotGroups(g).some((d) => d.getAttribute("stroke") === "#2f5d3a")).toBe(true);
    const th = render(seriesPlot({ quantity: "thetaD", axisLabel: "x", primary: layer("S", { trend: null }), showGammaFree: true }));
    expect(dotGroups(th).some((d) => d.getAttribute("stroke") === "#2f5d3a")).toBe(false);
    expect(texts(th)).toContain("Θ_D (K)");
    expect(th.querySelectorAll('g[aria-label="area"]')).toHaveLength(0);
  });

  it("seriesPlot overlays a second series in squares with its name in the legend", () => {
    const el = render(seriesPlot({ quantity: "gamma", axisLabel: "e/a", primary: layer(), overlay: layer("Second series") }));
    expect(texts(el)).toContain("Second series");
    expect(filled(el, "#3f6584")).toBe(6 + 1);
  });

  it("seriesPlot refuses a width below 200 px", () => {
    expect(() => seriesPlot({ quantity: "gamma", axisLabel: "x", primary: layer(), width: 120 })).toThrow(InputError);
  });

  it("seriesPlot renders the γ trend chart to the stored normalised SVG", () => {
    expect(normalisedSvg(render(seriesPlot({ quantity: "gamma", axisLabel: "x", primary: layer(), showGammaFree: true, width: 560 })))).toMatchSnapshot();
  });
});
