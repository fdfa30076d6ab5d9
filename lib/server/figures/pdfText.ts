/**
 * Paragraphs of typeset text in pdfkit: runs of base, subscript and superscript text (from
 * lib/display/typeset.ts) laid out word by word with wrapping, subscripts on a lowered baseline
 * at 72 % size, superscripts raised. Symbol markup is parsed only where the caller asks (`sym`);
 * people's text (names, file names, notes) goes in as plain runs and is never reinterpreted.
 */
import type PDFDocument from "pdfkit";
import { runs as markupRuns, type Run } from "../../display/typeset";

export type Piece = Run & { bold?: boolean };

/** Plain text as one run (underscores kept as written). */
export const txt = (text: string, bold = false): Piece[] => [{ text, shift: "base", bold }];
/** Symbol markup ("Θ_D") as runs. */
export const sym = (markup: string, bold = false): Piece[] => markupRuns(markup).map((r) => ({ ...r, bold }));

const SCALE = 0.72;

/**
 * Write `pieces` as a paragraph at the current position (doc.x, doc.y) within `width` (default
 * the page's text width), `size` pt; leaves doc.y under the last line.
 */
export function paragraph(doc: PDFDocument, pieces: Piece[], opts: { size?: number; width?: number; indent?: number; gapAfter?: number; color?: string } = {}): void {
  const size = opts.size ?? 9.5;
  const left = doc.page.margins.left + (opts.indent ?? 0);
  const right = left + (opts.width ?? doc.page.width - doc.page.margins.left - doc.page.margins.right - (opts.indent ?? 0));
  const lineHeight = size * 1.35;
  // Words: split base and shifted runs at spaces, keeping the spaces with the word before.
  const words: Piece[][] = [[]];
  for (const p of pieces) {
    const parts = p.text.split(/(?<= )/);
    parts.forEach((part, k) => {
      if (k > 0) words.push([]);
      words[words.length - 1]!.push({ ...p, text: part });
    });
  }
  const measure = (p: Piece) => {
    doc.font(p.bold ? "bold" : "body").fontSize(p.shift === "base" ? size : size * SCALE);
    return doc.widthOfString(p.text);
  };
  let y = doc.y, x = left;
  const newLine = () => {
    x = left;
    y += lineHeight;
    if (y + lineHeight > doc.page.height - doc.page.margins.bottom) { doc.addPage(); y = doc.page.margins.top; }
  };
  if (y + lineHeight > doc.page.height - doc.page.margins.bottom) { doc.addPage(); y = doc.page.margins.top; }
  doc.fillColor(opts.color ?? "#000000");
  for (const word of words) {
    const w = word.reduce((s, p) => s + measure(p), 0);
    const trailing = word.length ? / $/.test(word[word.length - 1]!.text) : false;
    const wNoSpace = trailing ? w - measure({ ...word[word.length - 1]!, text: " " }) : w;
    if (x > left && x + wNoSpace > right) newLine();
    for (const p of word) {
      const pw = measure(p);
      const base = y + size; // alphabetic baseline of the line
      const shiftY = p.shift === "sub" ? size * 0.22 : p.shift === "sup" ? -size * 0.38 : 0;
      if (p.text) doc.text(p.text, x, base + shiftY, { lineBreak: false, baseline: "alphabetic" });
      x += pw;
    }
  }
  doc.x = left - (opts.indent ?? 0);
  doc.y = y + lineHeight + (opts.gapAfter ?? 1.5);
  doc.font("body").fontSize(size);
}
