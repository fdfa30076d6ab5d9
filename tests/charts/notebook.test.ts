/**
 * Notebook chart builders rendered with linkedom on synthetic chains (notebookFixture.ts,
 * invented data). The fit + residuals and window-scan charts carry scientific meaning, so their
 * normalised SVG is kept as a snapshot.
 */
import { describe, it, expect } from "vitest";
import * as Plot from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { fitPlot, residualPlot, scanPlot, fitRows, residualRows, defaultMaxTK, fitCsv, scanCsv, scanRows } from "@/lib/charts/notebook";
import { InputError } from "@/lib/engine/errors";
import { expectClose } from "../helpers/expectClose";
import { GAMMA, syntheticFit } from "./notebookFixture";

function render(options: Plot.PlotOptions): Element {
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  return Plot.plot({ ...options, document: document as unknown as Document }) as unknown as Element;
}

const texts = (el: Element) => [...el.querySelectorAll("text")].map((t) => t.textContent ?? "");
const marks = (el: Element, name: string, shape: string) => [...el.querySelectorAll(`g[aria-label="${name}"] ${shape}`)];

/** SVG text with random class names removed and coordinates rounded to 0.1 px. */
export function normalisedSvg(el: Element): string {
  return el.outerHTML
    .replace(/plot-[0-9a-f]+/g, "plot")
    .replace(/-?\d+\.\d+/g, (m) => String(Math.round(Number(m) * 10) / 10))
    .replace(/></g, ">\n<");
}

const result = syntheticFit();

describe("fitPlot", () => {
  it("fitPlot labels T² (K²) and C/T in mJ mol⁻¹ K⁻² per mole formula unit", () => {
    const el = render(fitPlot(result));
    expect(texts(el)).toContain("T² (K²)");
    expect(texts(el)).toContain("C/T (mJ mol⁻¹ K⁻², per mole formula unit)");
  });

  it("fitPlot draws one dot and one σ bar per shown point and shades the window", () => {
    const shown = fitRows(result, defaultMaxTK(result));
    const el = render(fitPlot(result));
    expect(marks(el, "dot", "circle")).toHaveLength(shown.length);
    expect(marks(el, "rule", "line")).toHaveLength(shown.length);
    expect(marks(el, "rect", "rect").length).toBeGreaterThanOrEqual(1);
    expect(shown.filter((d) => d.inWindow)).toHaveLength(result.window.nPoints);
  });

  it("fitPlot({maxTK: null}) shows every point, the default stops at 1.5 × T_max of the window", () => {
    expect(fitRows(result, null)).toHaveLength(result.points.temperatureK.length);
    expectClose(defaultMaxTK(result), 1.5 * result.window.tMaxK, { rel: 1e-12 });
  });

  it("fitRows gives C/T = γ + βT² in display units within 4σ near the low end", () => {
    const first = fitRows(result)[0]!;
    expectClose(first.y, (GAMMA + 0.055e-3 * first.t ** 2) * 1e3, { abs: 4 * (first.hi! - first.y) });
  });

  it("fitPlot draws discussion ranges as bands with their labels", () => {
    const el = render(fitPlot(result, { anchors: [{ xMin: 5, xMax: 9, label: "A" }] }));
    expect(texts(el)).toContain("A");
  });

  it("fitPlot throws InputError when σ and T differ in length", () => {
    const bad = { ...result, points: { ...result.points, sigma: result.points.sigma!.slice(1) } };
    expect(() => fitPlot(bad)).toThrow(InputError);
  });
});

describe("residualPlot", () => {
  it("residualRows gives one row per fitted point with (C − C_fit)/σ of order one", () => {
    const rows = residualRows(result);
    expect(rows).toHaveLength(result.window.nPoints);
    const rms = Math.sqrt(rows.reduce((s, d) => s + d.normalised! ** 2, 0) / rows.length);
    expect(rms).toBeGreaterThan(0.5);
    expect(rms).toBeLessThan(1.5);
  });

  it("residualPlot labels (C − C_fit)/T with its unit and draws the zero line", () => {
    const el = render(residualPlot(result, { xDomain: [0, 60] }));
    expect(texts(el)).toContain("(C − C_fit)/T (mJ mol⁻¹ K⁻²)");
    expect(marks(el, "rule", "line").length).toBeGreaterThan(result.window.nPoints);
  });

  it("fitPlot + residualPlot render to the stored normalised SVG", () => {
    const svg = normalisedSvg(render(fitPlot(result, { width: 520 }))) + "\n\n" + normalisedSvg(render(residualPlot(result, { width: 520 })));
    expect(svg).toMatchSnapshot();
  });
});

describe("scanPlot", () => {
  it("scanPlot labels T_max (K) and γ with its unit and basis, and marks the recommended window", () => {
    const el = render(scanPlot(result.scan!, { basis: "formula-unit" }));
    expect(texts(el)).toContain("window upper edge T_max (K)");
    expect(texts(el)).toContain("γ (mJ mol⁻¹ K⁻², per mole formula unit)");
    expect(texts(el).some((t) => t.startsWith("recommended "))).toBe(true);
  });

  it("scanRows keeps every converged cell and flags the plateau members", () => {
    const rows = scanRows(result.scan!);
    expect(rows.length).toBe(result.scan!.cells.filter((c) => c.converged && c.gamma !== null).length);
    expect(rows.filter((r) => r.plateau).length).toBe(result.scan!.plateau?.cells.length ?? 0);
  });

  it("scanPlot renders to the stored normalised SVG", () => {
    expect(normalisedSvg(render(scanPlot(result.scan!, { width: 520, basis: "formula-unit", current: { tMaxK: 6, gammaSI: GAMMA } })))).toMatchSnapshot();
  });
});

describe("notebook CSV", () => {
  it("fitCsv writes one line per point with units in the header", () => {
    const lines = fitCsv(result).trimEnd().split("\r\n");
    expect(lines[0]).toBe("T (K),C (J mol-1 K-1 (per mole formula unit)),sigma_C (J mol-1 K-1 (per mole formula unit)),in_window,residual_C_minus_fit (J mol-1 K-1 (per mole formula unit)),measurement_id,point_index");
    expect(lines).toHaveLength(result.points.temperatureK.length + 1);
  });

  it("scanCsv writes one line per scanned window", () => {
    expect(scanCsv(result.scan!).trimEnd().split("\r\n")).toHaveLength(result.scan!.cells.length + 1);
  });
});
