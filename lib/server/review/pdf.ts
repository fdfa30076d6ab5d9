/**
 * The report as a PDF (pdfkit), from the same report object as the print page: the same
 * sections, the same numbers by the one display rule (lib/display), symbols with real sub- and
 * superscripts, and the same figures drawn as vectors (axes, ticks, units, ±σ bars, the fit
 * window shaded, the model line, residuals; the window scan). Text is text in the embedded
 * DejaVu Sans (lib/server/figures/fonts.ts), so it can be searched and copied.
 */
import PDFDocument from "pdfkit";
import type { RevisionReport } from "./report";
import { formatBytes, reportSentences } from "./reportText";
import { drawSvg, pdfBytes, registerFonts } from "../figures/svgPdf";
import { figureSvg, reportFigures } from "../figures/reportFigures";
import { paragraph, sym, txt, type Piece } from "../figures/pdfText";
import { formatTime } from "../../display";

const FIGURE_FONT = 8;


/** Render the report to PDF bytes. */
export async function renderReportPdf(report: RevisionReport): Promise<Uint8Array> {
  const doc = new PDFDocument({
    size: "A4", margins: { top: 56, bottom: 56, left: 56, right: 56 }, lang: "en-GB", displayTitle: true,
    info: { Title: `${report.title}, revision ${report.revision.number}`, Subject: `Specific-heat analysis report; content hash ${report.contentHash}`, Creator: "Heatbook" },
  });
  registerFonts(doc);
  doc.font("body");
  const textWidth = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const s = reportSentences(report);
  const heading = (t: string | Piece[]) => { doc.y += 6; paragraph(doc, typeof t === "string" ? txt(t, true) : t, { size: 12, gapAfter: 2 }); };
  const para = (p: Piece[], size = 9.5) => paragraph(doc, p, { size });
  const row = (label: Piece[], value: Piece[], note?: string) => {
    paragraph(doc, [...label, ...txt("  =  "), ...value, ...(note ? txt(`   (${note})`) : [])], { size: 9.5, indent: 12 });
  };

  paragraph(doc, txt(report.title, true), { size: 17, gapAfter: 3 });
  para(txt(s.subtitle), 9.5);
  para(txt(report.safetyNote, true), 9.5);

  heading("Sample");
  para(txt(s.sample));
  const c = report.context;
  if (c?.pinned === "full" && c.compositionValue !== null) para(txt(`Composition as sealed: ${c.compositionVariable ?? "x"} = ${c.compositionValue}${c.series.length ? `; series ${c.series.map((x) => x.name).join(", ")}` : ""}.`));
  if (c?.note) para(txt(`${c.note.charAt(0).toUpperCase()}${c.note.slice(1)}.`));
  if (c && c.changedSinceSealing.length) para(txt(`Sample record changed since sealing (the values above are as sealed): ${c.changedSinceSealing.join("; ")}.`));

  heading("Data provenance");
  for (const p of report.provenance)
    para(txt(`${p.label} (${p.kind === "addenda" ? "addenda" : "sample"} measurement, ${s.field(p.fieldT)}): ${p.fileName}, ${formatBytes(p.sizeBytes)}, ${s.points(p.pointCount)}, ${s.range(p.tMinK, p.tMaxK)}; SHA-256 ${p.sha256}`));

  heading("Corrections and data selection");
  if (!report.corrections.length) para(txt("None."));
  for (const c of report.corrections) para(txt(`Step ${c.position + 1}: ${c.summary}.`));

  const figures = reportFigures(report, { widthPt: textWidth, fontSize: FIGURE_FONT });
  for (const f of report.fits) {
    heading([...txt(`Fit (step ${f.position + 1}): `, true), ...sym(f.modelLabel, true)]);
    para(s.fitLine(f).flatMap((x) => (typeof x === "string" ? txt(x) : sym(x.sym))));
    for (const p of f.parameters) row(sym(p.symbol), txt(p.compact), p.label);
    for (const fig of figures.filter((g) => g.position === f.position)) {
      const svg = figureSvg(fig, FIGURE_FONT);
      const [w, h] = [Number(/width="([\d.]+)"/.exec(svg)![1]), Number(/height="([\d.]+)"/.exec(svg)![1])];
      const height = (h / w) * textWidth;
      if (doc.y + height + 40 > doc.page.height - doc.page.margins.bottom) doc.addPage();
      const y = doc.y + 4;
      drawSvg(doc, svg, doc.page.margins.left, y, textWidth);
      doc.y = y + height + 4;
      paragraph(doc, sym(fig.caption), { size: 8, color: "#333333", gapAfter: 6 });
    }
  }

  for (const x of report.stepResults ?? []) {
    heading(sym(`${x.heading} (step ${x.position + 1})`, true));
    para(sym(x.summary));
    for (const p of x.values) row(sym(p.symbol), txt(p.compact), p.label);
  }

  heading("Derived quantities");
  if (!report.derived.length) para(txt("No derived-quantities step."));
  for (const q of report.derived) paragraph(doc, [...sym(q.symbol), ...txt(`  =  ${q.compact}   (${q.label}`), ...(q.note ? [...txt("; "), ...sym(q.note)] : []), ...txt(")")], { size: 9.5, indent: 12 });

  // Warnings and derived-quantity notes are the engine's sentences: their symbols are typeset.
  if (report.warnings.length) { heading("Warnings at sealing"); for (const w of report.warnings) para([...txt("• "), ...sym(w)]); }
  if (report.notes.length) { heading("Notes"); for (const n of report.notes) para(txt(n)); }

  heading("Review and seal");
  for (const line of s.review) para(txt(line));
  const sig = report.signature;
  if (sig) {
    para(txt(`Signature: ${sig.signerName} (${sig.signerEmail}), ${sig.signerRole} of the group, ${formatTime(sig.signedAt)}; identity checked by ${sig.method === "password" ? "password" : "a fresh institutional sign-in"}.`));
    para(txt(`“${sig.statement}”`));
    para(txt(`Reviewer's note: ${sig.note}`));
    if (sig.acknowledgedThreads.length) para(txt(`Open discussion threads acknowledged: ${sig.acknowledgedThreads.map((x) => `${x.openedBy}: “${x.excerpt}”`).join("; ")}`));
  } else para(txt("Sealed before approvals were signed: no statement of meaning or note was recorded."));
  para(txt(`Content hash (SHA-256 of the sealed snapshot): ${report.contentHash}`));
  para(txt(`Engine version ${report.engineVersion}. Report written ${formatTime(new Date())}.`));
  return pdfBytes(doc);
}
