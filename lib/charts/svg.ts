/**
 * Charts as standalone SVG text, drawn without a browser (linkedom supplies `document`), for the
 * report, the PDF and figure exports. Pointer tips are dropped (paper has no pointer), legends
 * that Plot draws as separate SVGs are stacked above the chart in one SVG, and symbol markup in
 * labels ("Θ_D", "T_max", "χ²_red") becomes real sub-/superscripts (<tspan> with a shifted
 * baseline). Pure: no I/O.
 */
import * as Plot from "@observablehq/plot";
import type { PlotOptions } from "@observablehq/plot";
import { parseHTML } from "linkedom";
import { typesetSvgText } from "./typesetSvg";

export { typesetSvgText };

const SVG_NS = "http://www.w3.org/2000/svg";

export interface SvgOptions {
  /** Font family written on the root element (the PDF maps it to an embedded font). */
  fontFamily?: string;
  /** Font size in px for all chart text (Plot's default 10). */
  fontSize?: number;
  /** Background colour; none when omitted. */
  background?: string;
}

function isTip(mark: unknown): boolean {
  return (mark as { ariaLabel?: string } | null)?.ariaLabel === "tip";
}

/** The SVG elements of one chart (legends first), drawn with linkedom. */
function drawParts(options: PlotOptions, doc: Document, style: Record<string, string>): Element[] {
  const el = Plot.plot({ ...options, style: { ...(typeof options.style === "object" ? options.style : {}), ...style }, marks: (options.marks ?? []).filter((m) => !isTip(m)), document: doc }) as unknown as Element;
  return el.tagName.toLowerCase() === "svg" ? [el] : [...el.querySelectorAll("svg")];
}

/**
 * One standalone SVG document (xmlns, width/height/viewBox) of one chart or of several stacked
 * top to bottom (a fit above its residuals). Legends Plot draws as separate SVGs (a colour
 * ramp) are placed above their chart.
 */
export function chartSvg(options: PlotOptions | readonly PlotOptions[], opts: SvgOptions = {}): string {
  const { document } = parseHTML("<!doctype html><html><body></body></html>");
  const doc = document as unknown as Document;
  const family = opts.fontFamily ?? "DejaVu Sans, sans-serif", size = opts.fontSize ?? 10;
  const list = Array.isArray(options) ? options : [options as PlotOptions];
  const parts = list.flatMap((o) => drawParts(o, doc, { fontFamily: family, fontSize: `${size}px`, background: "transparent" }));
  const width = Math.max(...parts.map((p) => Number(p.getAttribute("width")) || 0));
  const total = parts.reduce((a, p) => a + (Number(p.getAttribute("height")) || 0), 0);
  const root = doc.createElementNS(SVG_NS, "svg");
  const attrs: Record<string, string> = { xmlns: SVG_NS, width: String(width), height: String(total), viewBox: `0 0 ${width} ${total}`, "font-family": family, "font-size": String(size), fill: "currentColor", color: "#1e2431" };
  const label = list.map((o) => o.ariaLabel).filter(Boolean).join("; ");
  if (label) attrs["aria-label"] = label;
  for (const [k, v] of Object.entries(attrs)) root.setAttribute(k, v);
  if (opts.background) {
    const bg = doc.createElementNS(SVG_NS, "rect");
    for (const [k, v] of Object.entries({ x: "0", y: "0", width: String(width), height: String(total), fill: opts.background })) bg.setAttribute(k, v);
    root.append(bg);
  }
  let y = 0;
  for (const p of parts) {
    const h = Number(p.getAttribute("height")) || 0;
    p.setAttribute("x", "0");
    p.setAttribute("y", String(y));
    // The root sets the font for every panel (Plot writes its own defaults on each SVG).
    for (const a of ["class", "style", "font-family", "font-size"]) p.removeAttribute(a);
    root.append(p);
    y += h;
  }
  for (const s of [...root.querySelectorAll("style")]) s.remove();
  // A white halo behind labels (stroke painted first) needs paint-order, which PDF conversion
  // ignores — it would paint the halo over the text. Paper needs no halo.
  for (const e of [...root.querySelectorAll('[paint-order="stroke"]')]) for (const a of ["paint-order", "stroke", "stroke-width", "stroke-linejoin"]) e.removeAttribute(a);
  typesetSvgText(root, doc);
  return root.outerHTML;
}
