"use client";
/** Create a sample (POST .../samples); shows the molar mass and atoms per f.u. the server computed. */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor } from "@/app/_lib/api";
import { DraftError, EMPTY_DRAFT, payloadOf, type SampleDraft } from "@/app/_lib/sampleDraft";
import { fmtNumber } from "@/app/_lib/format";
import { isSampleField, SampleFields } from "./SampleFields";

interface Created {
  sample: { id: string; label: string; formula: string; molarMassGPerMol: number; atomsPerFormulaUnit: number };
}

export function SampleCreateForm({ apiBase, samplePath }: { apiBase: string; samplePath: string }) {
  const router = useRouter();
  const [draft, setDraft] = useState<SampleDraft>(EMPTY_DRAFT);
  const [error, setError] = useState<{ message: string; field: string | null } | null>(null);
  const [created, setCreated] = useState<Created["sample"] | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setError(null);
    let payload;
    try {
      payload = payloadOf(draft);
    } catch (err) {
      if (err instanceof DraftError) return setError({ message: err.message, field: err.field });
      throw err;
    }
    setBusy(true);
    const res = await callJson<Created>(`${apiBase}/samples`, "POST", payload);
    setBusy(false);
    if (!res.ok || !res.data) return setError({ message: res.error ?? "failed", field: res.field });
    setCreated(res.data.sample);
    setDraft(EMPTY_DRAFT);
    router.refresh();
  }

  const errorOf = (field: string) => (error ? errorFor({ error: error.message, field: error.field }, field) : null);
  const general = error && !isSampleField(error.field) ? error.message : null;
  return (
    <form className="stack" onSubmit={submit} noValidate data-testid="sample-create">
      <SampleFields idPrefix="new-sample" draft={draft} onChange={setDraft} errorOf={errorOf} />
      {general && <p className="form-error" role="alert">{general}</p>}
      {created && (
        <p className="notice-ok" role="status">
          Added <Link href={`${samplePath}/${created.id}`}>{created.label}</Link> ({created.formula}): molar mass {fmtNumber(created.molarMassGPerMol, 7)} g/mol,{" "}
          {fmtNumber(created.atomsPerFormulaUnit, 6)} {created.atomsPerFormulaUnit === 1 ? "atom" : "atoms"} per formula unit.
        </p>
      )}
      <div className="actions">
        <button type="submit" disabled={busy}>{busy ? "Adding…" : "Add sample"}</button>
      </div>
    </form>
  );
}
