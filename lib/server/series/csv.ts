/**
 * The series table as CSV through the safe writer (lib/engine/csv): one row per table row,
 * every value with its standard error, units in the headers, the revision each value came from;
 * γ and β also with their systematic σ (empty unless the fit came from a recommendation);
 * where the row's context comes from and what in the sample record changed since sealing.
 */
import { writeCsv, type CsvCell, type CsvColumn } from "../../engine/csv";
import { QUANTITY_UNITS, type SeriesView } from "./view";
import { formatUnit, plainSymbolOf } from "../../display";
import type { Valued } from "./extract";

const VALUES = ["gamma", "beta", "thetaD", "dosEF", "massRatio", "tc"] as const;
const CONTEXT_TEXT: Record<SeriesView["rows"][number]["context"]["source"], string> = {
  sealed: "sealed", "sealed-chain-only": "sealed (composition x not pinned)", "sample-record": "sample record",
};

/** A header "γ (mJ mol⁻¹ K⁻²)"; no unit for dimensionless columns. */
function unitColumn(name: string, unit: string): CsvColumn {
  const u = formatUnit(unit);
  return u ? { name, unit: u } : { name };
}

/** CSV text of a series view (CRLF, RFC 4180; UTF-8 with symbols and superscript units in the header). */
export function seriesCsv(view: SeriesView): string {
  const columns: CsvColumn[] = [
    { name: "sample" }, { name: "formula" }, { name: view.series.compositionVariable }, { name: "e/a" },
    ...VALUES.flatMap((q) => [unitColumn(plainSymbolOf(q), QUANTITY_UNITS[q]), unitColumn(`σ(${plainSymbolOf(q)})`, QUANTITY_UNITS[q])]),
    unitColumn(plainSymbolOf("gammaFree"), QUANTITY_UNITS.gammaFree),
    unitColumn(`systematic σ(${plainSymbolOf("gamma")})`, QUANTITY_UNITS.gamma), unitColumn(`systematic σ(${plainSymbolOf("beta")})`, QUANTITY_UNITS.beta),
    { name: "status" }, { name: "analysis id" }, { name: "revision" }, { name: "revision id" }, { name: "content hash" },
    { name: "context" }, { name: "sample record changed since sealing" },
  ];
  const rows: CsvCell[][] = view.rows.map((r) => [
    r.sample.label, r.sample.formula, r.x, r.electronsPerAtom,
    ...VALUES.flatMap((q) => { const v = r[q] as Valued | null; return [v?.value ?? null, v?.stdError ?? null]; }),
    r.gammaFree,
    r.gamma?.systematicError ?? null, r.beta?.systematicError ?? null,
    r.revision ? (r.draft ? `draft (${r.revision.state})` : r.revision.state) : "no analysis",
    r.revision?.analysisId ?? null, r.revision?.revisionNumber ?? null, r.revision?.revisionId ?? null, r.revision?.contentHash ?? null,
    CONTEXT_TEXT[r.context.source], r.context.changedSinceSealing.join("; ") || null,
  ]);
  return writeCsv(columns, rows);
}
