/**
 * extractPoints: the mapped columns of a parsed table as plain validated arrays.
 */
import { InputError, invalid } from "../errors";
import type { ImportIssue, ParsedTable } from "./types";

/** 0-based column indices of the table for each quantity. */
export interface ColumnMapping {
  temperature: number;
  heatCapacity: number;
  sigma?: number;
  field?: number;
}

/** Values in the file's own units (convert with units.toSI); one entry per accepted row. */
export interface ExtractedPoints {
  temperature: number[];
  heatCapacity: number[];
  sigma?: number[];
  field?: number[];
  /** 1-based source line of each point. */
  lineNumbers: number[];
  /** Rows left out with onInvalid "skip" (empty otherwise). */
  skipped: ImportIssue[];
}

type Key = keyof ColumnMapping;
const RULES: Record<Key, { test: (v: number) => boolean; why: string }> = {
  temperature: { test: (v) => Number.isFinite(v) && v > 0, why: "temperature must be finite and > 0" },
  heatCapacity: { test: Number.isFinite, why: "heat capacity must be a finite number" },
  sigma: { test: (v) => Number.isFinite(v) && v > 0, why: "uncertainty must be finite and > 0" },
  field: { test: Number.isFinite, why: "field must be a finite number" },
};

function checkMapping(table: ParsedTable, mapping: ColumnMapping): Key[] {
  const keys = (Object.keys(RULES) as Key[]).filter((k) => mapping[k] !== undefined);
  const seen = new Map<number, Key>();
  for (const k of keys) {
    const index = mapping[k] as number;
    if (!Number.isInteger(index) || index < 0 || index >= table.columns.length) {
      throw invalid(`mapping.${k}`, index, `the table has columns 0–${table.columns.length - 1}`, { file: table.fileName, field: k });
    }
    const other = seen.get(index);
    if (other) throw invalid(`mapping.${k}`, index, `column already mapped to ${other}`, { file: table.fileName, field: k });
    seen.set(index, k);
  }
  if (mapping.temperature === undefined || mapping.heatCapacity === undefined) {
    throw new InputError("invalid mapping: temperature and heatCapacity columns are required", { file: table.fileName, field: "mapping" });
  }
  return keys;
}

/**
 * Validate and copy the mapped columns: T finite and > 0, C finite, σ finite and > 0,
 * field finite. With onInvalid "throw" (default) the first bad value throws InputError
 * naming file, line, column (1-based) and column name, with the number of other bad rows;
 * with "skip" bad rows are left out and listed in `skipped`. Throws when no row remains,
 * or when the mapping names a missing column or the same column twice.
 */
export function extractPoints(
  table: ParsedTable, mapping: ColumnMapping, options: { onInvalid?: "throw" | "skip" } = {},
): ExtractedPoints {
  const keys = checkMapping(table, mapping);
  const out: Record<Key, number[]> = { temperature: [], heatCapacity: [], sigma: [], field: [] };
  const lineNumbers: number[] = [];
  const skipped: ImportIssue[] = [];
  for (let r = 0; r < table.rowCount; r++) {
    const line = table.lineNumbers[r];
    const bad = keys.find((k) => !RULES[k].test(table.rows[mapping[k] as number][r]));
    if (bad) {
      const column = mapping[bad] as number;
      const v = table.rows[column][r];
      skipped.push({ line, column: column + 1, field: table.columns[column].name, message: `invalid ${bad}: ${Number.isNaN(v) ? "missing or not a number" : v} (${RULES[bad].why})` });
      continue;
    }
    for (const k of keys) out[k].push(table.rows[mapping[k] as number][r]);
    lineNumbers.push(line);
  }
  if (skipped.length > 0 && options.onInvalid !== "skip") {
    const first = skipped[0];
    const more = skipped.length - 1;
    throw new InputError(`${first.message}${more > 0 ? `; ${more} more invalid row${more > 1 ? "s" : ""}` : ""}`,
      { file: table.fileName, line: first.line, column: first.column, field: first.field });
  }
  if (lineNumbers.length === 0) throw new InputError("no valid data rows in the mapped columns", { file: table.fileName });
  return {
    temperature: out.temperature, heatCapacity: out.heatCapacity,
    ...(mapping.sigma !== undefined ? { sigma: out.sigma } : {}),
    ...(mapping.field !== undefined ? { field: out.field } : {}),
    lineNumbers, skipped,
  };
}
