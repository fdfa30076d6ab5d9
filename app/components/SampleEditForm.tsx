"use client";
/**
 * Edit a sample (PATCH with `version`). When someone else saved first (409) the server's current
 * values are shown beside ours, and the user chooses: take theirs, or keep editing ours on top of
 * their version (the next save then overwrites theirs knowingly).
 */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor } from "@/app/_lib/api";
import { DraftError, draftOf, payloadOf, type SampleDraft, type SampleLike } from "@/app/_lib/sampleDraft";
import { fmtNumber } from "@/app/_lib/format";
import { isSampleField, SampleFields } from "./SampleFields";

interface Versioned extends SampleLike {
  version: number;
  molarMassGPerMol: number;
  atomsPerFormulaUnit: number;
}

const SHOWN: { key: keyof SampleDraft; label: string }[] = [
  { key: "label", label: "Label" }, { key: "formula", label: "Formula" }, { key: "massMg", label: "Mass (mg)" },
  { key: "densityGPerCm3", label: "Density (g/cm³)" }, { key: "compositionVariable", label: "Composition variable" },
  { key: "compositionValue", label: "Composition value" }, { key: "seriesLabel", label: "Series label" },
  { key: "valences", label: "Valences" }, { key: "tags", label: "Tags" }, { key: "notes", label: "Notes" },
];

export function SampleEditForm({ apiUrl, sample }: { apiUrl: string; sample: Versioned }) {
  const router = useRouter();
  const [draft, setDraft] = useState<SampleDraft>(draftOf(sample));
  const [version, setVersion] = useState(sample.version);
  const [error, setError] = useState<{ message: string; field: string | null } | null>(null);
  const [theirs, setTheirs] = useState<Versioned | null>(null);
  const [saved, setSaved] = useState<Versioned | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setError(null);
    setSaved(null);
    let payload;
    try {
      payload = { ...payloadOf(draft), version };
    } catch (err) {
      if (err instanceof DraftError) return setError({ message: err.message, field: err.field });
      throw err;
    }
    setBusy(true);
    const res = await callJson<{ sample: Versioned }>(apiUrl, "PATCH", payload);
    setBusy(false);
    if (res.status === 409 && res.current) {
      setTheirs(res.current as Versioned);
      return;
    }
    if (!res.ok || !res.data) return setError({ message: res.error ?? "failed", field: res.field });
    setTheirs(null);
    setVersion(res.data.sample.version);
    setDraft(draftOf(res.data.sample));
    setSaved(res.data.sample);
    router.refresh();
  }

  const errorOf = (field: string) => (error ? errorFor({ error: error.message, field: error.field }, field) : null);
  const general = error && !isSampleField(error.field) ? error.message : null;
  const theirDraft = theirs ? draftOf(theirs) : null;
  return (
    <form className="stack" onSubmit={submit} noValidate data-testid="sample-edit">
      {theirs && theirDraft && (
        <div className="notice-error" role="alert" data-testid="edit-conflict">
          <p style={{ marginTop: 0 }}><strong>Someone else saved first.</strong> Your changes were not applied. Their values (version {theirs.version}) beside yours:</p>
          <div className="compare">
            <span className="head">Field</span><span className="head">Theirs (saved)</span><span className="head">Yours (not saved)</span>
            {SHOWN.map((f) => (
              <FragmentRow key={f.key} label={f.label} theirs={theirDraft[f.key]} yours={draft[f.key]} />
            ))}
          </div>
          <div className="actions" style={{ marginTop: "0.6rem" }}>
            <button type="button" className="quiet" onClick={() => { setDraft(theirDraft); setVersion(theirs.version); setTheirs(null); }}>Take their version</button>
            <button type="button" className="quiet" onClick={() => { setVersion(theirs.version); setTheirs(null); }}>Keep mine, then save over theirs</button>
          </div>
        </div>
      )}
      <SampleFields idPrefix="edit-sample" draft={draft} onChange={setDraft} errorOf={errorOf} />
      {general && <p className="form-error" role="alert">{general}</p>}
      {saved && (
        <p className="notice-ok" role="status">
          Saved (version {saved.version}). Molar mass {fmtNumber(saved.molarMassGPerMol, 7)} g mol⁻¹, {fmtNumber(saved.atomsPerFormulaUnit, 6)} {saved.atomsPerFormulaUnit === 1 ? "atom" : "atoms"} per formula unit.
        </p>
      )}
      <div className="actions">
        <button type="submit" disabled={busy || !!theirs}>{busy ? "Saving…" : "Save changes"}</button>
        <button type="button" className="quiet" onClick={() => { setDraft(draftOf(sample)); setError(null); }}>Undo my edits</button>
      </div>
    </form>
  );
}

function FragmentRow({ label, theirs, yours }: { label: string; theirs: string; yours: string }) {
  const differs = theirs !== yours;
  return (
    <>
      <span>{label}</span>
      <span style={differs ? { fontWeight: 600 } : undefined}>{theirs || "—"}</span>
      <span className={differs ? undefined : "muted"}>{yours || "—"}</span>
    </>
  );
}
