/** reduceForChart: per-pixel-column reduction keeps every bin's extremes (M4, Jugel et al. 2014). */
import { describe, expect, it } from "vitest";
import { pickPoints, reduceForChart, reduceMeasurementForScreen } from "../../lib/charts/reduce";

/** Park–Miller uniform deviates, seeded. */
function uniform(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

describe("reduceForChart", () => {
  it("reduceForChart keeps every point when there are at most four per bin", () => {
    expect(reduceForChart([1, 2, 3], [4, 5, 6], { bins: 1 })).toEqual([0, 1, 2]);
  });

  it("reduceForChart keeps, in every bin, the highest and lowest point of the full curve", () => {
    const next = uniform(7);
    const n = 100_000;
    const xs = Array.from({ length: n }, (_, i) => 0.4 + (i / n) * 20);
    const ys = xs.map((x) => 0.002 * x + 1e-4 * x ** 3 + (next() - 0.5) * 0.01);
    ys[54_321] = 5; // a spike must survive
    const bins = 600;
    const keep = reduceForChart(xs, ys, { bins });
    expect(keep.length).toBeLessThanOrEqual(4 * bins);
    expect(keep).toContain(54_321);
    const lo = xs[0]!;
    const width = (xs[n - 1]! - lo) / bins;
    const kept = new Set(keep);
    for (let b = 0; b < bins; b += 37) {
      let max = -Infinity, min = Infinity, argMax = -1, argMin = -1;
      for (let i = 0; i < n; i++) {
        if (Math.min(bins - 1, Math.floor((xs[i]! - lo) / width)) !== b) continue;
        if (ys[i]! > max) [max, argMax] = [ys[i]!, i];
        if (ys[i]! < min) [min, argMin] = [ys[i]!, i];
      }
      expect(kept.has(argMax)).toBe(true);
      expect(kept.has(argMin)).toBe(true);
    }
    expect([...keep].every((v, i, a) => i === 0 || a[i - 1]! < v)).toBe(true);
  });

  it("reduceForChart bins on log x when asked and ignores non-finite points", () => {
    const xs = Array.from({ length: 10_000 }, (_, i) => 10 ** (-1 + (3 * i) / 9999));
    const ys = xs.map((x, i) => (i === 5 ? NaN : x));
    const keep = reduceForChart(xs, ys, { bins: 100, logX: true });
    expect(keep).not.toContain(5);
    expect(keep.length).toBeGreaterThan(150);
    expect(keep.length).toBeLessThanOrEqual(400);
  });

  it("reduceForChart refuses x and y of different lengths", () => {
    expect(() => reduceForChart([1, 2], [1], { bins: 10 })).toThrow(RangeError);
  });

  it("pickPoints cuts T, C, σ and source lines to the same indices", () => {
    const s = { temperatureK: [1, 2, 3], heatCapacity: [4, 5, 6], sigma: [0.1, 0.2, 0.3], sourceLines: [7, 8, 9], basis: "molar" as const };
    expect(pickPoints(s, [0, 2])).toEqual({ temperatureK: [1, 3], heatCapacity: [4, 6], sigma: [0.1, 0.3], sourceLines: [7, 9], basis: "molar" });
  });
});

describe("reduceMeasurementForScreen", () => {
  it("reduceMeasurementForScreen sends a small measurement whole", () => {
    const s = { temperatureK: [1, 2], heatCapacity: [1, 2], sigma: null, basis: "molar" as const };
    expect(reduceMeasurementForScreen(s)).toEqual({ series: s, drawn: 2, total: 2 });
  });

  it("reduceMeasurementForScreen keeps each view's column extremes of a 100 000-point curve, including the low-T end of C/T vs T²", () => {
    const next = uniform(11);
    const n = 100_000;
    const temperatureK = Array.from({ length: n }, (_, i) => 0.4 + (i / (n - 1)) * 299.6);
    const heatCapacity = temperatureK.map((t) => (2e-3 * t + 1e-4 * t ** 3) * (1 + (next() - 0.5) * 0.01));
    heatCapacity[120] *= 1.5; // an outlier at T ≈ 0.76 K, visible only in the T ≤ 3 K view of C/T vs T²
    const s = { temperatureK, heatCapacity, sigma: null, sourceLines: temperatureK.map((_, i) => i + 2), basis: "molar" as const };
    const r = reduceMeasurementForScreen(s, { bins: 500 });
    expect(r.total).toBe(n);
    expect(r.drawn).toBeLessThan(n / 5);
    expect(r.series.temperatureK).toHaveLength(r.drawn);
    expect(r.series.sourceLines).toContain(122);
    const low = r.series.temperatureK.filter((t) => t <= 3).length;
    expect(low).toBeGreaterThan(500);
  });
});

describe("overlayPlot", () => {
  it("overlayPlot colours each measurement, names the axes with units and refuses mixed bases", async () => {
    const { overlayPlot } = await import("../../lib/charts/overlay");
    const mk = (label: string, f: number) => ({ label, basis: "molar" as const, temperatureK: [1, 2, 3], heatCapacity: [1, 2, 3].map((t) => f * (1e-3 * t + 1e-5 * t ** 3)) });
    const o = overlayPlot([mk("0 T", 1), mk("2 T", 1.1)], { view: "ct-vs-t2", width: 500 });
    expect((o.y as { label: string }).label).toBe("C/T (mJ mol⁻¹ K⁻²)");
    expect((o.x as { label: string }).label).toBe("T² (K²)");
    expect((o.color as { domain: string[] }).domain).toEqual(["0 T", "2 T"]);
    expect(() => overlayPlot([mk("a", 1), { ...mk("b", 1), basis: "sample" as const }], { view: "c-vs-t" })).toThrow(/same basis/);
  });
});

describe("reduceSeriesForView", () => {
  it("reduceSeriesForView keeps at most 4 points per pixel column of the view, with the view's extremes and ends", async () => {
    const { reduceSeriesForView } = await import("../../lib/charts/reduce");
    const n = 100_000;
    const t = Array.from({ length: n }, (_, i) => 0.5 + (20 * i) / (n - 1));
    const c = t.map((x, i) => 1e-3 * x + 5e-5 * x ** 3 + (i === 41_234 ? 5 : 0)); // one spike
    const s = { temperatureK: t, heatCapacity: c, sigma: null };
    const r = reduceSeriesForView(s, { x: (x) => x, y: (_, y) => y, bins: 600 });
    expect(r.temperatureK.length).toBeLessThanOrEqual(2400);
    expect(r.temperatureK[0]).toBe(t[0]);
    expect(r.temperatureK.at(-1)).toBe(t.at(-1));
    expect(Math.max(...r.heatCapacity)).toBe(Math.max(...c));
    const low = reduceSeriesForView(s, { x: (x) => x * x, y: (x, y) => y / x, bins: 300, keep: (x) => x <= 5 });
    expect(Math.max(...low.temperatureK)).toBeLessThanOrEqual(5);
    expect(low.temperatureK.length).toBeLessThanOrEqual(1200);
    expect(reduceSeriesForView({ temperatureK: [1, 2], heatCapacity: [1, 2], sigma: null }, { x: (x) => x, y: (_, y) => y, bins: 10 }).temperatureK).toEqual([1, 2]);
  });
});
