"use client";
/** Start a composition series: name, composition variable, member samples (POST .../series). */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError } from "@/app/components/FieldError";

interface Props {
  apiBase: string;
  seriesBase: string;
  samples: { id: string; label: string; formula: string }[];
}

export function SeriesCreateForm({ apiBase, seriesBase, samples }: Props) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [variable, setVariable] = useState("x");
  const [description, setDescription] = useState("");
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    const r = await callJson<{ series: { id: string } }>(`${apiBase}/series`, "POST", { name, compositionVariable: variable, description, sampleIds: [...chosen] });
    setBusy(false);
    setResult(r);
    if (r.ok && r.data) router.push(`${seriesBase}/${r.data.series.id}`);
  }

  const toggle = (id: string) => setChosen((s) => { const n = new Set(s); if (n.has(id)) n.delete(id); else n.add(id); return n; });
  return (
    <form className="stack" onSubmit={submit} data-testid="series-create">
      <div className="grid-form">
        <div className="field"><label htmlFor="series-name">Name</label><input id="series-name" type="text" value={name} onChange={(e) => setName(e.target.value)} required aria-invalid={!!errorFor(result, "name")} /><FieldError id="series-name-error" message={errorFor(result, "name")} /></div>
        <div className="field"><label htmlFor="series-var">Composition variable</label><input id="series-var" type="text" value={variable} onChange={(e) => setVariable(e.target.value)} /><span className="hint">e.g. x in A₁₋ₓBₓ; each sample&apos;s value is set on the sample</span></div>
        <div className="field wide"><label htmlFor="series-desc">Description</label><input id="series-desc" type="text" value={description} onChange={(e) => setDescription(e.target.value)} /></div>
      </div>
      <fieldset className="field">
        <legend className="label">Samples ({chosen.size} chosen)</legend>
        <div className="grid-form">
          {samples.map((s) => <label key={s.id} className="checkbox"><input type="checkbox" checked={chosen.has(s.id)} onChange={() => toggle(s.id)} /> {s.label} <span className="muted small">{s.formula}</span></label>)}
        </div>
        <FieldError id="series-samples-error" message={errorFor(result, "sampleIds")} />
      </fieldset>
      {result && !result.ok && !result.field && <p className="form-error" role="alert">{result.error}</p>}
      <div className="actions"><button type="submit" disabled={busy || !name.trim()}>Create the series</button></div>
    </form>
  );
}
