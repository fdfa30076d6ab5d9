"use client";
/**
 * Import a C(T) file into a sample in two steps. 1) "Read file": POST .../imports shows what the
 * server found (delimiter, decimal comma, first rows, issues with line and column, guessed column
 * roles); nothing is stored. 2) The user confirms roles, units, kind, label, field → "Store
 * measurement" POSTs the same file to .../measurements. A refused file (422) names line/column.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callUpload } from "@/app/_lib/api";
import { DELIMITER_NAMES } from "@/app/_lib/importChoices";
import { ImportPreviewTable } from "./ImportPreviewTable";
import { ImportMapping, initialMapping, mappingPayload, type MappingState } from "./ImportMapping";

export interface Preview {
  fileName: string;
  sizeBytes: number;
  sha256: string;
  delimiter: string;
  decimalComma: boolean;
  headerLine: number | null;
  columns: { index: number; name: string; unitText: string | null }[];
  rows: { line: number; values: (number | null)[] }[];
  rowCount: number;
  guesses: Record<"temperature" | "heatCapacity" | "sigma" | "field", { index: number; confidence: number; reason: string } | null>;
  issues: { line: number; column: number; field?: string; message: string }[];
  issueCount: number;
  preamble: string[];
}

export function ImportPanel({ apiBase, measurementPath, heatCapacityUnits }: { apiBase: string; measurementPath: string; heatCapacityUnits: string[] }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [delimiter, setDelimiter] = useState("auto");
  const [decimalComma, setDecimalComma] = useState("auto");
  const [preview, setPreview] = useState<Preview | null>(null);
  const [mapping, setMapping] = useState<MappingState | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [stored, setStored] = useState<{ id: string; label: string; pointCount: number } | null>(null);
  const [busy, setBusy] = useState<"preview" | "store" | null>(null);

  const parse = { delimiter, decimalComma: decimalComma === "auto" ? "auto" : decimalComma === "yes" };

  async function read(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!file) return setError("choose a file first");
    setBusy("preview");
    setError(null);
    setStored(null);
    const res = await callUpload<{ preview: Preview }>(`${apiBase}/imports`, file, { parse });
    setBusy(null);
    if (!res.ok || !res.data) {
      setPreview(null);
      return setError(res.error);
    }
    setPreview(res.data.preview);
    setMapping(initialMapping(res.data.preview, heatCapacityUnits));
  }

  async function store() {
    if (!file || !mapping) return;
    const payload = mappingPayload(mapping);
    if (typeof payload === "string") return setError(payload);
    setBusy("store");
    setError(null);
    const res = await callUpload<{ measurement: { id: string; label: string; pointCount: number } }>(`${apiBase}/measurements`, file, { ...payload, parse });
    setBusy(null);
    if (!res.ok || !res.data) return setError(res.error);
    setStored(res.data.measurement);
    setPreview(null);
    setMapping(null);
    setFile(null);
    router.refresh();
  }

  return (
    <div className="stack" data-testid="import-panel">
      <form className="inline-form" onSubmit={read}>
        <div className="field">
          <label htmlFor="import-file">Data file</label>
          <input id="import-file" type="file" accept=".txt,.csv,.tsv,.dat,.dta,text/*" onChange={(e) => { setFile(e.target.files?.[0] ?? null); setPreview(null); setError(null); }} />
        </div>
        <div className="field">
          <label htmlFor="import-delimiter">Delimiter</label>
          <select id="import-delimiter" value={delimiter} onChange={(e) => setDelimiter(e.target.value)}>
            <option value="auto">detect</option>
            <option value=",">comma</option>
            <option value=";">semicolon</option>
            <option value={"\t"}>tab</option>
            <option value="whitespace">spaces or tabs</option>
          </select>
        </div>
        <div className="field">
          <label htmlFor="import-decimal">Decimal comma</label>
          <select id="import-decimal" value={decimalComma} onChange={(e) => setDecimalComma(e.target.value)}>
            <option value="auto">detect</option>
            <option value="yes">yes (1,5 = 1.5)</option>
            <option value="no">no</option>
          </select>
        </div>
        <button type="submit" disabled={!file || busy !== null}>{busy === "preview" ? "Reading…" : preview ? "Read again" : "Read file"}</button>
      </form>
      <p className="small muted">Reading shows what Heatbook found in the file. Nothing is stored until you press “Store measurement”.</p>
      {error && !preview && <p className="form-error" role="alert" data-testid="import-error">{error}</p>}
      {stored && (
        <p className="notice-ok" role="status">
          Stored <Link href={`${measurementPath}/${stored.id}`}>{stored.label}</Link> with {stored.pointCount} points.
        </p>
      )}
      {preview && mapping && (
        <>
          <div className="notice-info" data-testid="import-detected">
            <strong>{preview.fileName}</strong> ({preview.rowCount} data rows): delimiter {DELIMITER_NAMES[preview.delimiter] ?? preview.delimiter}, decimal comma{" "}
            {preview.decimalComma ? "yes" : "no"}, {preview.headerLine ? `column names on line ${preview.headerLine}` : "no header line found"}.
          </div>
          {preview.issueCount > 0 && (
            <div>
              <h4 style={{ margin: "0.4rem 0" }}>{preview.issueCount} issue{preview.issueCount === 1 ? "" : "s"} found</h4>
              <ul className="issues" data-testid="import-issues">
                {preview.issues.map((i, k) => (
                  <li key={k}>line {i.line}, column {i.column}{i.field ? ` (${i.field})` : ""}: {i.message}</li>
                ))}
                {preview.issueCount > preview.issues.length && <li>… and {preview.issueCount - preview.issues.length} more</li>}
              </ul>
            </div>
          )}
          {preview.preamble.length > 0 && (
            <details>
              <summary className="small">Lines before the data ({preview.preamble.length})</summary>
              <pre className="small mono" style={{ whiteSpace: "pre-wrap" }}>{preview.preamble.join("\n")}</pre>
            </details>
          )}
          <ImportPreviewTable preview={preview} roles={rolesOf(mapping)} />
          <ImportMapping preview={preview} state={mapping} onChange={setMapping} heatCapacityUnits={heatCapacityUnits} />
          {error && <p className="form-error" role="alert" data-testid="import-error">{error}</p>}
          <div className="actions">
            <button type="button" onClick={() => void store()} disabled={busy !== null} data-testid="store-measurement">
              {busy === "store" ? "Storing…" : "Store measurement"}
            </button>
            <button type="button" className="quiet" onClick={() => { setPreview(null); setMapping(null); }}>Discard</button>
          </div>
        </>
      )}
    </div>
  );
}

function rolesOf(m: MappingState): Record<number, string> {
  const out: Record<number, string> = {};
  const put = (idx: string, name: string) => { if (idx !== "") out[Number(idx)] = name; };
  put(m.temperature, "T");
  put(m.heatCapacity, "C");
  put(m.sigma, "σ");
  put(m.field, "B");
  return out;
}
