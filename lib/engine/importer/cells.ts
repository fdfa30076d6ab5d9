/**
 * Low-level text handling: line splitting (LF, CRLF, CR, BOM), cell splitting with
 * double-quoted cells ("" inside quotes is a literal quote), and strict number parsing.
 * Quoted cells do not span lines: instrument exports put one record per line.
 */
import type { Delimiter } from "./types";

/** Split text into lines, dropping a leading byte-order mark. Line i of the result is source line i+1. */
export function splitLines(text: string): string[] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  return body.split(/\r\n|\n|\r/);
}

/** Split one line into trimmed cells; an empty or blank line gives []. */
export function splitCells(line: string, delimiter: Delimiter): string[] {
  if (line.indexOf('"') >= 0) return splitQuoted(line, delimiter);
  if (delimiter === "whitespace") {
    const t = line.trim();
    return t === "" ? [] : t.split(/\s+/);
  }
  if (line.trim() === "") return [];
  const parts = line.split(delimiter);
  for (let i = 0; i < parts.length; i++) parts[i] = parts[i].trim();
  return parts;
}

function isSpace(ch: string): boolean {
  return ch === " " || ch === "\t" || ch === "\u00a0";
}

function splitQuoted(line: string, delimiter: Delimiter): string[] {
  const cells: string[] = [];
  const ws = delimiter === "whitespace";
  let i = 0;
  const n = line.length;
  if (line.trim() === "") return cells;
  for (;;) {
    while (i < n && isSpace(line[i]) && line[i] !== delimiter) i++;
    if (ws && i >= n) break;
    let cell = "";
    if (line[i] === '"') {
      i++;
      while (i < n) {
        if (line[i] === '"') {
          if (line[i + 1] === '"') { cell += '"'; i += 2; continue; }
          i++;
          break;
        }
        cell += line[i++];
      }
    }
    while (i < n && !(ws ? isSpace(line[i]) : line[i] === delimiter)) cell += line[i++];
    cells.push(cell.trim());
    if (i >= n) break;
    i++; // past the delimiter (or one whitespace character)
    if (!ws && i >= n) { cells.push(""); break; }
  }
  return cells;
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Parse a cell as a finite decimal number; NaN when it is not one. With `decimalComma`
 * a single "," is the decimal mark ("1,5" → 1.5; "1.234,5" is rejected, not guessed).
 */
export function parseNumber(cell: string, decimalComma: boolean): number {
  let s = cell;
  if (decimalComma && s.indexOf(",") >= 0) {
    if (s.indexOf(".") >= 0) return NaN;
    s = s.replace(",", ".");
  }
  return NUMBER.test(s) ? Number(s) : NaN;
}

/** Why a cell is not a number, for issue messages. */
export function describeBadCell(cell: string): string {
  if (cell === "") return "empty cell";
  if (/^[+-]?nan$/i.test(cell)) return "cell is NaN";
  if (/^[+-]?inf(inity)?$/i.test(cell)) return "cell is infinite";
  const shown = cell.length > 40 ? cell.slice(0, 40) + "…" : cell;
  return `not a number: ${JSON.stringify(shown)}`;
}
