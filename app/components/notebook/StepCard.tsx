"use client";
/**
 * One physics step in the chain: its kind and summary, whether its output is current, warnings,
 * the result, the configuration form, and (when the revision is editable) move / remove / add
 * below. Saving sends the version the form was opened on; if someone saved the step meanwhile
 * the server answers 409 with the newer step, shown beside the typed values, which stay put.
 */
import { useState } from "react";
import { callJson } from "@/app/_lib/api";
import { when } from "./display";
import { Sym } from "../Sym";
import { cleanText } from "@/lib/display";
import { kindLabel, stepUi } from "./registry";
import { FieldFault } from "./steps/ui";
import { AddStep } from "./AddStep";
import type { NotebookContext, StepView } from "./types";

interface Props {
  step: StepView;
  first: boolean;
  last: boolean;
  ctx: NotebookContext;
  noteHtml: string | null;
  basisAbove: "formula-unit" | "atom" | undefined;
}

type Draft = Record<string, unknown>;

/**
 * An engine sentence with its symbols typeset (H_c2, T_c, χ²_red), as the report does; a
 * sentence that quotes the user's own text (a model name, an expression) is shown as written.
 */
function engineText(text: string) {
  return /["“”'`]/.test(text) ? text : <Sym m={cleanText(text)} />;
}

interface Conflict {
  message: string;
  current: { version: number; title: string; config: Draft } | null;
}

function changedKeys(a: Draft, b: Draft): string[] {
  return [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => JSON.stringify(a[k] ?? null) !== JSON.stringify(b[k] ?? null));
}

const show = (v: unknown) => (v === null || v === undefined ? "—" : typeof v === "object" ? JSON.stringify(v) : String(v));

function NewerValues({ mine, theirs, note, onKeep, onTake }: { mine: Draft; theirs: Draft; note: string; onKeep: () => void; onTake: () => void }) {
  const keys = changedKeys(mine, theirs);
  return (
    <div className="nb-conflict" role="alert" data-testid="step-conflict">
      <p><strong>{note}</strong></p>
      {keys.length > 0 ? (
        <table className="nb-compact"><thead><tr><th>Setting</th><th>Your value</th><th>Newer saved value</th></tr></thead>
          <tbody>{keys.map((k) => <tr key={k}><td className="mono">{k}</td><td className="mono">{show(mine[k])}</td><td className="mono">{show(theirs[k])}</td></tr>)}</tbody></table>
      ) : <p className="small">The newer version has the same settings as your form.</p>}
      <div className="actions">
        <button type="button" className="small" onClick={onKeep}>Keep my values (save over the newer version)</button>
        <button type="button" className="quiet small" onClick={onTake}>Take the newer values</button>
      </div>
    </div>
  );
}

export function StepCard({ step, first, last, ctx, noteHtml, basisAbove }: Props) {
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(step.config);
  const [title, setTitle] = useState(step.title);
  const [base, setBase] = useState<{ version: number; config: Draft }>({ version: step.version, config: step.config });
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  /** The configuration field the server refused on the last save ("config.tMinK" → "tMinK"). */
  const [saveFault, setSaveFault] = useState<{ field: string; message: string } | null>(null);
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const url = `${ctx.apiBase}/analyses/${ctx.analysisId}/steps/${step.id}`;
  const threads = ctx.threads.filter((t) => t.stepId === step.id);
  const openThreads = threads.filter((t) => t.state === "open").length;

  function openForm() {
    setDraft(step.config);
    setTitle(step.title);
    setBase({ version: step.version, config: step.config });
    setConflict(null);
    setError(null);
    setOpen(true);
  }

  /** PATCH a configuration against `version`; true when saved. */
  async function patch(config: Draft, version: number, newTitle?: string): Promise<boolean> {
    setBusy(true);
    setError(null);
    setSaveFault(null);
    const res = await callJson<{ version: number }>(url, "PATCH", { version, config, ...(newTitle !== undefined ? { title: newTitle } : {}) });
    setBusy(false);
    if (res.ok) {
      setConflict(null);
      await ctx.refresh();
      return true;
    }
    if (res.status === 409) {
      const cur = res.current as { version: number; title: string; config: Draft } | undefined;
      setConflict({ message: res.error ?? "conflict", current: cur ?? null });
      if (!open) {
        setDraft(config);
        setBase({ version, config: step.config });
        setOpen(true);
      }
      return false;
    }
    const field = res.field?.startsWith("config.") ? res.field.slice("config.".length) : null;
    setSaveFault(field ? { field, message: res.error ?? "not accepted" } : null);
    setError(field ? `Not saved: ${res.error} (the marked setting)` : res.field ? `${res.field}: ${res.error}` : res.error);
    return false;
  }

  async function saveForm() {
    if (await patch(draft, base.version, title)) setOpen(false);
  }

  /** Direct saves from the charts (a brushed window, a point left out). */
  const saveDirect = (config: Draft) => (open ? (setDraft(config), Promise.resolve(true)) : patch(config, step.version));

  async function move(delta: number) {
    const res = await callJson(`${url}`, "POST", { action: "move", position: step.position + delta, revisionVersion: ctx.revisionVersion });
    if (!res.ok) setError(res.error);
    await ctx.refresh();
  }

  async function remove() {
    if (!window.confirm(`Remove the step "${step.title || kindLabel(step.kind)}"? Steps below it are recomputed without it.`)) return;
    const res = await callJson(`${url}?revisionVersion=${ctx.revisionVersion}`, "DELETE");
    if (!res.ok) setError(res.error);
    await ctx.refresh();
  }

  const o = step.output;
  const ui = stepUi(step.kind);
  const summary = o?.ok && ui ? ui.summary(o.result as never, step) : null;
  const label = kindLabel(step.kind);
  // The field the computation (or the last save) named as wrong: the form marks it.
  const fault = saveFault ?? (o && !o.ok && o.field ? { field: o.field, message: o.error ?? "" } : null);
  const changedMeanwhile = open && !conflict && step.version !== base.version;
  return (
    <article className={`nb-step nb-kind-${step.kind}`} id={`step-${step.id}`} data-testid={`step-${step.kind}`} aria-labelledby={`h-${step.id}`}>
      <header className="nb-step-head">
        <div>
          <span className="nb-kind">{label}</span>
          <h3 id={`h-${step.id}`}>{step.title || label}</h3>
          {summary && <p className="nb-summary" data-testid="step-summary">{ui?.typesetSummary ? <Sym m={summary} /> : summary}</p>}
        </div>
        <div className="nb-step-meta">
          <span className={step.fresh ? "nb-fresh" : "nb-stale"} title={step.computedAt ? `computed ${when(step.computedAt)}` : undefined}>
            {step.fresh ? `computed with engine ${step.engineVersion ?? "?"}` : ctx.editable ? "recomputing…" : "inputs changed since computed"}
          </span>
          {threads.length > 0 && <a href={`#threads-${step.id}`} className="small">{threads.length} discussion{threads.length > 1 ? "s" : ""}{openThreads ? ` (${openThreads} open)` : ""}</a>}
        </div>
      </header>
      {o && !o.ok && (
        <div className="nb-error" role="alert">
          <strong>Not computed:</strong> {engineText(o.error ?? "")}
          {o.field && ctx.editable && !open && <> <button type="button" className="quiet small" onClick={openForm} data-testid="show-fault">Show the setting</button></>}
        </div>
      )}
      {o && o.warnings.length > 0 && (
        <ul className="nb-warnings" aria-label="Warnings">{o.warnings.map((w, i) => <li key={i}>{engineText(w)}</li>)}</ul>
      )}
      {o?.ok && ui && <ui.View step={step} result={o.result as never} ctx={ctx} save={saveDirect} basisAbove={basisAbove} noteHtml={noteHtml} />}
      {error && <p className="form-error" role="alert">{error}</p>}
      {conflict && !open && <p className="form-error" role="alert">{conflict.message}</p>}
      {open && (
        <form className="nb-form" onSubmit={(e) => { e.preventDefault(); void saveForm(); }} aria-label={`Settings of ${label}`}>
          {conflict && conflict.current && (
            <NewerValues mine={draft} theirs={conflict.current.config} note={`${conflict.message}`}
              onKeep={() => { setBase({ version: conflict.current!.version, config: conflict.current!.config }); setConflict(null); }}
              onTake={() => { setDraft(conflict.current!.config); setTitle(conflict.current!.title); setBase({ version: conflict.current!.version, config: conflict.current!.config }); setConflict(null); }} />
          )}
          {changedMeanwhile && (
            <NewerValues mine={draft} theirs={step.config} note="This step changed meanwhile (saved by someone else). Your typed values are kept below."
              onKeep={() => setBase({ version: step.version, config: step.config })}
              onTake={() => { setDraft(step.config); setTitle(step.title); setBase({ version: step.version, config: step.config }); }} />
          )}
          <div className="grid-form">
            <div className="field wide">
              <label htmlFor={`title-${step.id}`}>Heading <span className="muted">(optional)</span></label>
              <input id={`title-${step.id}`} type="text" value={title} maxLength={160} onChange={(e) => setTitle(e.target.value)} placeholder={label} />
            </div>
            <FieldFault.Provider value={{ field: fault?.field ?? null, message: fault?.message ?? null }}>
              {ui?.Form ? <ui.Form step={step} draft={draft as never} set={(p) => setDraft((d) => ({ ...d, ...p }))} ctx={ctx} /> : <p className="muted">No settings for {label}.</p>}
            </FieldFault.Provider>
          </div>
          <div className="actions">
            <button type="submit" disabled={busy} data-testid="save-step">{busy ? "Saving…" : "Save and recompute"}</button>
            <button type="button" className="quiet" onClick={() => { setOpen(false); setConflict(null); }}>Close without saving</button>
          </div>
        </form>
      )}
      <footer className="nb-step-foot">
        {ctx.editable && !open && <button type="button" className="quiet small" onClick={openForm} data-testid="edit-step">Settings</button>}
        {ctx.canComment && <button type="button" className="quiet small" onClick={() => ctx.startThread(step.id, null)}>Comment on this step</button>}
        {ctx.editable && (
          <>
            <span className="nb-foot-gap" />
            <button type="button" className="quiet small" disabled={first} onClick={() => move(-1)} aria-label="Move this step up">Move up</button>
            <button type="button" className="quiet small" disabled={last} onClick={() => move(1)} aria-label="Move this step down">Move down</button>
            <button type="button" className="danger small" onClick={remove}>Remove</button>
            <AddStep ctx={ctx} position={step.position + 1} label="Add step below" />
          </>
        )}
      </footer>
    </article>
  );
}
