/**
 * Shared types of the delimited-text importer. A parsed table is column-major
 * (one Float64Array per column) so that a 100 000-row file costs a few typed arrays,
 * not 100 000 row objects.
 */

/** Cell delimiter; "whitespace" means any run of spaces and tabs. */
export type Delimiter = "," | ";" | "\t" | "whitespace";

/** Options of `parseDelimited`; every field defaults to automatic detection. */
export interface ParseOptions {
  /** Shown in error locations and kept on the result. */
  fileName?: string;
  delimiter?: Delimiter | "auto";
  /** `true`: "1,5" means 1.5 (the delimiter then cannot be ","). Default "auto". */
  decimalComma?: boolean | "auto";
  /** Line prefixes that mark comments. Default ["#", "%", "//", ";"]; the delimiter itself is never one. */
  commentPrefixes?: string[];
}

/** One column of the table: 0-based index, the name from the header, and any unit text found in it. */
export interface ColumnInfo {
  index: number;
  name: string;
  unitText?: string;
}

/** A problem found while reading: 1-based source line and 1-based column, and the column name. */
export interface ImportIssue {
  line: number;
  column: number;
  field?: string;
  message: string;
}

/**
 * A file that reads two ways: the caller must ask which (never guess). `line` is the 1-based
 * line that shows it; `kind` says which case (decimal comma inside a comma-delimited file, a
 * header whose cell count differs from the data's, two readings that fit about equally well).
 */
export interface Ambiguity {
  kind: "decimal-comma" | "header-count" | "two-readings";
  line: number;
  message: string;
}

/** Result of `parseDelimited`. */
export interface ParsedTable {
  fileName?: string;
  columns: ColumnInfo[];
  /** Column-major values: rows[c][r] is column c of data row r; NaN where a cell was missing or bad. */
  rows: Float64Array[];
  rowCount: number;
  /** 1-based source line of each data row. */
  lineNumbers: Int32Array;
  delimiter: Delimiter;
  decimalComma: boolean;
  /** 1-based line of the column-name header, if one was found. */
  headerLine?: number;
  /** 1-based line of a separate unit row under the header, if one was found. */
  unitLine?: number;
  /** Lines before the header (or before the data when there is no header), verbatim. */
  preamble: string[];
  /** At most MAX_ISSUES issues are kept; issueCount counts all of them. */
  issues: ImportIssue[];
  issueCount: number;
  /** Present when delimiter and decimal mark were both left to detection and the file reads two ways. */
  ambiguity?: Ambiguity;
}

/** Cap on stored issues, so a wholly broken 100 000-line file stays cheap to report. */
export const MAX_ISSUES = 1000;

export const DEFAULT_COMMENT_PREFIXES: readonly string[] = Object.freeze(["#", "%", "//", ";"]);
