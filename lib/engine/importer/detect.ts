/**
 * Delimiter and decimal-mark detection from the first data lines.
 *
 * Each candidate (delimiter, decimal comma) splits a sample of lines; a line is
 * "numeric" under it when it has at least two number cells making up at least half of
 * its cells (so a text column such as a time stamp is allowed). Each numeric line scores
 * its fraction of number cells; the candidate with the highest score at one cell count
 * wins; ties go to the cell count seen first and to the earlier entry of CANDIDATES (tab before whitespace,
 * point before comma), which is the reading that needs the least guessing.
 */
import { InputError } from "../errors";
import { parseNumber, splitCells } from "./cells";
import type { Delimiter } from "./types";

export interface Format {
  delimiter: Delimiter;
  decimalComma: boolean;
  /** Most common cell count of the numeric lines. */
  columnCount: number;
  /** Summed per-line number fractions of this reading (its detection score). */
  score: number;
  /** The best reading with the other decimal mark, when one found numeric lines. */
  runnerUp?: { delimiter: Delimiter; decimalComma: boolean; columnCount: number; score: number };
}

const CANDIDATES: readonly [Delimiter, boolean][] = [
  ["\t", false], [",", false], [";", false], ["whitespace", false],
  ["\t", true], [";", true], ["whitespace", true],
];

const SAMPLE_LINES = 500;

/** Cells of a line if it reads as a numeric data line under (delimiter, decimalComma), else null. */
export function numericCells(line: string, delimiter: Delimiter, decimalComma: boolean): string[] | null {
  const cells = trimTrailingEmpty(splitCells(line, delimiter));
  return cells.length >= 2 && numberFraction(cells, decimalComma) >= 0.5 ? cells : null;
}

/** Fraction of cells that are numbers, 0 when fewer than two are. */
function numberFraction(cells: readonly string[], decimalComma: boolean): number {
  let numbers = 0;
  for (const c of cells) if (!Number.isNaN(parseNumber(c, decimalComma))) numbers++;
  return numbers >= 2 ? numbers / cells.length : 0;
}

/** Drop one empty cell left by a delimiter at the end of the line ("1,2,"). */
export function trimTrailingEmpty(cells: string[]): string[] {
  return cells.length > 1 && cells[cells.length - 1] === "" ? cells.slice(0, -1) : cells;
}

/**
 * Choose delimiter and decimal mark from the first SAMPLE_LINES non-blank, non-comment lines.
 * Throws InputError when no candidate finds numeric lines with two or more columns, or when the
 * options ask for the impossible pair (decimal comma with comma delimiter).
 */
export function detectFormat(
  lines: readonly string[],
  isComment: (line: string) => boolean,
  wanted: { delimiter: Delimiter | "auto"; decimalComma: boolean | "auto" },
  file?: string,
): Format {
  if (wanted.delimiter === "," && wanted.decimalComma === true) {
    throw new InputError("invalid options: a decimal comma cannot be used with the comma delimiter", { file, field: "decimalComma" });
  }
  const sample: string[] = [];
  for (const line of lines) {
    if (sample.length >= SAMPLE_LINES) break;
    if (line.trim() !== "" && !isComment(line)) sample.push(line);
  }
  let best: Format | null = null;
  let bestScore = 0;
  const bestByMark: (Format | null)[] = [null, null];
  for (const [delimiter, decimalComma] of CANDIDATES) {
    if (wanted.delimiter !== "auto" && wanted.delimiter !== delimiter) continue;
    if (wanted.decimalComma !== "auto" && wanted.decimalComma !== decimalComma) continue;
    const counts = new Map<number, number>();
    for (const line of sample) {
      const cells = numericCells(line, delimiter, decimalComma);
      if (cells) counts.set(cells.length, (counts.get(cells.length) ?? 0) + numberFraction(cells, decimalComma));
    }
    for (const [columnCount, score] of counts) {
      const mark = decimalComma ? 1 : 0;
      if (score > (bestByMark[mark]?.score ?? 0)) bestByMark[mark] = { delimiter, decimalComma, columnCount, score };
      if (score > bestScore) {
        best = { delimiter, decimalComma, columnCount, score };
        bestScore = score;
      }
    }
  }
  if (!best) {
    throw new InputError("no numeric data found: expected lines with two or more delimited numeric columns", { file });
  }
  const other = bestByMark[best.decimalComma ? 0 : 1];
  return other ? { ...best, runnerUp: { delimiter: other.delimiter, decimalComma: other.decimalComma, columnCount: other.columnCount, score: other.score } } : best;
}
