/**
 * Symbol markup in chart text ("Θ_D", "T_max", "χ²_red") as real sub-/superscripts: each text
 * node is replaced by <tspan>s with a shifted baseline (dy in em) and a smaller size. Works on a
 * browser DOM and on linkedom alike; no other import, so client components can use it.
 */
import { runs, hasMarkup } from "../display/typeset";

const SVG_NS = "http://www.w3.org/2000/svg";

type El = Element & { childNodes: NodeListOf<ChildNode> };

/** Typeset every <text> under `root`; pointer tips (drawn later, with people's labels) are not touched. */
export function typesetSvgText(root: Element, doc: Document): void {
  for (const text of [...root.querySelectorAll("text")]) {
    for (const node of [...(text as El).childNodes]) {
      if (node.nodeType === 3 && hasMarkup(node.textContent ?? "")) node.replaceWith(...tspans(node.textContent ?? "", doc));
    }
    for (const span of [...text.querySelectorAll("tspan")]) {
      if (span.children.length === 0 && hasMarkup(span.textContent ?? "")) {
        const parts = tspans(span.textContent ?? "", doc);
        span.textContent = "";
        span.append(...parts);
      }
    }
  }
}

function tspans(markup: string, doc: Document): Element[] {
  let level = 0;
  return runs(markup).map((r) => {
    const t = doc.createElementNS(SVG_NS, "tspan");
    const target = r.shift === "sub" ? 0.3 : r.shift === "sup" ? -0.4 : 0;
    const dy = target - level;
    if (dy !== 0) t.setAttribute("dy", `${Math.round(dy * 100) / 100}em`);
    level = target;
    if (r.shift !== "base") t.setAttribute("font-size", "72%");
    t.textContent = r.text;
    return t;
  });
}

