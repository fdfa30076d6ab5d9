/**
 * The series table as a LaTeX `tabular` for a manuscript: one row per sample, value(σ) columns
 * by the one display rule (lib/display), units in the column heads in siunitx-free plain LaTeX,
 * chemical formulas with subscripts, people's text escaped. Rows from revisions not yet
 * reviewed are marked with a dagger and explained under the table.
 */
import { formatValue, formatNumber } from "../../display";
import type { SeriesView } from "./view";
import type { Valued } from "./extract";

const COLUMNS = [
  { key: "gamma", head: "$\\gamma$ (mJ\\,mol$^{-1}$\\,K$^{-2}$)" },
  { key: "beta", head: "$\\beta$ (mJ\\,mol$^{-1}$\\,K$^{-4}$)" },
  { key: "thetaD", head: "$\\Theta_\\mathrm{D}$ (K)" },
  { key: "dosEF", head: "$D(E_\\mathrm{F})$ (states\\,eV$^{-1}$\\,f.u.$^{-1}$)" },
  { key: "massRatio", head: "$m^*/m$" },
  { key: "tc", head: "$T_\\mathrm{c}$ (K)" },
] as const;

const SPECIAL: Record<string, string> = { "\\": "\\textbackslash{}", "&": "\\&", "%": "\\%", $: "\\$", "#": "\\#", _: "\\_", "{": "\\{", "}": "\\}", "~": "\\textasciitilde{}", "^": "\\textasciicircum{}" };

/** People's text made safe for LaTeX (every special character escaped). */
export function latexText(s: string): string {
  return s.replace(/[\\&%$#_{}~^]/g, (c) => SPECIAL[c]!);
}

/** "Nb3Sn" → "Nb$_{3}$Sn" (digits after an element symbol or a closing bracket are subscripts). */
export function latexFormula(formula: string): string {
  return latexText(formula).replace(/([A-Za-z)\]])(\d+(?:\.\d+)?)/g, "$1$_{$2}$");
}

/** A display number ("1.2(3) × 10⁻⁵", "−4.2") as LaTeX math-safe text. */
export function latexNumber(text: string): string {
  const sup: Record<string, string> = { "⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7", "⁸": "8", "⁹": "9", "⁻": "-" };
  return text
    .replace(/ × 10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)/, (_, e: string) => `$\\times 10^{${[...e].map((c) => sup[c]).join("")}}$`)
    .replace(/^−/, "$-$")
    .replace(/^—$/, "--");
}

/** LaTeX source of the series table (a tabular with a header comment naming the series). */
export function seriesLatex(view: SeriesView, when: Date = new Date()): string {
  const axisHead = view.axis === "x" ? `$${latexText(view.series.compositionVariable)}$` : "$e/a$";
  const cell = (v: Valued | null) => (v ? latexNumber(formatValue(v.value, v.stdError, 4)) : "--");
  const anyDraft = view.rows.some((r) => r.draft);
  const lines = [
    `% Series "${view.series.name.replace(/[\r\n]+/g, " ")}" from Heatbook, ${when.toISOString().slice(0, 16).replace("T", " ")} UTC.`,
    "% Values per mole formula unit; value(sigma): one standard error in the last digits.",
    `\\begin{tabular}{ll r ${COLUMNS.map(() => "r").join(" ")}}`,
    "\\hline",
    `Sample & Formula & ${axisHead} & ${COLUMNS.map((c) => c.head).join(" & ")} \\\\`,
    "\\hline",
    ...view.rows.map((r) => {
      const axis = r.axisValue === null ? "--" : latexNumber(formatNumber(r.axisValue, 4));
      const values = COLUMNS.map((c) => cell(r[c.key] as Valued | null));
      return `${latexText(r.sample.label)}${r.draft ? "$^\\dagger$" : ""} & ${latexFormula(r.sample.formula)} & ${axis} & ${values.join(" & ")} \\\\`;
    }),
    "\\hline",
    "\\end{tabular}",
    ...(anyDraft ? ["% $^\\dagger$ from a revision not yet reviewed and sealed."] : []),
  ];
  return lines.join("\n") + "\n";
}
