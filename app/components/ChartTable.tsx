"use client";
/**
 * A chart's values as a table, the text alternative to the picture: closed by default, built
 * only when opened (from the same CSV the export button writes), first 200 rows shown.
 */
import { useState } from "react";

const SHOWN = 200;

function parseCsv(text: string): string[][] {
  return text.trim().split(/\r?\n/).filter((l) => !l.startsWith("#")).map((line) => {
    const cells: string[] = [];
    let cur = "", quoted = false;
    for (let i = 0; i < line.length; i++) {
      const ch = line[i]!;
      if (quoted) {
        if (ch === '"' && line[i + 1] === '"') { cur += '"'; i++; } else if (ch === '"') quoted = false; else cur += ch;
      } else if (ch === '"') quoted = true;
      else if (ch === ",") { cells.push(cur); cur = ""; } else cur += ch;
    }
    cells.push(cur);
    return cells;
  });
}

export function ChartTable({ label, csv }: { label: string; csv: () => string }) {
  const [rows, setRows] = useState<string[][] | null>(null);
  return (
    <details className="chart-table" onToggle={(e) => { if ((e.target as HTMLDetailsElement).open && !rows) setRows(parseCsv(csv())); }}>
      <summary className="small">Values as a table</summary>
      {rows && rows.length > 0 && (
        <div className="table-scroll">
          <table className="small">
            <caption className="sr-only">{label}: the plotted values</caption>
            <thead><tr>{rows[0]!.map((h, i) => <th key={i} scope="col">{h}</th>)}</tr></thead>
            <tbody>{rows.slice(1, SHOWN + 1).map((r, k) => <tr key={k}>{r.map((c, i) => <td key={i} className="num">{c}</td>)}</tr>)}</tbody>
          </table>
          {rows.length - 1 > SHOWN && <p className="small muted">First {SHOWN} of {rows.length - 1} rows; the CSV button gives all of them.</p>}
        </div>
      )}
    </details>
  );
}
