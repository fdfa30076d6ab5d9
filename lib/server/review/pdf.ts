/**
 * The report as a PDF (pdfkit): the same sections as the print page, from the same report
 * object, with a C/T vs T² plot of each fit (points, window, model curve). Greek letters and
 * superscripts need a Unicode font: DejaVu Sans (HEATBOOK_PDF_FONT overrides the path) when
 * present, otherwise Helvetica with those characters spelled out (γ → gamma).
 */
import { existsSync } from "node:fs";
import PDFDocument from "pdfkit";
import type { RevisionReport } from "./report";

const FONT_PATHS = ["/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf"];
const SPELLED: Record<string, string> = { "γ": "gamma", "β": "beta", "δ": "delta", "ε": "epsilon", "Θ": "Theta", "θ": "theta", "χ": "chi", "σ": "sigma", "λ": "lambda", "μ": "mu", "ρ": "rho", "Δ": "Delta", "⁻": "-", "¹": "1", "²": "^2", "³": "^3", "⁴": "^4", "→": "->", "≈": "~", "·": "*", "−": "-", "…": "..." };

function pickFont(): string | null {
  const p = process.env.HEATBOOK_PDF_FONT ?? FONT_PATHS.find((f) => existsSync(f));
  return p && existsSync(p) ? p : null;
}

function plotFit(doc: PDFDocument, fit: RevisionReport["fits"][number], x0: number, y0: number, w: number, h: number): void {
  const pts = fit.plot.points as { temperatureK: number[]; heatCapacity: number[]; inWindow: boolean[] } | null;
  const curve = fit.plot.curve as { temperatureK: number[]; heatCapacity: number[] } | null;
  if (!pts?.temperatureK?.length) return;
  const xs = pts.temperatureK.map((t) => t * t), ys = pts.heatCapacity.map((c, i) => c / pts.temperatureK[i]!);
  const cx = curve ? curve.temperatureK.map((t) => t * t) : [], cy = curve ? curve.heatCapacity.map((c, i) => c / curve.temperatureK[i]!) : [];
  const [xmin, xmax] = [Math.min(...xs, ...cx), Math.max(...xs, ...cx)], [ymin, ymax] = [Math.min(...ys, ...cy), Math.max(...ys, ...cy)];
  const X = (v: number) => x0 + ((v - xmin) / (xmax - xmin || 1)) * w, Y = (v: number) => y0 + h - ((v - ymin) / (ymax - ymin || 1)) * h;
  doc.lineWidth(0.5).strokeColor("#444").rect(x0, y0, w, h).stroke();
  xs.forEach((x, i) => doc.circle(X(x), Y(ys[i]!), 1.6).fill(pts.inWindow[i] ? "#1f5fa8" : "#b0b0b0"));
  if (cx.length) {
    doc.moveTo(X(cx[0]!), Y(cy[0]!));
    cx.forEach((x, i) => doc.lineTo(X(x), Y(cy[i]!)));
    doc.lineWidth(1).strokeColor("#c0392b").stroke();
  }
  doc.fillColor("#000").fontSize(8).text(`C/T [J mol⁻¹ K⁻²]  ${ymin.toPrecision(3)} … ${ymax.toPrecision(3)}   vs   T² [K²]  ${xmin.toPrecision(3)} … ${xmax.toPrecision(3)}`, x0, y0 + h + 4, { width: w });
}

/** ISO time → "2026-12-04 14:52 UTC". */
function stamp(iso: string | null): string {
  return iso ? `${iso.slice(0, 16).replace("T", " ")} UTC` : "—";
}

/** Render the report to PDF bytes. */
export async function renderReportPdf(report: RevisionReport): Promise<Uint8Array> {
  const font = pickFont();
  const doc = new PDFDocument({ size: "A4", margin: 50, info: { Title: `${report.title}, revision ${report.revision.number}`, Subject: `content hash ${report.contentHash}` } });
  if (font) doc.registerFont("body", font).font("body");
  const t = (s: string) => (font ? s : s.replace(/[^\x00-\xff]/g, (c) => SPELLED[c] ?? "?"));
  const chunks: Uint8Array[] = [];
  const done = new Promise<void>((resolve, reject) => { doc.on("data", (c) => chunks.push(c)); doc.on("end", () => resolve()); doc.on("error", reject); });
  const h = (s: string) => doc.moveDown(0.6).fontSize(12).text(t(s)).fontSize(9.5);
  const line = (s: string) => doc.text(t(s));
  doc.fontSize(16).text(t(report.title));
  doc.fontSize(9.5).text(t(`${report.group.name} · revision ${report.revision.number} (${report.revision.state === "sealed" ? "sealed" : "sealed, since replaced by a newer revision"}) · engine ${report.engineVersion}`));
  line(`content hash (SHA-256 of the canonical snapshot): ${report.contentHash}`);
  h("Sample");
  const s = report.sample;
  line(`${s.label}: ${s.formula}, M = ${s.molarMassGPerMol} g/mol, ${s.atomsPerFormulaUnit} atoms per formula unit${s.massMg !== null ? `, mass ${s.massMg} mg` : ""}${s.densityGPerCm3 !== null ? `, density ${s.densityGPerCm3} g/cm³` : ""}`);
  const c = report.context;
  if (c.pinned === "full") line(`composition as sealed: ${c.compositionValue === null ? "none recorded" : `${c.compositionVariable ?? "x"} = ${c.compositionValue}`}${c.series.length ? `; series ${c.series.map((x) => `${x.name} (variable ${x.compositionVariable})`).join(", ")}` : ""}`);
  if (c.note) line(c.note);
  if (c.changedSinceSealing.length) line(`sample record changed since sealing (the values above are as sealed): ${c.changedSinceSealing.join("; ")}`);
  h("Data provenance");
  for (const p of report.provenance) line(`${p.label} (${p.kind}, ${p.fieldT} T): ${p.fileName}, ${p.sizeBytes} bytes, ${p.pointCount} points, ${p.tMinK}–${p.tMaxK} K; SHA-256 ${p.sha256}`);
  h("Corrections");
  for (const c of report.corrections) line(`${c.position + 1}. ${c.summary}`);
  for (const f of report.fits) {
    h(`Fit (step ${f.position + 1}): model ${f.model}, ${f.tMinK}–${f.tMaxK} K, ${f.nPoints} points, ${f.weighted ? "weighted by σ" : "unweighted"}${f.reducedChiSquare !== null ? `, χ²_red = ${f.reducedChiSquare.toPrecision(4)}` : ""}`);
    for (const p of f.parameters) line(`${p.symbol} = ${p.compact}`);
    if (doc.y + 190 > doc.page.height - doc.page.margins.bottom) doc.addPage();
    const y = doc.y + 6;
    plotFit(doc, f, doc.page.margins.left, y, 300, 160);
    doc.x = doc.page.margins.left;
    doc.moveDown(1);
  }
  if (report.derived.length) {
    h("Derived quantities");
    for (const q of report.derived) line(`${q.symbol} = ${q.compact}${q.note ? ` — ${q.note}` : ""}`);
  }
  if (report.warnings.length) { h("Warnings"); for (const w of report.warnings) line(`• ${w}`); }
  if (report.notes.length) { h("Notes"); for (const n of report.notes) line(n); }
  h("Review");
  line(`submitted by ${report.review.submittedBy ?? "—"} at ${stamp(report.review.submittedAt)}; approved and sealed by ${report.review.sealedBy ?? "—"} at ${stamp(report.review.sealedAt)}`);
  const sig = report.signature;
  if (sig) {
    h("Signature");
    line(`${sig.signerName} (${sig.signerEmail}), ${sig.signerRole} of the group, signed on ${stamp(sig.signedAt)}, identity checked by ${sig.method === "password" ? "password" : "a fresh institutional sign-in"}:`);
    line(`“${sig.statement}”`);
    line(`Note: ${sig.note}`);
    if (sig.acknowledgedThreads.length) line(`Open discussion threads acknowledged: ${sig.acknowledgedThreads.map((x) => `${x.openedBy}: “${x.excerpt}”`).join("; ")}`);
  } else line("Sealed before approvals were signed: no statement of meaning or note was recorded.");
  for (const d of report.review.decisions) line(`${stamp(d.at)}: ${d.decision} by ${d.reviewer ?? "—"}${d.comment ? ` — ${d.comment}` : ""}`);
  doc.moveDown(1).fontSize(10).text(t(report.safetyNote));
  doc.end();
  await done;
  const out = new Uint8Array(chunks.reduce((n, c) => n + c.length, 0));
  let k = 0;
  for (const c of chunks) { out.set(c, k); k += c.length; }
  return out;
}
