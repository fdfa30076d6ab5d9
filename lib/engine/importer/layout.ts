/**
 * Where things are in the file: the first data line, the header (a name row, optionally
 * followed by a unit row, or a commented-out name row such as "# T(K) C(J/K)"), and the
 * preamble of instrument metadata before it.
 */
import { numericCells } from "./detect";
import { headerCells, isTextRow, looksLikeUnitRow, splitNameAndUnit } from "./header";
import type { Format } from "./detect";

export interface Layout {
  /** 0-based index of the first data line. */
  dataStart: number;
  headerIndex?: number;
  unitIndex?: number;
  names: string[] | null;
  units: string[] | null;
  preamble: string[];
}

/** Locate data, header and preamble; `dataStart` exists because detection found numeric lines. */
export function findLayout(lines: readonly string[], format: Format, commentPrefixes: readonly string[]): Layout {
  const isComment = (line: string) => startsWithAny(line, commentPrefixes);
  const { delimiter, decimalComma, columnCount } = format;
  let dataStart = lines.findIndex(
    (line) => !isComment(line) && numericCells(line, delimiter, decimalComma)?.length === columnCount,
  );
  if (dataStart < 0) dataStart = lines.length;
  // Nearest non-blank line before `from`; with skipComments, nearest non-comment one.
  const before = (from: number, skipComments: boolean): number => {
    for (let i = from - 1; i >= 0; i--) {
      if (lines[i].trim() === "" || (skipComments && isComment(lines[i]))) continue;
      return i;
    }
    return -1;
  };
  const textRow = (text: string): string[] | null => {
    const cells = headerCells(text, delimiter, columnCount);
    return cells && isTextRow(cells, decimalComma) ? cells : null;
  };
  let headerIndex: number | undefined;
  let unitIndex: number | undefined;
  let names: string[] | null = null;
  let units: string[] | null = null;
  const nearest = before(dataStart, false);
  const commented = nearest >= 0 && isComment(lines[nearest]) ? textRow(stripPrefix(lines[nearest], commentPrefixes)) : null;
  if (commented) {
    [headerIndex, names] = [nearest, commented];
  } else {
    const j = before(dataStart, true);
    const jCells = j >= 0 ? textRow(lines[j]) : null;
    if (jCells) {
      const k = before(j, false);
      const kCells = k >= 0 && !isComment(lines[k]) ? textRow(lines[k]) : null;
      const kHasUnits = kCells?.some((c) => splitNameAndUnit(c).unitText !== undefined);
      if (kCells && !kHasUnits && looksLikeUnitRow(jCells)) [headerIndex, unitIndex, names, units] = [k, j, kCells, jCells];
      else [headerIndex, names] = [j, jCells];
    }
  }
  const end = headerIndex ?? dataStart;
  const preamble = lines.slice(0, end).filter((l) => l.trim() !== "");
  return { dataStart, headerIndex, unitIndex, names, units, preamble };
}

/** True when the line, after leading blanks, starts with one of the prefixes. */
export function startsWithAny(line: string, prefixes: readonly string[]): boolean {
  if (prefixes.length === 0) return false;
  const t = line.trimStart();
  for (const p of prefixes) if (t.startsWith(p)) return true;
  return false;
}

function stripPrefix(line: string, prefixes: readonly string[]): string {
  const t = line.trimStart();
  for (const p of prefixes) if (t.startsWith(p)) return t.slice(p.length);
  return t;
}
