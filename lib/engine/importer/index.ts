/**
 * Importer: delimited instrument exports → numeric tables → validated (T, C, σ, field) points.
 *
 *   parseDelimited(text, options)      text → ParsedTable (column-major, issues reported)
 *   guessColumnRoles(columns)          which column is T, C, σ, field (with confidence)
 *   extractPoints(table, mapping)      validated plain arrays, or InputError naming line/column
 *   checkTemperatures(T, lines)        repeated and non-increasing temperatures, with their lines
 *   splitNameAndUnit(headerCell)       "T (K)" → { name: "T", unitText: "K" }
 */
export { parseDelimited } from "./parse";
export { guessColumnRoles } from "./roles";
export type { ColumnRole, RoleGuess, RoleGuesses } from "./roles";
export { extractPoints } from "./extract";
export type { ColumnMapping, ExtractedPoints } from "./extract";
export { splitNameAndUnit } from "./header";
export { checkTemperatures } from "./checks";
export type { TemperatureChecks, TemperatureFinding } from "./checks";
export { DEFAULT_COMMENT_PREFIXES, MAX_ISSUES } from "./types";
export type { Ambiguity, ColumnInfo, Delimiter, ImportIssue, ParseOptions, ParsedTable } from "./types";
