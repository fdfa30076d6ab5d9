/**
 * SVG charts into PDF as vector drawing (svg-to-pdfkit): paths stay paths, text stays text in
 * the embedded DejaVu Sans. `drawSvg` places a chart on a page of a larger document (the
 * report); `figurePdf` writes one chart as a PDF of its own at a journal column width.
 */
import PDFDocument from "pdfkit";
import SVGtoPDF from "svg-to-pdfkit";
import { fontFiles } from "./fonts";

/** Points per centimetre (72 pt per inch). */
export const PT_PER_CM = 72 / 2.54;

/** Register the report fonts on a document under the names "body" and "bold". */
export function registerFonts(doc: PDFDocument): void {
  const f = fontFiles();
  doc.registerFont("body", f.regular);
  doc.registerFont("bold", f.bold);
}

function svgSize(svg: string): { width: number; height: number } {
  const w = /<svg[^>]*\swidth="([\d.]+)"/.exec(svg), h = /<svg[^>]*\sheight="([\d.]+)"/.exec(svg);
  if (!w || !h) throw new Error("chart SVG without width and height");
  return { width: Number(w[1]), height: Number(h[1]) };
}

/**
 * Draw `svg` at (x, y) scaled to `width` points; returns the height used (points). Fonts must
 * have been registered with registerFonts.
 */
export function drawSvg(doc: PDFDocument, svg: string, x: number, y: number, width: number): number {
  const size = svgSize(svg);
  const height = (size.height / size.width) * width;
  SVGtoPDF(doc, svg, x, y, {
    width, height, assumePt: false, preserveAspectRatio: "xMinYMin meet",
    fontCallback: (_family: string, bold: boolean) => (bold ? "bold" : "body"),
    warningCallback: () => undefined,
  });
  return height;
}

/** Collect a finished pdfkit document into bytes. */
export function pdfBytes(doc: PDFDocument): Promise<Uint8Array> {
  const chunks: Uint8Array[] = [];
  return new Promise((resolve, reject) => {
    doc.on("data", (c) => chunks.push(c));
    doc.on("error", reject);
    doc.on("end", () => {
      const out = new Uint8Array(chunks.reduce((n, c) => n + c.length, 0));
      let k = 0;
      for (const c of chunks) { out.set(c, k); k += c.length; }
      resolve(out);
    });
    doc.end();
  });
}

/** One chart as a PDF page exactly `widthCm` wide (height from the chart's aspect ratio). */
export async function figurePdf(svg: string, widthCm: number, title: string): Promise<Uint8Array> {
  const size = svgSize(svg);
  const width = widthCm * PT_PER_CM, height = (size.height / size.width) * width;
  const doc = new PDFDocument({ size: [width, height], margin: 0, info: { Title: title, Creator: "Heatbook" } });
  registerFonts(doc);
  doc.font("body");
  drawSvg(doc, svg, 0, 0, width);
  return pdfBytes(doc);
}
