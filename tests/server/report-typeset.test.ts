/**
 * The report of a sealed analysis as a reader gets it — the HTML (ReportView rendered to static
 * markup) and the PDF (text extracted with pdf.js) — reads as typeset physics: axis titles with
 * units, superscript units (no carets), no internal key from the engine's own names, no number
 * with more than 15 significant digits, no e-notation, one time format, the review line once,
 * provenance that says what was done. Invented data (tests/server/reviewFixtures.ts).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { renderToStaticMarkup } from "react-dom/server";
import { createElement } from "react";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { SIGN } from "./fixtures";
import { buildReport, renderReportPdf, reviewTransition, type RevisionReport } from "../../lib/server/review";
import { describeCorrection } from "../../lib/server/review/report";
import { reportFigures, figureSvg } from "../../lib/server/figures/reportFigures";
import { figurePdf } from "../../lib/server/figures/svgPdf";
import { columnWidthPt } from "../../lib/charts/figures";
import { chartSvg } from "../../lib/charts/svg";
import { ReportView } from "../../app/components/review/ReportView";
import { computeChain } from "../../lib/engine/notebook";
import { syntheticContext } from "../charts/notebookFixture";
import { pdfText } from "../helpers/pdfText";
import { internalKeysIn } from "../helpers/internalKeys";

let t: TestDatabase;
let f: ReviewFixture;
let report: RevisionReport;
let pdf: string;
let html: string;

/** Digits of the longest number in `text` (leading zeros not counted), and the number. */
function longestNumber(text: string): { digits: number; number: string } {
  let best = { digits: 0, number: "" };
  for (const m of text.matchAll(/\d+(?:\.\d+)?/g)) {
    const d = m[0].replace(".", "").replace(/^0+/, "").length;
    if (d > best.digits) best = { digits: d, number: m[0] };
  }
  return best;
}

function readable(s: string): string {
  return s.replace(report.contentHash, "").replace(report.contentHash.replace(/(.{8})(?=.)/g, "$1 "), "").replace(/SHA-256 [0-9a-f]{64}/g, "SHA-256");
}

beforeAll(async () => {
  t = await freshDatabase();
  f = await makeReviewFixture(t.db);
  const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "report typeset");
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: 1 });
  await reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, comment: "window checked", ...SIGN });
  report = await buildReport(t.db, f.members.viewer, r.analysisId);
  pdf = readable((await pdfText(await renderReportPdf(report))).text);
  const figures = reportFigures(report, { widthPt: 640, fontSize: 11 }).map((g) => ({ id: g.id, position: g.position, caption: g.caption, svg: chartSvg(g.options, { fontSize: 11 }), exports: [] }));
  html = renderToStaticMarkup(createElement(ReportView, { r: report, figures, renderNote: (s: string) => s }));
}, 120_000);
afterAll(async () => { await t.drop(); });

const htmlText = () => readable(html.replace(/<sub>/g, "_").replace(/<sup>/g, "^").replace(/<[^>]+>/g, " ").replace(/&amp;/g, "&").replace(/\s+/g, " "));

describe("report PDF text", () => {
  it("renderReportPdf has the figure's axis titles with their units, and the basis in the caption", () => {
    expect(pdf).toContain("C/T (mJ mol⁻¹ K⁻²)");
    expect(pdf).toContain("T² (K²)");
    expect(pdf).toContain("C/T against T² per mole formula unit");
    expect(pdf).toMatch(/γ\s*=\s*1\.3\d*\(\d+\) mJ mol⁻¹ K⁻²/);
    expect(pdf).toContain("Sommerfeld–Debye (γT + βT³)");
  });

  it("renderReportPdf writes no caret unit, no e-notation, no ISO time, no number over 15 significant digits", () => {
    expect(pdf).not.toMatch(/\^-?\d/);
    expect(pdf).not.toMatch(/\d(?:\.\d+)?e[+-]?\d/i);
    expect(pdf).not.toMatch(/\d{4}-\d\d-\d\dT\d\d/);
    expect(longestNumber(pdf).digits).toBeLessThanOrEqual(15);
    expect(pdf).toMatch(/\d{4}-\d\d-\d\d \d\d:\d\d UTC/);
  });

  it("renderReportPdf shows no internal key of the engine or server", () => {
    expect(internalKeysIn(pdf)).toEqual([]);
    expect(pdf).not.toMatch(/ 1 atoms|point\(s\)|`/);
  });

  it("renderReportPdf states the review once and the normalisation that ran (mass used)", () => {
    expect(pdf.match(/approved and sealed by reviewer/g)).toHaveLength(1);
    expect(pdf).toContain("converted per mole formula unit with the sample mass m =");
  });
});

describe("report HTML", () => {
  it("ReportView inlines the fit figure as SVG with axis titles, units and subscripts", () => {
    expect(html).toContain("<svg");
    expect(html).toContain(">C/T (mJ mol⁻¹ K⁻²)</text>");
    expect(html).toContain(">T² (K²)</text>");
    expect(html).toContain("(C − C<sub>fit</sub>)/T"); // the caption's symbols typeset
    expect(html).toContain("Θ<sub>D</sub>");
  });

  it("ReportView shows no internal key, caret, e-notation or long float", () => {
    const text = htmlText();
    expect(internalKeysIn(text)).toEqual([]);
    expect(text).not.toMatch(/\d(?:\.\d+)?e[+-]?\d/i);
    expect(text).not.toMatch(/ \^-?\d/);
    expect(longestNumber(text).digits).toBeLessThanOrEqual(15);
    expect(text.match(/approved and sealed by reviewer/g)).toHaveLength(1);
  });
});

describe("figure export", () => {
  it("figurePdf writes a single-column figure 8.5 cm wide with its axis titles as text", async () => {
    const fig = reportFigures(report, { widthPt: columnWidthPt("single"), fontSize: 8 }).find((g) => g.kind === "fit")!;
    const bytes = await figurePdf(figureSvg(fig, 8), 8.5, "fit");
    const head = new TextDecoder("latin1").decode(bytes);
    const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(head)!;
    expect(Number(box[1])).toBeCloseTo((8.5 / 2.54) * 72, 1);
    expect(head).toMatch(/\/FontFile2/); // TrueType font embedded
    const text = (await pdfText(bytes)).text;
    expect(text).toContain("C/T (mJ mol⁻¹ K⁻²)");
    expect(text).toContain("T² (K²)");
  });
});

describe("describeCorrection", () => {
  it("describeCorrection of a normalise step over data imported per mole says no conversion and names no mass", () => {
    const out = computeChain([{ id: "d", kind: "data", config: { measurementIds: ["m1"] } }, { id: "n", kind: "normalise", config: {} }], syntheticContext());
    const text = describeCorrection("normalise", {}, out[1]!.result as Record<string, unknown>);
    expect(text).toBe("data imported already per mole formula unit: no conversion");
  });
});

