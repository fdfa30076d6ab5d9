/**
 * Chart builders for one measurement, rendered on the server with linkedom's document.
 * Data here are synthetic (invented for the test): C = γT + βT³ with γ = 0.695 mJ mol⁻¹ K⁻²
 * and β = 0.0473 mJ mol⁻¹ K⁻⁴, roughly copper's values as recalled from textbook tables
 * (from memory; the test only needs a straight line in C/T vs T², not these exact numbers).
 */
import { describe, it, expect } from "vitest";
import * as Plot from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { heatCapacityPlot, sommerfeldPlot, type MeasurementSeries } from "@/lib/charts";
import { InputError } from "@/lib/engine/errors";
import { expectClose } from "../helpers/expectClose";

const GAMMA = 0.695e-3; // J mol⁻¹ K⁻²
const BETA = 0.0473e-3; // J mol⁻¹ K⁻⁴
const T = Array.from({ length: 20 }, (_, i) => 0.5 + i * 0.5); // 0.5 … 10 K

function series(over: Partial<MeasurementSeries> = {}): MeasurementSeries {
  const heatCapacity = T.map((t) => GAMMA * t + BETA * t ** 3);
  return { temperatureK: T, heatCapacity, sigma: null, sourceLines: T.map((_, i) => i + 3), basis: "molar", ...over };
}

function render(options: Plot.PlotOptions): Element {
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  return Plot.plot({ ...options, document: document as unknown as Document }) as unknown as Element;
}

const texts = (el: Element) => [...el.querySelectorAll("text")].map((t) => t.textContent ?? "");
const dots = (el: Element) => [...el.querySelectorAll('g[aria-label="dot"] circle')];
const bars = (el: Element) => [...el.querySelectorAll('g[aria-label="rule"] line')];

describe("heatCapacityPlot", () => {
  it("heatCapacityPlot(molar) labels the axes T (K) and C (J mol⁻¹ K⁻¹) and draws one dot per point", () => {
    const el = render(heatCapacityPlot(series()));
    expect(texts(el)).toContain("T (K)");
    expect(texts(el)).toContain("C (J mol⁻¹ K⁻¹)");
    expect(dots(el)).toHaveLength(T.length);
    expect(bars(el)).toHaveLength(0);
  });

  it("heatCapacityPlot(sample basis, µJ-sized values) picks µJ K⁻¹ for the axis", () => {
    const el = render(heatCapacityPlot(series({ basis: "sample", heatCapacity: T.map((t) => 2e-6 * t) })));
    expect(texts(el)).toContain("C (µJ K⁻¹)");
  });

  it("heatCapacityPlot(specific) shows J g⁻¹ K⁻¹", () => {
    expect(texts(render(heatCapacityPlot(series({ basis: "specific" }))))).toContain("C (J g⁻¹ K⁻¹)");
  });

  it("heatCapacityPlot with σ draws one error bar per point", () => {
    const s = series();
    const el = render(heatCapacityPlot({ ...s, sigma: s.heatCapacity.map((c) => 0.01 * c) }));
    expect(bars(el)).toHaveLength(T.length);
  });

  it("heatCapacityPlot({log}) drops points with C ≤ 0 and says how many in the caption", () => {
    const s = series();
    const heatCapacity = s.heatCapacity.map((c, i) => (i < 2 ? -c : c));
    const options = heatCapacityPlot({ ...s, heatCapacity }, { log: true });
    expect(options.x?.type).toBe("log");
    expect(options.y?.type).toBe("log");
    const el = render(options);
    expect(dots(el)).toHaveLength(T.length - 2);
    expect(el.querySelector("figcaption")?.textContent).toBe("2 points with C ≤ 0 not shown on log axes");
  });

  it("heatCapacityPlot refuses arrays of different length with InputError", () => {
    expect(() => heatCapacityPlot(series({ heatCapacity: [1, 2, 3] }))).toThrow(InputError);
    expect(() => heatCapacityPlot(series({ sigma: [1] }))).toThrow(/invalid sigma/);
  });
});

describe("sommerfeldPlot", () => {
  it("sommerfeldPlot(molar) labels the axes T² (K²) and C/T (mJ mol⁻¹ K⁻²)", () => {
    const el = render(sommerfeldPlot(series()));
    expect(texts(el)).toContain("T² (K²)");
    expect(texts(el)).toContain("C/T (mJ mol⁻¹ K⁻²)");
    expect(dots(el)).toHaveLength(T.length);
  });

  it("sommerfeldPlot({maxTK: 5}) keeps only the points with T ≤ 5 K", () => {
    const el = render(sommerfeldPlot(series(), { maxTK: 5 }));
    expect(dots(el)).toHaveLength(T.filter((t) => t <= 5).length);
  });

  it("sommerfeldPlot puts C = γT + βT³ on a straight line (dot positions collinear)", () => {
    const pos = dots(render(sommerfeldPlot(series()))).map((c) => [Number(c.getAttribute("cx")), Number(c.getAttribute("cy"))] as const);
    const [x0, y0] = pos[0]!;
    const [x1, y1] = pos[pos.length - 1]!;
    const slope = (y1 - y0) / (x1 - x0);
    // Plot writes positions at full precision; 0.05 px allows for rounding in the scale.
    for (const [x, y] of pos) expectClose(y, y0 + slope * (x - x0), { abs: 0.05 }, `dot at x=${x}`);
  });

  it("sommerfeldPlot(sample basis) scales C/T with a prefix on J K⁻²", () => {
    const el = render(sommerfeldPlot(series({ basis: "sample", heatCapacity: T.map((t) => 3e-9 * t + 1e-10 * t ** 3) })));
    expect(texts(el)).toContain("C/T (nJ K⁻²)");
  });
});
