"use client";
/**
 * The series value table: one row per member (and per shown draft), sortable by any column,
 * every value as value(σ), the revision each row came from linked, rows more than 3σ off the
 * chosen trend flagged. Display only.
 */
import Link from "next/link";
import { useMemo, useState } from "react";
import { formatNumber, formatValue } from "@/lib/display";
import { formatStatSyst } from "@/lib/engine/scan/statSyst";
import type { SeriesRow } from "@/lib/server/series";
import { STATE_LABEL } from "@/app/components/review/labels";
import { Sym } from "../Sym";

type Key = "sample" | "x" | "ea" | "gamma" | "beta" | "thetaD" | "dosEF" | "massRatio" | "tc" | "gammaFree" | "status";

export interface TableColumn { key: Key; label: string; unit?: string }

export const ALL_COLUMNS: TableColumn[] = [
  { key: "sample", label: "Sample" }, { key: "x", label: "x" }, { key: "ea", label: "e/a" },
  { key: "gamma", label: "γ", unit: "mJ mol⁻¹ K⁻²" }, { key: "beta", label: "β", unit: "mJ mol⁻¹ K⁻⁴" }, { key: "thetaD", label: "Θ_D", unit: "K" },
  { key: "dosEF", label: "D(E_F)", unit: "states eV⁻¹ f.u.⁻¹" }, { key: "massRatio", label: "m*/m" }, { key: "tc", label: "T_c", unit: "K" },
  { key: "gammaFree", label: "γ_free", unit: "mJ mol⁻¹ K⁻²" }, { key: "status", label: "From" },
];

function sortValue(r: SeriesRow, k: Key): number | string | null {
  if (k === "sample") return r.sample.label;
  if (k === "x") return r.x;
  if (k === "ea") return r.electronsPerAtom;
  if (k === "gammaFree") return r.gammaFree;
  if (k === "status") return r.revision ? `${r.draft ? "1" : "0"}${r.revision.revisionNumber}` : "2";
  return r[k]?.value ?? null;
}

function cell(r: SeriesRow, k: Key, slug: string) {
  if (k === "sample")
    return (
      <>
        {r.sample.label}{r.sample.archived && <span className="tag">archived</span>}
        {r.revision?.analysisArchived && <span className="tag" title="the analysis is archived; its sealed revision stays in the series">analysis archived</span>}
        {r.context.changedSinceSealing.length > 0 && (
          <div className="small sx-changed" data-testid="context-changed" title="formula, x and e/a in this row are as sealed">sample record changed since sealing: {r.context.changedSinceSealing.join("; ")}</div>
        )}
        {r.context.note && <div className="small muted" data-testid="context-not-pinned">{r.context.note.split(":")[0]}</div>}
      </>
    );
  if (k === "x") return r.x === null ? "—" : String(r.x);
  if (k === "ea") return r.electronsPerAtom === null ? "—" : r.electronsPerAtom.toFixed(3);
  if (k === "gammaFree") return r.gammaFree === null ? "—" : formatNumber(r.gammaFree, 4);
  if (k === "status") {
    if (!r.revision) return <span className="muted" title={r.warnings.join("; ")}>no sealed revision yet</span>;
    const href = `/g/${encodeURIComponent(slug)}/analyses/${r.revision.analysisId}?revision=${r.revision.revisionId}`;
    return <Link href={href} title={r.revision.analysisTitle}>r{r.revision.revisionNumber} · {STATE_LABEL[r.revision.state]}</Link>;
  }
  const v = r[k];
  if (v && typeof v.systematicError === "number") return <span title="value(statistical σ)(systematic σ)">{formatStatSyst(v.value, v.stdError, v.systematicError)}</span>;
  return v ? formatValue(v.value, v.stdError) : "—";
}

interface Props {
  rows: SeriesRow[];
  columns: TableColumn[];
  slug: string;
  /** Rows flagged > 3σ from the chosen trend, by "label|draft". */
  flagged: Set<string>;
  testId: string;
  caption: string;
}

export function SeriesTable({ rows, columns, slug, flagged, testId, caption }: Props) {
  const [sort, setSort] = useState<{ key: Key; dir: 1 | -1 } | null>(null);
  const sorted = useMemo(() => {
    if (!sort) return rows;
    return [...rows].sort((a, b) => {
      const va = sortValue(a, sort.key), vb = sortValue(b, sort.key);
      if (va === null && vb === null) return 0;
      if (va === null) return 1;
      if (vb === null) return -1;
      return (typeof va === "number" && typeof vb === "number" ? va - vb : String(va).localeCompare(String(vb))) * sort.dir;
    });
  }, [rows, sort]);
  const click = (key: Key) => setSort((s) => (s?.key === key ? { key, dir: s.dir === 1 ? -1 : 1 } : { key, dir: 1 }));
  return (
    <div className="table-scroll">
      <table className="sx-table" data-testid={testId}>
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr>
            {columns.map((c) => (
              <th key={c.key} className={c.key === "sample" || c.key === "status" ? undefined : "num"} aria-sort={sort?.key === c.key ? (sort.dir === 1 ? "ascending" : "descending") : "none"}>
                <button type="button" onClick={() => click(c.key)} data-testid={`sort-${c.key}`}><Sym m={c.label} />{sort?.key === c.key ? (sort.dir === 1 ? " ▲" : " ▼") : ""}</button>
                {c.unit && <div className="small muted">{c.unit}</div>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {sorted.map((r) => {
            const id = `${r.sample.label}|${r.draft}`;
            return (
              <tr key={`${r.sample.id}-${r.draft}`} className={r.draft ? "sx-draft" : undefined} title={r.draft ? "not reviewed yet" : r.warnings.join("; ") || undefined}>
                {columns.map((c) => (
                  <td key={c.key} className={c.key === "sample" || c.key === "status" ? undefined : "num mono"}>
                    {cell(r, c.key, slug)}
                    {c.key === "sample" && flagged.has(id) && <span className="sx-flag" title="more than 3σ from the trend"> &gt;3σ</span>}
                    {c.key === "sample" && r.draft && <span className="small"> (draft)</span>}
                  </td>
                ))}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
