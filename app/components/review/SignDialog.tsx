"use client";
/**
 * The approval confirmation: exactly what would be sealed (sample, data files with SHA-256,
 * model, window, key numbers with σ, derived quantities), the statement of meaning the reviewer
 * chooses, a required note, the discussion threads still open (each must be ticked to
 * acknowledge it, or resolved first), and the reviewer's password — all sent in one request;
 * the server checks every part again and seals nothing when one is missing or wrong.
 * Also the smaller confirmation for sending a revision for review.
 */
import { useEffect, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { fmtNumber } from "@/app/_lib/format";
import type { SealPreview } from "@/lib/server/review";
import { valueText } from "./units";
import { MODELS } from "@/lib/engine/models";

interface SignProps {
  apiBase: string;
  revision: { id: string; number: number; version: number };
  onDone: () => void;
  onCancel: () => void;
}

const MODEL_TEXT = MODELS as Record<string, { title: string; formula: string }>;

export function SignDialog({ apiBase, revision, onDone, onCancel }: SignProps) {
  const [preview, setPreview] = useState<SealPreview | null>(null);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [meaning, setMeaning] = useState<string>("");
  const [note, setNote] = useState("");
  const [password, setPassword] = useState("");
  const [acked, setAcked] = useState<Set<string>>(new Set());
  const [error, setError] = useState<{ text: string; field: string | null } | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    void (async () => {
      const r = await callJson<{ preview: SealPreview }>(`${apiBase}/review/preview?revision=${encodeURIComponent(revision.id)}`, "GET");
      if (r.ok) setPreview(r.data!.preview);
      else setLoadError(r.error);
    })();
  }, [apiBase, revision.id]);

  const allAcked = !!preview && preview.openThreads.every((t) => acked.has(t.id));
  const ready = !!preview && !!meaning && !!note.trim() && (preview.identity !== "password" || !!password) && allAcked;

  async function sign(e: React.FormEvent) {
    e.preventDefault();
    if (!preview) return;
    setBusy(true);
    setError(null);
    const r = await callJson(`${apiBase}/review`, "POST", {
      revisionId: revision.id, action: "approve", version: revision.version, meaning, comment: note.trim(),
      ...(preview.identity === "password" ? { password } : {}), acknowledgedThreadIds: [...acked],
    });
    setBusy(false);
    if (!r.ok) { setError({ text: r.error ?? "refused", field: r.field }); if (r.field === "password") setPassword(""); return; }
    onDone();
  }

  const statement = preview?.meanings.find((m) => m.key === meaning)?.statement ?? null;
  return (
    <div className="rv-modal" role="dialog" aria-modal="true" aria-labelledby="rv-sign-title" data-testid="sign-dialog">
      <form className="rv-modal-sheet" onSubmit={sign}>
        <h2 id="rv-sign-title">Approve and seal revision {revision.number}</h2>
        {loadError && <p className="form-error" role="alert">{loadError}</p>}
        {!preview && !loadError && <p className="muted small">Reading what would be sealed…</p>}
        {preview && (
          <>
            <p className="small muted">Sealing locks exactly this. Your signature, with the meaning and note below, becomes part of the sealed record, the audit trail, the report and the PDF.</p>
            <section className="rv-sealwhat" data-testid="sign-what">
              <h3>What is sealed</h3>
              <dl className="rv-lock-facts">
                <dt>Sample</dt>
                <dd>{preview.report.sample.label}: {preview.report.sample.formula}, M = {fmtNumber(preview.report.sample.molarMassGPerMol, 6)} g mol⁻¹, {preview.report.sample.atomsPerFormulaUnit} atom{preview.report.sample.atomsPerFormulaUnit === 1 ? "" : "s"} per f.u.{preview.report.sample.massMg !== null ? `, mass ${fmtNumber(preview.report.sample.massMg, 5)} mg` : ""}</dd>
                {preview.report.provenance.map((p) => (
                  <FileFact key={p.measurementId} label={p.label} fileName={p.fileName} sha256={p.sha256} points={p.pointCount} />
                ))}
                {preview.report.fits.map((f) => (
                  <FitFact key={f.position} position={f.position} model={f.model} tMinK={f.tMinK} tMaxK={f.tMaxK} nPoints={f.nPoints} weighted={f.weighted} />
                ))}
              </dl>
              <table className="rv-steps" data-testid="sign-numbers">
                <thead><tr><th>Quantity</th><th>Value (σ in the last digits)</th></tr></thead>
                <tbody>
                  {preview.report.fits.flatMap((f) => f.parameters.map((p) => <tr key={`${f.position}-${p.name}`}><td>{p.symbol} <span className="muted small">fit, step {f.position + 1}</span></td><td className="mono">{p.compact}</td></tr>))}
                  {preview.report.derived.map((d) => <tr key={d.name}><td>{d.symbol}</td><td className="mono">{valueText(d.value, d.stdError, d.unit)}</td></tr>)}
                </tbody>
              </table>
              {preview.report.warnings.length > 0 && <p className="small">Warnings that will be sealed with it: {preview.report.warnings.join("; ")}</p>}
            </section>

            <fieldset className="rv-meanings">
              <legend>What your approval means</legend>
              {preview.meanings.map((m) => (
                <label key={m.key} className="rv-choice">
                  <input type="radio" name="meaning" value={m.key} checked={meaning === m.key} onChange={() => setMeaning(m.key)} data-testid={`meaning-${m.key}`} />
                  <span>{m.statement}</span>
                </label>
              ))}
            </fieldset>
            {statement && <p className="rv-statement" data-testid="sign-statement">You sign: “{statement}”</p>}

            {preview.openThreads.length > 0 && (
              <fieldset className="rv-threads" data-testid="sign-threads">
                <legend>Open discussion ({preview.openThreads.length}): resolve each on the analysis page, or acknowledge it here</legend>
                {preview.openThreads.map((t) => (
                  <label key={t.id} className="rv-choice">
                    <input type="checkbox" checked={acked.has(t.id)} onChange={(e) => setAcked((s) => { const n = new Set(s); if (e.target.checked) n.add(t.id); else n.delete(t.id); return n; })} data-testid="ack-thread" />
                    <span>I have read and acknowledge the open thread by <strong>{t.openedBy}</strong>: “{t.excerpt}”</span>
                  </label>
                ))}
              </fieldset>
            )}

            <label htmlFor="rv-note"><strong>Note</strong> (required; sealed with your signature: what you checked, anything a reader should know)</label>
            <textarea id="rv-note" value={note} onChange={(e) => setNote(e.target.value)} required data-testid="sign-note" />

            {preview.identity === "password" ? (
              <>
                <label htmlFor="rv-password"><strong>Your password</strong> (checked again to sign; not stored)</label>
                <input id="rv-password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} data-testid="sign-password" />
              </>
            ) : (
              <p className="small notice-info">Your account signs in through your institution and has no password: signing needs an institutional sign-in from the last {preview.freshSignInMinutes} minutes. If yours is older, sign out and in again first.</p>
            )}
            {error && <p className="form-error" role="alert" data-testid="sign-error">{error.text}</p>}
            <div className="actions">
              <button type="submit" disabled={busy || !ready} data-testid="sign-seal">{busy ? "Sealing…" : "Sign and seal"}</button>
              <button type="button" className="quiet" onClick={onCancel} disabled={busy}>Cancel</button>
              {!ready && <span className="small muted">{!meaning ? "Choose a meaning. " : ""}{!note.trim() ? "Write a note. " : ""}{!allAcked ? "Acknowledge or resolve every open thread. " : ""}{preview.identity === "password" && !password ? "Enter your password." : ""}</span>}
            </div>
          </>
        )}
      </form>
    </div>
  );
}

function FileFact({ label, fileName, sha256, points }: { label: string; fileName: string; sha256: string; points: number }) {
  return (
    <>
      <dt>Data file</dt>
      <dd>{label}: {fileName}, {points} points<br /><span className="mono small">SHA-256 {sha256}</span></dd>
    </>
  );
}

function FitFact({ position, model, tMinK, tMaxK, nPoints, weighted }: { position: number; model: string; tMinK: number; tMaxK: number; nPoints: number; weighted: boolean }) {
  return (
    <>
      <dt>Fit (step {position + 1})</dt>
      <dd>{MODEL_TEXT[model] ? <>{MODEL_TEXT[model]!.title} (<span className="mono">{MODEL_TEXT[model]!.formula}</span>)</> : model}, window {fmtNumber(tMinK)}–{fmtNumber(tMaxK)} K, {nPoints} points, {weighted ? "weighted by 1/σ²" : "unweighted"}</dd>
    </>
  );
}

/** The confirmation before sending a revision for review (steps freeze while it is reviewed). */
export function SubmitConfirm({ number, action, busy, onConfirm, onCancel }: { number: number; action: "submit" | "resubmit"; busy: boolean; onConfirm: () => void; onCancel: () => void }) {
  return (
    <div className="rv-modal" role="dialog" aria-modal="true" aria-labelledby="rv-submit-title" data-testid="submit-dialog">
      <div className="rv-modal-sheet rv-modal-small">
        <h2 id="rv-submit-title">{action === "submit" ? "Send" : "Send back"} revision {number} for review?</h2>
        <p>Its steps freeze while a reviewer looks at them: nobody can change them until the reviewer asks for changes or you take it back. The reviewers of the group are notified.</p>
        <div className="actions">
          <button type="button" onClick={onConfirm} disabled={busy} data-testid="submit-confirm">{action === "submit" ? "Send for review" : "Send back for review"}</button>
          <button type="button" className="quiet" onClick={onCancel} disabled={busy}>Cancel</button>
        </div>
      </div>
    </div>
  );
}
