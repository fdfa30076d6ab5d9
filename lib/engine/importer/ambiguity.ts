/**
 * Readings of a file that cannot be told apart without asking. Two are common in instrument
 * exports: a comma-delimited file whose numbers were written with a decimal comma ("T,C" over
 * "1,5,2,3" — two columns named, four cells a line), and a file that reads as a consistent table
 * both with a decimal point and with a decimal comma. Neither is guessed: the table reports an
 * `ambiguity` and the caller asks the user to choose the delimiter and decimal mark.
 */
import { parseNumber, splitCells } from "./cells";
import type { Format } from "./detect";
import { isTextRow } from "./header";
import type { Layout } from "./layout";
import type { Ambiguity } from "./types";

const DELIMITER_WORD: Record<Format["delimiter"], string> = { ",": "comma", ";": "semicolon", "\t": "tab", whitespace: "spaces" };

/**
 * The ambiguity of the chosen reading, if any (only asked when both delimiter and decimal mark
 * were left to detection): a header line whose cell count differs from the data's, or a
 * runner-up reading with the other decimal mark that explains the lines about as well
 * (score ≥ 0.9 of the best, at least two columns).
 */
export function findAmbiguity(lines: readonly string[], format: Format, layout: Layout, isComment: (line: string) => boolean): Ambiguity | undefined {
  const header = headerMismatch(lines, format, layout, isComment);
  if (header) return header;
  const rival = format.runnerUp;
  if (rival && rival.decimalComma !== format.decimalComma && rival.columnCount >= 2 && rival.score >= 0.9 * format.score
    && readingsDiffer(lines, layout.dataStart, format, rival, isComment)) {
    return {
      kind: "two-readings",
      line: layout.dataStart + 1,
      message:
        `the data read as ${format.columnCount} ${DELIMITER_WORD[format.delimiter]}-separated columns with a decimal ${format.decimalComma ? "comma" : "point"}, ` +
        `and as ${rival.columnCount} ${DELIMITER_WORD[rival.delimiter]}-separated columns with a decimal ${rival.decimalComma ? "comma" : "point"}: choose the delimiter and decimal mark`,
    };
  }
  return undefined;
}

/** A text row directly above the data with more than one cell, but not the data's cell count. */
function headerMismatch(lines: readonly string[], format: Format, layout: Layout, isComment: (line: string) => boolean): Ambiguity | undefined {
  if (layout.names) return undefined;
  for (let i = layout.dataStart - 1; i >= 0; i--) {
    const line = lines[i]!;
    if (line.trim() === "" || isComment(line)) continue;
    const cells = splitCells(line, format.delimiter).filter((c) => c.trim() !== "");
    if (cells.length < 2 || cells.length === format.columnCount || !isTextRow(cells, format.decimalComma)) return undefined;
    const commaAsDecimal = format.delimiter === "," && format.columnCount > cells.length;
    return {
      kind: commaAsDecimal ? "decimal-comma" : "header-count",
      line: i + 1,
      message: commaAsDecimal
        ? `the header on line ${i + 1} names ${cells.length} columns (${cells.map((c) => c.trim()).join(", ")}) but line ${layout.dataStart + 1} has ${format.columnCount} comma-separated cells: ` +
          "the comma may be the decimal mark as well as the delimiter; re-export with a semicolon or tab delimiter, or choose the comma delimiter to read the cells as they are"
        : `the header on line ${i + 1} names ${cells.length} columns but line ${layout.dataStart + 1} has ${format.columnCount} cells: choose the delimiter and decimal mark`,
    };
  }
  return undefined;
}

/** True when the two readings give different numbers on the first data lines (same numbers: no question). */
function readingsDiffer(
  lines: readonly string[], start: number, a: Pick<Format, "delimiter" | "decimalComma">, b: Pick<Format, "delimiter" | "decimalComma">,
  isComment: (line: string) => boolean,
): boolean {
  let seen = 0;
  for (let i = start; i < lines.length && seen < 200; i++) {
    const line = lines[i]!;
    if (line.trim() === "" || isComment(line)) continue;
    seen++;
    const ca = splitCells(line, a.delimiter);
    const cb = splitCells(line, b.delimiter);
    if (ca.length !== cb.length) return true;
    for (let c = 0; c < ca.length; c++) {
      const va = parseNumber(ca[c]!, a.decimalComma);
      const vb = parseNumber(cb[c]!, b.decimalComma);
      if (!(va === vb || (Number.isNaN(va) && Number.isNaN(vb)))) return true;
    }
  }
  return false;
}
