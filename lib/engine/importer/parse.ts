/**
 * parseDelimited: instrument text export → column-major numeric table with issues.
 */
import { invalid } from "../errors";
import { describeBadCell, parseNumber, splitCells, splitLines } from "./cells";
import { detectFormat, trimTrailingEmpty } from "./detect";
import { buildColumns } from "./header";
import { findLayout, startsWithAny } from "./layout";
import { findAmbiguity } from "./ambiguity";
import { DEFAULT_COMMENT_PREFIXES, MAX_ISSUES } from "./types";
import type { ColumnInfo, Delimiter, ImportIssue, ParseOptions, ParsedTable } from "./types";

const DELIMITERS: readonly (Delimiter | "auto")[] = [",", ";", "\t", "whitespace", "auto"];

/**
 * Parse delimited text (comma, semicolon, tab or whitespace; decimal point or decimal comma)
 * into a column-major table.
 *
 * Detection: delimiter and decimal mark from the first 500 non-comment lines (see detect.ts);
 * the header is the text row directly above the first numeric line with the table's cell count
 * (optionally a name row plus a unit row, or a commented name row); everything above the header
 * is kept verbatim as `preamble`. Units in headers are split off ("T (K)", "C [mJ/K]",
 * "Cp/µJ K-1") as `unitText`, uninterpreted (units.ts interprets them).
 *
 * Data lines: blank and comment lines are skipped; a line with no number at all is skipped with
 * an issue; a bad, empty or NaN cell becomes NaN with an issue naming line, column and column
 * name; a wrong cell count is an issue (missing cells are NaN, extra cells ignored).
 *
 * Ambiguity: with delimiter and decimal mark both on "auto", a file that reads two ways (a
 * header whose cell count differs from the data's — typically a decimal comma inside a
 * comma-delimited file — or two readings with different decimal marks that fit about equally)
 * carries `ambiguity`; the caller must ask, not guess (ambiguity.ts).
 *
 * Throws InputError for a non-string input, bad options, or text without any numeric data line
 * of two or more columns. Everything else is reported in `issues`, never thrown.
 */
export function parseDelimited(text: string, options: ParseOptions = {}): ParsedTable {
  const file = options.fileName;
  if (typeof text !== "string") throw invalid("text", typeof text, "expected the file contents as a string", { file });
  const wantedDelimiter = options.delimiter ?? "auto";
  if (!DELIMITERS.includes(wantedDelimiter)) throw invalid("delimiter", wantedDelimiter, "use , ; tab, whitespace or auto", { file, field: "delimiter" });
  const wantedComma = options.decimalComma ?? "auto";
  const prefixes = (options.commentPrefixes ?? DEFAULT_COMMENT_PREFIXES).filter((p) => p !== "");
  const lines = splitLines(text);
  const detectPrefixes = prefixes.filter((p) => !DELIMITERS.includes(p as Delimiter));
  const format = detectFormat(lines, (l) => startsWithAny(l, detectPrefixes), { delimiter: wantedDelimiter, decimalComma: wantedComma }, file);
  const commentPrefixes = prefixes.filter((p) => p !== format.delimiter);
  const layout = findLayout(lines, format, commentPrefixes);
  const columns = buildColumns(format.columnCount, layout.names, layout.units);
  const body = readRows(lines, layout.dataStart, columns, format.delimiter, format.decimalComma, commentPrefixes);
  const ambiguity = wantedDelimiter === "auto" && wantedComma === "auto"
    ? findAmbiguity(lines, format, layout, (l) => startsWithAny(l, commentPrefixes))
    : undefined;
  return {
    ...(file !== undefined ? { fileName: file } : {}),
    columns,
    rows: body.rows,
    rowCount: body.lineNumbers.length,
    lineNumbers: body.lineNumbers,
    delimiter: format.delimiter,
    decimalComma: format.decimalComma,
    ...(layout.headerIndex !== undefined ? { headerLine: layout.headerIndex + 1 } : {}),
    ...(layout.unitIndex !== undefined ? { unitLine: layout.unitIndex + 1 } : {}),
    preamble: layout.preamble,
    issues: body.issues,
    issueCount: body.issueCount,
    ...(ambiguity ? { ambiguity } : {}),
  };
}

interface Body {
  rows: Float64Array[];
  lineNumbers: Int32Array;
  issues: ImportIssue[];
  issueCount: number;
}

function readRows(
  lines: readonly string[], start: number, columns: readonly ColumnInfo[],
  delimiter: Delimiter, decimalComma: boolean, commentPrefixes: readonly string[],
): Body {
  const n = columns.length;
  const capacity = Math.max(0, lines.length - start);
  const rows = columns.map(() => new Float64Array(capacity));
  const lineNumbers = new Int32Array(capacity);
  const issues: ImportIssue[] = [];
  let issueCount = 0;
  const report = (issue: ImportIssue) => {
    issueCount++;
    if (issues.length < MAX_ISSUES) issues.push(issue);
  };
  let count = 0;
  for (let i = start; i < lines.length; i++) {
    const line = lines[i];
    if (line.trim() === "" || startsWithAny(line, commentPrefixes)) continue;
    const split = splitCells(line, delimiter);
    const cells = split.length === n + 1 ? trimTrailingEmpty(split) : split;
    const values = new Array<number>(n);
    let numbers = 0;
    for (let c = 0; c < n; c++) {
      const v = c < cells.length ? parseNumber(cells[c], decimalComma) : NaN;
      values[c] = v;
      if (!Number.isNaN(v)) numbers++;
    }
    if (numbers === 0) {
      report({ line: i + 1, column: 1, message: "skipped a line without numbers" });
      continue;
    }
    for (let c = 0; c < n; c++) {
      rows[c][count] = values[c];
      if (Number.isNaN(values[c]) && c < cells.length) report({ line: i + 1, column: c + 1, field: columns[c].name, message: describeBadCell(cells[c]) });
    }
    if (cells.length !== n) {
      const column = Math.min(cells.length, n) + 1;
      report({ line: i + 1, column, field: columns[column - 1]?.name, message: `expected ${n} cells, found ${cells.length}` });
    }
    lineNumbers[count++] = i + 1;
  }
  return { rows: rows.map((r) => r.slice(0, count)), lineNumbers: lineNumbers.slice(0, count), issues, issueCount };
}
