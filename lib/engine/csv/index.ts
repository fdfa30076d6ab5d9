/**
 * Safe CSV export.
 *
 *   writeCsv(columns, rows, options)   header with units + rows, RFC 4180 quoting, CRLF
 *   encodeCell(cell, separator)        one cell: numbers shortest round-trip, text neutralised
 *   neutraliseCell(text)               leading apostrophe before = + - @ tab CR
 *   formatNumber(x)                    shortest round-trip text; "" for non-finite
 *   headerText(column)                 "name (unit)"
 */
export { writeCsv, encodeCell, neutraliseCell, formatNumber, headerText } from "./write";
export type { CsvCell, CsvColumn, CsvOptions } from "./write";
