/**
 * Column names and unit text from header cells. Accepted forms:
 *   "T (K)", "C [mJ/K]", "HC (J/(mol K))"  – unit in a trailing bracket (balanced);
 *   "Cp/µJ K-1", "T/K"                      – ISO 80000 quantity/unit notation;
 *   "Temperature"                           – no unit.
 * "C/T" and "C/T^2" are read as a ratio name, not as C in tesla (a heat-capacity symbol
 * over "T" is the usual C/T axis label).
 */
import { parseNumber, splitCells } from "./cells";
import type { ColumnInfo, Delimiter } from "./types";

const HEAT_CAPACITY_SYMBOL = /^(c|cp|c_p|hc)$/i;

/** Split a header cell into a name and optional unit text. */
export function splitNameAndUnit(cell: string): { name: string; unitText?: string } {
  const text = cell.trim();
  const close = text[text.length - 1];
  if (close === ")" || close === "]") {
    const open = close === ")" ? "(" : "[";
    let depth = 0;
    for (let i = text.length - 1; i >= 0; i--) {
      if (text[i] === close) depth++;
      else if (text[i] === open && --depth === 0) {
        const name = text.slice(0, i).trim();
        const unitText = text.slice(i + 1, -1).trim();
        if (name !== "" && unitText !== "") return { name, unitText };
        break;
      }
    }
  }
  const slash = text.indexOf("/");
  if (slash > 0 && slash < text.length - 1) {
    const name = text.slice(0, slash).trim();
    const unitText = text.slice(slash + 1).trim();
    if (HEAT_CAPACITY_SYMBOL.test(name) && /^T(\^?\d)?$/.test(unitText)) return { name: text };
    if (name !== "" && !/\s/.test(name)) return { name, unitText };
  }
  return { name: text };
}

/** True when no non-empty cell is a number and at least one is non-empty (a header-like row). */
export function isTextRow(cells: readonly string[], decimalComma: boolean): boolean {
  let text = 0;
  for (const c of cells) {
    if (c === "") continue;
    if (!Number.isNaN(parseNumber(c, decimalComma))) return false;
    text++;
  }
  return text > 0;
}

/**
 * Cells of a header line, allowing for whitespace-delimited headers whose names contain
 * spaces: when plain splitting does not give `count` cells, try splitting on runs of two or
 * more blanks, then glue bracketed unit tokens ("T", "(K)") to the name before them.
 */
export function headerCells(line: string, delimiter: Delimiter, count: number): string[] | null {
  const plain = splitCells(line, delimiter);
  const cells = plain.length === count + 1 && plain[count] === "" ? plain.slice(0, count) : plain;
  if (cells.length === count) return cells;
  if (delimiter !== "whitespace") return null;
  const wide = line.trim().split(/\t|\s{2,}/);
  if (wide.length === count) return wide.map((c) => c.trim());
  const glued: string[] = [];
  for (const token of plain) {
    if (glued.length > 0 && /^[([]/.test(token)) glued[glued.length - 1] += " " + token;
    else glued.push(token);
  }
  return glued.length === count ? glued : null;
}

/** ColumnInfo list from name cells and optional unit cells (a separate unit row). */
export function buildColumns(count: number, names: string[] | null, units: string[] | null): ColumnInfo[] {
  const columns: ColumnInfo[] = [];
  for (let index = 0; index < count; index++) {
    const raw = names?.[index] ?? "";
    const { name, unitText } = raw === "" ? { name: `column ${index + 1}`, unitText: undefined } : splitNameAndUnit(raw);
    const cell = units?.[index]?.trim();
    const unitCell = cell && /^[([].*[)\]]$/.test(cell) ? cell.slice(1, -1).trim() : cell;
    const unit = unitCell ? unitCell : unitText;
    columns.push(unit ? { index, name, unitText: unit } : { index, name });
  }
  return columns;
}

const BARE_UNITS = new Set([
  "K", "mK", "T", "mT", "Oe", "kOe", "G", "kG", "J", "mJ", "µJ", "μJ", "uJ", "nJ", "pJ",
  "s", "min", "%", "Ω", "ohm", "V", "A", "W", "mW", "µW", "μW", "nW", "Pa", "mbar", "Torr", "mg", "g",
]);

/**
 * A unit row under a name row: every non-empty cell is bracketed ("[K]"), a compound unit
 * ("J/(mol K)", "µJ K-1") or a common bare unit ("K", "mJ"); not a name with its own bracketed
 * unit ("T (K)") nor a long word ("Temperature"). "T, C" is therefore a name row, not units.
 */
export function looksLikeUnitRow(cells: readonly string[]): boolean {
  let seen = 0;
  for (const c of cells) {
    if (c === "") continue;
    if (c.length > 20 || /^\S+\s+[([]/.test(c) || /[a-z]{5,}/i.test(c)) return false;
    const unitLike = /^[([].*[)\]]$/.test(c) || /[/^·*]|\s\S*\d|-\d/.test(c) || BARE_UNITS.has(c);
    if (!unitLike) return false;
    seen++;
  }
  return seen > 0;
}
