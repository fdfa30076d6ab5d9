/** The first rows of an uploaded file as the server parsed them, with the chosen column roles marked. */
import type { Preview } from "./ImportPanel";

export function ImportPreviewTable({ preview, roles }: { preview: Preview; roles: Record<number, string> }) {
  return (
    <div className="table-scroll">
      <table className="preview-table" data-testid="import-preview">
        <caption className="sr-only">First {preview.rows.length} of {preview.rowCount} data rows</caption>
        <thead>
          <tr>
            <th className="num">line</th>
            {preview.columns.map((c) => (
              <th key={c.index} className="num" style={roles[c.index] ? { color: "var(--copper-deep)" } : undefined}>
                {c.name || `column ${c.index + 1}`}
                {c.unitText && <span className="muted"> [{c.unitText}]</span>}
                {roles[c.index] && <div>→ {roles[c.index]}</div>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => (
            <tr key={r.line}>
              <td className="num muted">{r.line}</td>
              {r.values.map((v, i) => (
                <td key={i} className="num">{v === null ? <span className="muted">—</span> : String(v)}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
