/**
 * The series table as CSV through the safe writer (lib/engine/csv): one row per table row,
 * every value with its standard error, units in the headers, the revision each value came from,
 * where the row's context comes from and what in the sample record changed since sealing.
 */
import { writeCsv, type CsvCell, type CsvColumn } from "../../engine/csv";
import { QUANTITY_UNITS, type SeriesView } from "./view";
import type { Valued } from "./extract";

const VALUES = ["gamma", "beta", "thetaD", "dosEF", "massRatio", "tc"] as const;
const CONTEXT_TEXT: Record<SeriesView["rows"][number]["context"]["source"], string> = {
  sealed: "sealed", "sealed-chain-only": "sealed (composition x not pinned)", "sample-record": "sample record",
};

/** CSV text of a series view (CRLF, RFC 4180). */
export function seriesCsv(view: SeriesView): string {
  const columns: CsvColumn[] = [
    { name: "sample" }, { name: "formula" }, { name: view.series.compositionVariable }, { name: "e/a" },
    ...VALUES.flatMap((q) => [{ name: q, unit: QUANTITY_UNITS[q] }, { name: `${q} sigma`, unit: QUANTITY_UNITS[q] }]),
    { name: "gammaFree", unit: QUANTITY_UNITS.gammaFree },
    { name: "status" }, { name: "analysis id" }, { name: "revision" }, { name: "revision id" }, { name: "content hash" },
    { name: "context" }, { name: "sample record changed since sealing" },
  ];
  const rows: CsvCell[][] = view.rows.map((r) => [
    r.sample.label, r.sample.formula, r.x, r.electronsPerAtom,
    ...VALUES.flatMap((q) => { const v = r[q] as Valued | null; return [v?.value ?? null, v?.stdError ?? null]; }),
    r.gammaFree,
    r.revision ? (r.draft ? `draft (${r.revision.state})` : r.revision.state) : "no analysis",
    r.revision?.analysisId ?? null, r.revision?.revisionNumber ?? null, r.revision?.revisionId ?? null, r.revision?.contentHash ?? null,
    CONTEXT_TEXT[r.context.source], r.context.changedSinceSealing.join("; ") || null,
  ]);
  return writeCsv(columns, rows);
}
