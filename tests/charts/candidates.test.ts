/**
 * The recommendation's candidates chart, rendered with linkedom from a recommendation computed
 * on invented data (tests/engine/recommend.data.ts).
 */
import { describe, it, expect } from "vitest";
import * as Plot from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { candidatesPlot, candidateRows, type StoredRecommendation } from "@/lib/charts/notebook";
import { recommendFit } from "@/lib/engine/scan";
import { makeData } from "../engine/recommend.data";

function render(options: Plot.PlotOptions): Element {
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  return Plot.plot({ ...options, document: document as unknown as Document }) as unknown as Element;
}
const texts = (el: Element) => [...el.querySelectorAll("text")].map((t) => t.textContent ?? "");

function stored(): StoredRecommendation {
  const rec = recommendFit(makeData({ gamma: 3e-3, thetaDK: 300, extra: { kind: "schottky", n: 2e-4, gapK: 1.5 }, tLoK: 0.5, tHiK: 15, points: 200, relSigma: 0.005 }, 2), { gridSize: 8 });
  return { ...rec, candidates: rec.candidates.map((c) => ({ model: c.model, title: c.title, acceptableCount: c.acceptableCount, cells: c.cells.map((x) => ({ tMinK: x.tMinK, tMaxK: x.tMaxK, nPoints: x.nPoints, gamma: x.gamma, gammaStdError: x.gammaStdError, aicc: x.aicc, acceptable: x.acceptable })) })) };
}

describe("candidatesPlot", () => {
  const rec = stored();
  it("candidatesPlot labels the axes with units and the basis and rings the recommended window", () => {
    const el = render(candidatesPlot(rec, { basis: "formula-unit" }));
    expect(texts(el)).toContain("window upper edge T_max (K)");
    expect(texts(el)).toContain("γ (mJ mol⁻¹ K⁻², per mole formula unit)");
    expect(texts(el).some((t) => /^recommended \d/.test(t))).toBe(true);
  });
  it("candidateRows gives one row per candidate window with a γ, in mJ mol⁻¹ K⁻², and keeps the acceptable flag", () => {
    const rows = candidateRows(rec);
    const cells = rec.candidates.flatMap((c) => c.cells).filter((c) => c.gamma !== null);
    expect(rows.length).toBe(cells.length);
    expect(rows.filter((r) => r.acceptable).length).toBe(cells.filter((c) => c.acceptable).length);
    expect(rows[0]!.gamma).toBeCloseTo(cells[0]!.gamma! * 1e3, 12);
  });
  it("candidatesPlot without a recommendation draws the candidates and no ring", () => {
    const none = { ...rec, recommended: false, gamma: null, window: null };
    const el = render(candidatesPlot(none));
    expect(texts(el).some((t) => t.startsWith("recommended"))).toBe(false);
  });
});
