"use client";
/**
 * Import C(T) files into a sample, one or several at once, in two steps. 1) "Read": each file is
 * POSTed to .../imports and the server answers what it found (delimiter, decimal mark, first
 * rows, every bad line of the mapped columns, repeated and non-increasing temperatures, the
 * curve); nothing is stored. A file that reads two ways is not guessed: it must be re-read with
 * the delimiter and decimal mark chosen. 2) The user confirms roles, units and kind (once for all
 * files that share a layout) → "Store" POSTs each file to .../measurements, one transaction per
 * file, and a summary lists what was stored and what was refused.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState, type FormEvent } from "react";
import { callUpload } from "@/app/_lib/api";
import { DELIMITER_NAMES } from "@/app/_lib/importChoices";
import { ImportPreviewTable } from "./ImportPreviewTable";
import { ImportMapping, initialMapping, mappingPayload, type MappingState } from "./ImportMapping";
import { ImportChecks } from "./ImportChecks";
import { ImportCurve } from "./ImportCurve";

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
  ambiguity: { kind: string; line: number; message: string } | null;
  checks: PreviewChecks | null;
}

export interface PreviewChecks {
  mapping: { temperature: number; heatCapacity: number; sigma?: number };
  invalid: { line: number; column: number; field?: string; message: string }[];
  invalidCount: number;
  temperatures: {
    duplicates: { line: number; otherLine: number; value: number }[];
    duplicateCount: number;
    decreasing: { line: number; otherLine: number; value: number }[];
    decreasingCount: number;
  };
  validCount: number;
  curve: { temperature: number[]; heatCapacity: number[]; line: number[]; reduced: boolean; total: number };
}

interface Entry {
  file: File;
  label: string;
  preview: Preview | null;
  error: string | null;
}

interface Outcome {
  fileName: string;
  ok: boolean;
  text: string;
  id?: string;
  label?: string;
  warnings?: string[];
}

/** Files share a layout when they have the same columns (count, names, units) in the same order. */
function layoutKey(p: Preview): string {
  return JSON.stringify(p.columns.map((c) => [c.name, c.unitText]));
}

export function ImportPanel({ apiBase, measurementPath, heatCapacityUnits }: { apiBase: string; measurementPath: string; heatCapacityUnits: string[] }) {
  const router = useRouter();
  const [entries, setEntries] = useState<Entry[]>([]);
  const [delimiter, setDelimiter] = useState("auto");
  const [decimalComma, setDecimalComma] = useState("auto");
  const [mapping, setMapping] = useState<MappingState | null>(null);
  const [active, setActive] = useState(0);
  const [error, setError] = useState<string | null>(null);
  const [outcomes, setOutcomes] = useState<Outcome[]>([]);
  const [busy, setBusy] = useState<"preview" | "store" | null>(null);
  const roleKey = useRef("");

  const parse = { delimiter, decimalComma: decimalComma === "auto" ? "auto" : decimalComma === "yes" };
  const previews = entries.map((e) => e.preview).filter((p): p is Preview => p !== null);
  const shared = previews.length === entries.length && new Set(previews.map(layoutKey)).size === 1;
  const current = entries[active]?.preview ?? null;

  async function previewOne(file: File, roles?: MappingState): Promise<Pick<Entry, "preview" | "error">> {
    const body: Record<string, unknown> = { parse };
    if (roles && roles.temperature !== "" && roles.heatCapacity !== "" && roles.temperature !== roles.heatCapacity) {
      body.mapping = {
        temperature: Number(roles.temperature), heatCapacity: Number(roles.heatCapacity),
        ...(roles.sigma !== "" && roles.sigma !== roles.temperature && roles.sigma !== roles.heatCapacity ? { sigma: Number(roles.sigma) } : {}),
      };
    }
    const res = await callUpload<{ preview: Preview }>(`${apiBase}/imports`, file, body);
    return res.ok && res.data ? { preview: res.data.preview, error: null } : { preview: null, error: res.error };
  }

  async function read(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (entries.length === 0) return setError("choose one or more files first");
    setBusy("preview");
    setError(null);
    setOutcomes([]);
    const next: Entry[] = [];
    for (const entry of entries) next.push({ ...entry, ...(await previewOne(entry.file)) });
    setBusy(null);
    setEntries(next);
    const first = next.findIndex((x) => x.preview);
    setActive(Math.max(0, first));
    const p = first >= 0 ? next[first]!.preview! : null;
    const m = p ? initialMapping(p, heatCapacityUnits) : null;
    roleKey.current = m ? rolesKey(m) : "";
    setMapping(m);
  }

  // When the T, C or σ column changes, read the files again so the checks and the curve follow.
  useEffect(() => {
    if (!mapping || busy) return;
    const key = rolesKey(mapping);
    if (key === roleKey.current) return;
    roleKey.current = key;
    const timer = setTimeout(() => {
      void (async () => {
        const next: Entry[] = [];
        for (const entry of entries) next.push(entry.preview ? { ...entry, ...(await previewOne(entry.file, mapping)) } : entry);
        setEntries(next);
      })();
    }, 250);
    return () => clearTimeout(timer);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [mapping]);

  async function store() {
    if (!mapping) return;
    const targets = shared ? entries : entries.filter((_, i) => i === active);
    const blocked = targets.find((t) => !t.preview || t.preview.ambiguity);
    if (blocked) return setError(`${blocked.file.name}: ${blocked.preview?.ambiguity ? "reads two ways — choose the delimiter and decimal mark, then read again" : blocked.error ?? "not read"}`);
    setBusy("store");
    setError(null);
    const done: Outcome[] = [];
    for (const t of targets) {
      const payload = mappingPayload({ ...mapping, label: targets.length > 1 ? t.label : mapping.label });
      if (typeof payload === "string") {
        setBusy(null);
        return setError(payload);
      }
      const res = await callUpload<{ measurement: { id: string; label: string; pointCount: number; warnings?: string[] } }>(`${apiBase}/measurements`, t.file, { ...payload, parse });
      if (res.ok && res.data) {
        const m = res.data.measurement;
        done.push({ fileName: t.file.name, ok: true, id: m.id, label: m.label, text: `${m.pointCount} points`, warnings: m.warnings ?? [] });
      } else done.push({ fileName: t.file.name, ok: false, text: res.error ?? "refused" });
    }
    setBusy(null);
    setOutcomes(done);
    const storedNames = new Set(done.filter((d) => d.ok).map((d) => d.fileName));
    const left = entries.filter((e) => !storedNames.has(e.file.name));
    setEntries(left);
    setActive(0);
    if (left.length === 0) setMapping(null);
    router.refresh();
  }

  function choose(files: FileList | null) {
    const list = files ? [...files] : [];
    setEntries(list.map((file) => ({ file, label: file.name.replace(/\.[A-Za-z0-9]{1,5}$/, ""), preview: null, error: null })));
    setMapping(null);
    setError(null);
    setActive(0);
  }

  const storedCount = outcomes.filter((o) => o.ok).length;
  const refusedCount = outcomes.length - storedCount;

  return (
    <div className="stack" data-testid="import-panel">
      <form className="inline-form" onSubmit={read}>
        <div className="field">
          <label htmlFor="import-file">Data files</label>
          <input id="import-file" type="file" multiple accept=".txt,.csv,.tsv,.dat,.dta,text/*" onChange={(e) => choose(e.target.files)} />
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
        <button type="submit" disabled={entries.length === 0 || busy !== null}>
          {busy === "preview" ? "Reading…" : previews.length ? "Read again" : entries.length > 1 ? `Read ${entries.length} files` : "Read file"}
        </button>
      </form>
      <p className="small muted">Reading shows what Heatbook found in each file. Nothing is stored until you press “Store”.</p>
      {error && <p className="form-error" role="alert" data-testid="import-error">{error}</p>}
      {outcomes.length > 0 && (
        <div className={refusedCount ? "notice-info" : "notice-ok"} role="status" data-testid="import-summary">
          <strong>{storedCount} stored{refusedCount ? `, ${refusedCount} refused` : ""}.</strong>
          <ul className="plain">
            {outcomes.map((o) => (
              <li key={o.fileName}>
                {o.ok ? "✓ " : "✕ "}
                {o.ok && o.id ? <Link href={`${measurementPath}/${o.id}`}>{o.label}</Link> : o.fileName}: {o.text}
                {o.warnings && o.warnings.length > 0 && <span className="small"> — note: {o.warnings.join("; ")}</span>}
              </li>
            ))}
          </ul>
        </div>
      )}
      {entries.length > 1 && previews.length > 0 && (
        <div data-testid="import-files">
          <p className="small">
            {shared
              ? `All ${entries.length} files have the same columns: the mapping below is used for all of them, each stored in its own transaction.`
              : "These files do not all have the same columns: map and store them one at a time (the selected file is stored)."}
          </p>
          <table className="preview-table">
            <thead><tr><th>file</th><th>rows</th><th>found</th><th>label</th></tr></thead>
            <tbody>
              {entries.map((e, i) => (
                <tr key={e.file.name} className={i === active ? "selected" : undefined}>
                  <td><button type="button" className="link" onClick={() => setActive(i)} aria-pressed={i === active}>{e.file.name}</button></td>
                  <td className="num">{e.preview ? e.preview.rowCount : "—"}</td>
                  <td>{e.error ? <span className="field-error">{e.error}</span> : e.preview?.ambiguity ? "reads two ways" : fileFindings(e.preview)}</td>
                  <td>
                    <input aria-label={`label for ${e.file.name}`} type="text" value={e.label} disabled={!shared}
                      onChange={(ev) => setEntries(entries.map((x, k) => (k === i ? { ...x, label: ev.target.value } : x)))} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {entries.length === 1 && entries[0]!.error && !current && <p className="form-error" role="alert" data-testid="import-error">{entries[0]!.error}</p>}
      {current && mapping && (
        <>
          <div className="notice-info" data-testid="import-detected">
            <strong>{current.fileName}</strong> ({current.rowCount} data rows): delimiter {DELIMITER_NAMES[current.delimiter] ?? current.delimiter}, decimal{" "}
            {current.decimalComma ? "comma" : "point"}, {current.headerLine ? `column names on line ${current.headerLine}` : "no header line found"}.
          </div>
          {current.ambiguity && (
            <div className="form-error" role="alert" data-testid="import-ambiguity">
              <strong>This file reads two ways (line {current.ambiguity.line}).</strong> {capitalise(current.ambiguity.message)}. Choose the delimiter and the
              decimal mark above and press “Read again”; nothing can be stored until then.
            </div>
          )}
          {current.issueCount > 0 && (
            <div>
              <h4 className="subhead">{current.issueCount} line{current.issueCount === 1 ? "" : "s"} with problems in the file</h4>
              <ul className="issues" data-testid="import-issues">
                {current.issues.map((i, k) => (
                  <li key={k}>line {i.line}, column {i.column}{i.field ? ` (${i.field})` : ""}: {i.message}</li>
                ))}
                {current.issueCount > current.issues.length && <li>… and {current.issueCount - current.issues.length} more</li>}
              </ul>
            </div>
          )}
          {current.checks && <ImportChecks checks={current.checks} />}
          {current.preamble.length > 0 && (
            <details>
              <summary className="small">Lines before the data ({current.preamble.length})</summary>
              <pre className="small mono" style={{ whiteSpace: "pre-wrap" }}>{current.preamble.join("\n")}</pre>
            </details>
          )}
          <ImportPreviewTable preview={current} roles={rolesOf(mapping)} />
          <ImportMapping preview={current} state={mapping} onChange={setMapping} heatCapacityUnits={heatCapacityUnits} batch={entries.length > 1 && shared} />
          {current.checks && current.checks.validCount > 0 && (
            <ImportCurve curve={current.checks.curve} units={{ temperature: mapping.tUnit, heatCapacity: mapping.cUnit || "file unit" }} />
          )}
          <div className="actions">
            <button type="button" onClick={() => void store()} disabled={busy !== null || Boolean(current.ambiguity)} data-testid="store-measurement">
              {busy === "store" ? "Storing…" : entries.length > 1 && shared ? `Store ${entries.length} measurements` : "Store measurement"}
            </button>
            <button type="button" className="quiet" onClick={() => { setEntries([]); setMapping(null); }}>Discard</button>
          </div>
        </>
      )}
    </div>
  );
}

function fileFindings(p: Preview | null): string {
  if (!p) return "—";
  const c = p.checks;
  const parts: string[] = [];
  if (c && c.invalidCount) parts.push(`${c.invalidCount} invalid row${c.invalidCount === 1 ? "" : "s"}`);
  if (c && c.temperatures.duplicateCount) parts.push(`${c.temperatures.duplicateCount} repeated T`);
  if (c && c.temperatures.decreasingCount) parts.push(`${c.temperatures.decreasingCount} decreasing T`);
  return parts.length ? parts.join(", ") : "no problems";
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function rolesKey(m: MappingState): string {
  return `${m.temperature}|${m.heatCapacity}|${m.sigma}`;
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
