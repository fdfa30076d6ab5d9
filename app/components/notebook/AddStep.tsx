"use client";
/** "Add step below": choose a kind, the server adds it with its defaults at that position. */
import { useId, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { STEP_UI, kindLabel } from "./registry";
import { plainSymbol } from "@/lib/display";
import type { NotebookContext } from "./types";
import type { StepKind } from "@/lib/engine/notebook/registry";

/** Every kind, in the client registry's order. */
const KINDS = Object.keys(STEP_UI) as StepKind[];

export function AddStep({ ctx, position, label }: { ctx: NotebookContext; position: number; label: string }) {
  const id = useId();
  const [open, setOpen] = useState(false);
  const [kind, setKind] = useState<string>("fit");
  const [error, setError] = useState<string | null>(null);
  async function add() {
    const res = await callJson(`${ctx.apiBase}/analyses/${ctx.analysisId}/steps`, "POST", { revisionId: ctx.revisionId, revisionVersion: ctx.revisionVersion, kind, position });
    if (!res.ok) { setError(res.error); return; }
    setOpen(false);
    setError(null);
    await ctx.refresh();
  }
  if (!open) return <button type="button" className="quiet small" onClick={() => setOpen(true)}>{label}</button>;
  return (
    <span className="nb-add">
      <label htmlFor={id} className="sr-only">Kind of step</label>
      <select id={id} value={kind} onChange={(e) => setKind(e.target.value)} data-testid="add-step-kind">
        {KINDS.map((k) => <option key={k} value={k}>{kindLabel(k)} — {plainSymbol(STEP_UI[k].hint)}</option>)}
      </select>
      <button type="button" className="small" onClick={add} data-testid="add-step">Add</button>
      <button type="button" className="quiet small" onClick={() => setOpen(false)}>Cancel</button>
      {error && <span className="field-error">{error}</span>}
    </span>
  );
}
