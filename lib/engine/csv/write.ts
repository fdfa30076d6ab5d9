/**
 * A CSV writer that is safe to open in a spreadsheet program (RFC 4180 quoting, CRLF lines).
 *
 * Formula injection: a text cell whose first character is = + - @, a tab or a carriage return
 * is run as a formula by common spreadsheet programs; such cells get a leading apostrophe
 * (the neutralisation recommended by OWASP, "CSV Injection"). Numbers are never altered:
 * they are written with the shortest text that reads back as the same double
 * (ECMAScript Number::toString), so a negative number stays a number.
 * Non-finite numbers and null become empty cells. Units belong in the header: `{ name, unit }`
 * is written as "name (unit)".
 */
import { invalid } from "../errors";

export type CsvCell = string | number | boolean | null | undefined;

export interface CsvColumn {
  /** Column name, e.g. "gamma". */
  readonly name: string;
  /** Unit written into the header, e.g. "mJ mol^-1 K^-2"; omit for dimensionless or text columns. */
  readonly unit?: string;
}

export interface CsvOptions {
  /** Cell separator; default ",". */
  readonly separator?: "," | ";" | "\t";
}

const DANGEROUS_FIRST = new Set(["=", "+", "-", "@", "\t", "\r"]);

/** Prefix an apostrophe when a text cell would start a spreadsheet formula. */
export function neutraliseCell(text: string): string {
  return text.length > 0 && DANGEROUS_FIRST.has(text[0]!) ? `'${text}` : text;
}

/**
 * One number as text: shortest round-trip representation (String(x) for finite doubles);
 * "" for NaN and ±Infinity. `Number(formatNumber(x)) === x` for every finite x.
 */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return "";
  return Object.is(x, -0) ? "0" : String(x);
}

function quote(text: string, separator: string): string {
  return text.includes(separator) || /["\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Encode one cell: numbers exact, text neutralised and quoted where needed. */
export function encodeCell(cell: CsvCell, separator = ","): string {
  if (cell === null || cell === undefined) return "";
  if (typeof cell === "number") return formatNumber(cell);
  if (typeof cell === "boolean") return cell ? "true" : "false";
  return quote(neutraliseCell(cell), separator);
}

/** "name (unit)" or "name". */
export function headerText(column: CsvColumn): string {
  return column.unit ? `${column.name} (${column.unit})` : column.name;
}

/**
 * The whole document: a header line from `columns`, then one line per row, CRLF line ends.
 * Throws InputError when a row's length differs from the number of columns (naming the row).
 */
export function writeCsv(columns: readonly CsvColumn[], rows: readonly (readonly CsvCell[])[], options: CsvOptions = {}): string {
  const sep = options.separator ?? ",";
  if (columns.length === 0) throw invalid("columns", 0, "a CSV needs at least one column");
  const lines = [columns.map((c) => encodeCell(headerText(c), sep)).join(sep)];
  rows.forEach((row, i) => {
    if (row.length !== columns.length) throw invalid("row", row.length, `row ${i + 1} has ${row.length} cells, the header has ${columns.length}`, { field: "rows", line: i + 2 });
    lines.push(row.map((c) => encodeCell(c, sep)).join(sep));
  });
  return lines.join("\r\n") + "\r\n";
}
