"use client";
/** Create an analysis (sample, title, starting chain) and the row actions: rename, duplicate, archive/restore. */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError, invalidProps } from "@/app/components/FieldError";

export function CreateAnalysisForm({ api, basePath, samples, initialSampleId }: { api: string; basePath: string; samples: { id: string; label: string }[]; initialSampleId: string | null }) {
  const router = useRouter();
  const [sampleId, setSampleId] = useState(initialSampleId ?? samples[0]?.id ?? "");
  const [title, setTitle] = useState("");
  const [starter, setStarter] = useState<"standard" | "empty">("standard");
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    const res = await callJson<{ analysis: { id: string } }>(api, "POST", { sampleId, title, starter });
    setBusy(false);
    setResult(res);
    if (res.ok) router.push(`${basePath}/${res.data!.analysis.id}`);
  }
  if (samples.length === 0) return <p className="muted">Add a sample first.</p>;
  return (
    <form className="inline-form" onSubmit={submit} data-testid="create-analysis">
      <div className="field">
        <label htmlFor="new-sample">Sample</label>
        <select id="new-sample" {...invalidProps("new-sample", errorFor(result, "sampleId"))} value={sampleId} onChange={(e) => setSampleId(e.target.value)}>{samples.map((s) => <option key={s.id} value={s.id}>{s.label}</option>)}</select>
        <FieldError id="new-sample-error" message={errorFor(result, "sampleId")} />
      </div>
      <div className="field">
        <label htmlFor="new-title">Title</label>
        <input id="new-title" {...invalidProps("new-title", errorFor(result, "title"))} type="text" value={title} onChange={(e) => setTitle(e.target.value)} placeholder="γ and ΘD from the 0 T curve" size={34} />
        <FieldError id="new-title-error" message={errorFor(result, "title")} />
      </div>
      <div className="field">
        <label htmlFor="new-starter">Start with</label>
        <select id="new-starter" value={starter} onChange={(e) => setStarter(e.target.value as "standard" | "empty")}>
          <option value="standard">data → addenda → per mole → fit → derived</option>
          <option value="empty">no steps</option>
        </select>
      </div>
      <button type="submit" disabled={busy}>{busy ? "Creating…" : "Create analysis"}</button>
      {result && !result.ok && !result.field && <p className="form-error" role="alert">{result.error}</p>}
    </form>
  );
}

export function AnalysisActions({ api, title, archived, basePath }: { api: string; title: string; archived: boolean; basePath: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function act(run: () => Promise<ApiResult<unknown>>, after?: (r: ApiResult<unknown>) => void) {
    const r = await run();
    if (!r.ok) return setError(r.error);
    setError(null);
    after ? after(r) : router.refresh();
  }
  return (
    <div className="actions nb-row-actions">
      <button type="button" className="quiet small" onClick={() => { const t = window.prompt("New title", title); if (t && t.trim() && t !== title) void act(() => callJson(api, "PATCH", { title: t })); }}>Rename</button>
      <button type="button" className="quiet small" onClick={() => { const t = window.prompt("Title of the copy", `${title} (copy)`); if (t && t.trim()) void act(() => callJson<{ analysis: { id: string } }>(api, "POST", { action: "duplicate", title: t }), (r) => router.push(`${basePath}/${(r.data as { analysis: { id: string } }).analysis.id}`)); }}>Duplicate</button>
      <button type="button" className="quiet small" onClick={() => void act(() => callJson(api, "POST", { action: "archive", archived: !archived }))}>{archived ? "Restore" : "Archive"}</button>
      {error && <span className="field-error">{error}</span>}
    </div>
  );
}
