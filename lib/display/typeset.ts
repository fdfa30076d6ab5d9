/**
 * Symbols as the trade writes them. Symbols are kept as light markup — "Θ_D", "χ²_red",
 * "r_s/a_0", "ΔC/(γ_n T_c)", "H_{c2}" — and typeset here into runs of base, subscript and
 * superscript text, which the renderers turn into HTML (<sub>/<sup>), SVG (<tspan>), PDF text
 * with a shifted baseline, or plain Unicode where no markup is possible.
 *
 * Markup: `_x…` / `^x…` shifts the following run of letters and digits (a leading minus for
 * superscripts); `_{…}` / `^{…}` shifts the braced text. Nothing else is special.
 */

export type Shift = "base" | "sub" | "sup";
export interface Run { readonly text: string; readonly shift: Shift }

const WORD = /^[\p{L}\p{N}]+/u;
const SUP_WORD = /^-?[\p{L}\p{N}.]+/u;

/** Runs of "Θ_D" → [{Θ, base}, {D, sub}]. Adjacent runs of one shift are merged. */
export function runs(markup: string): Run[] {
  const out: Run[] = [];
  const push = (text: string, shift: Shift) => {
    if (!text) return;
    const last = out[out.length - 1];
    if (last && last.shift === shift) out[out.length - 1] = { text: last.text + text, shift };
    else out.push({ text, shift });
  };
  let i = 0;
  while (i < markup.length) {
    const c = markup[i]!;
    if (c === "_" || c === "^") {
      const shift: Shift = c === "_" ? "sub" : "sup";
      const rest = markup.slice(i + 1);
      if (rest.startsWith("{")) {
        const end = rest.indexOf("}");
        if (end > 0) { push(rest.slice(1, end), shift); i += end + 2; continue; }
      }
      const m = (shift === "sup" ? SUP_WORD : WORD).exec(rest);
      if (m) { push(m[0], shift); i += 1 + m[0].length; continue; }
    }
    push(c, "base");
    i += 1;
  }
  return out;
}

const SUB: Record<string, string> = { "0": "₀", "1": "₁", "2": "₂", "3": "₃", "4": "₄", "5": "₅", "6": "₆", "7": "₇", "8": "₈", "9": "₉", "+": "₊", "-": "₋", "=": "₌", "(": "₍", ")": "₎", a: "ₐ", e: "ₑ", o: "ₒ", x: "ₓ", h: "ₕ", k: "ₖ", l: "ₗ", m: "ₘ", n: "ₙ", p: "ₚ", s: "ₛ", t: "ₜ" };
const SUPER: Record<string, string> = { "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "+": "⁺", "-": "⁻", "−": "⁻", "=": "⁼", "(": "⁽", ")": "⁾", n: "ⁿ", i: "ⁱ", ".": "·" };

/** Unicode super-/subscript of `text` when every character has one, else null. */
export function unicodeShift(text: string, shift: "sub" | "sup"): string | null {
  const table = shift === "sub" ? SUB : SUPER;
  let out = "";
  for (const c of text) {
    const m = table[c];
    if (m === undefined) return null;
    out += m;
  }
  return out;
}

/**
 * Plain Unicode text of a symbol, for places that cannot hold markup (option labels, file
 * names, tooltips): Unicode sub-/superscripts where they exist ("r_s/a_0" → "rₛ/a₀"), otherwise
 * the shifted letters written on the line ("Θ_D" → "ΘD", "T_c" → "Tc"). Never an underscore.
 */
export function plainSymbol(markup: string): string {
  return runs(markup).map((r) => (r.shift === "base" ? r.text : unicodeShift(r.text, r.shift) ?? r.text)).join("");
}

const ESC: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };
export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ESC[c]!);

/** HTML of a symbol with <sub>/<sup> (text escaped). */
export function htmlSymbol(markup: string): string {
  return runs(markup).map((r) => (r.shift === "base" ? escapeHtml(r.text) : `<${r.shift}>${escapeHtml(r.text)}</${r.shift}>`)).join("");
}

/** True when the text holds sub-/superscript markup that `runs` would shift. */
export function hasMarkup(text: string): boolean {
  return runs(text).some((r) => r.shift !== "base");
}
