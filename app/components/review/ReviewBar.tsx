"use client";
/**
 * The review bar of an analysis page: the shown revision's state in our words, the review
 * actions the server says the caller may take now (submit, withdraw, ask for changes with a
 * required comment, approve, resubmit, start a new revision), the seal panel of a sealed
 * revision, and the history of decisions. The server decides every action again; this only
 * offers what `reviewStatus` allows. After an action the page is read afresh (the notebook's
 * editability follows the state), or `onChanged` is called when the host re-reads by itself.
 */
import Link from "next/link";
import { useCallback, useEffect, useState } from "react";
import { callJson } from "@/app/_lib/api";
import type { ReviewAction, ReviewStatus } from "@/lib/server/review";
import { ACTION_LABEL, DECISION_LABEL, STATE_LABEL, STATE_MEANING, when } from "./labels";
import { LockPanel } from "./LockPanel";
import { SignDialog, SubmitConfirm } from "./SignDialog";
import "./review.css";

export interface ReviewBarProps {
  slug: string;
  analysisId: string;
  /** The revision shown on the page (null or absent: the newest). */
  revisionId?: string | null;
  /** Alternatively the shown revision as the notebook holds it. */
  revision?: { id: string } | null;
  onChanged?: () => void;
}

type Rev = ReviewStatus["revisions"][number];

export function ReviewBar(props: ReviewBarProps) {
  const apiBase = `/api/groups/${encodeURIComponent(props.slug)}/analyses/${props.analysisId}`;
  const pageBase = `/g/${encodeURIComponent(props.slug)}/analyses/${props.analysisId}`;
  const [status, setStatus] = useState<ReviewStatus | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [asking, setAsking] = useState(false);
  const [comment, setComment] = useState("");
  const [signing, setSigning] = useState(false);
  const [confirming, setConfirming] = useState<"submit" | "resubmit" | null>(null);
  const wanted = props.revision?.id ?? props.revisionId ?? null;

  const load = useCallback(async () => {
    const r = await callJson<{ review: ReviewStatus }>(`${apiBase}/review`, "GET");
    if (r.ok) setStatus(r.data!.review);
    else setError(r.error);
  }, [apiBase]);
  useEffect(() => { void load(); }, [load, wanted]);

  const after = useCallback(async (goTo?: string) => {
    if (props.onChanged) { props.onChanged(); await load(); setBusy(false); return; }
    if (goTo) window.location.assign(goTo);
    else window.location.reload();
  }, [props, load]);

  if (!status) return <div className="rv-bar rv-loading small muted" data-testid="review-bar">{error ?? "Reading the review state…"}</div>;
  const rev: Rev | undefined = (wanted && status.revisions.find((r) => r.id === wanted)) || status.revisions[0];
  if (!rev) return null;

  async function act(action: ReviewAction) {
    if (!rev) return;
    if (action === "return" && !comment.trim()) { setError("say what needs changing: the comment is required"); return; }
    setBusy(true);
    setError(null);
    const r = await callJson(`${apiBase}/review`, "POST", { revisionId: rev.id, action, version: rev.version, ...(action === "return" ? { comment: comment.trim() || undefined } : {}) });
    if (!r.ok) { setBusy(false); setConfirming(null); setError(r.status === 409 ? `${r.error} — reload the page to see the current state.` : r.error); return; }
    setAsking(false);
    setConfirming(null);
    setComment("");
    await after();
  }

  async function revise() {
    setBusy(true);
    setError(null);
    const r = await callJson<{ revision: { id: string } }>(`${apiBase}/review/revise`, "POST");
    if (!r.ok) { setBusy(false); setError(r.error); return; }
    await after(pageBase);
  }

  const older = status.revisions.find((r) => r.number < rev.number);
  const history = status.revisions.flatMap((r) => r.decisions.map((d) => ({ ...d, number: r.number }))).sort((a, b) => b.at.localeCompare(a.at));
  const canAct = rev.actions.length > 0 || (status.canRevise && rev.state === "sealed");
  return (
    <div className={`rv-bar rv-${rev.state}`} data-testid="review-bar">
      <div className="rv-row">
        <span className={`rv-badge rv-badge-${rev.state}`} data-testid="review-state">{STATE_LABEL[rev.state]}</span>
        <span className="small">Revision {rev.number}{rev.submittedBy && rev.state !== "open" ? <> · sent by {rev.submittedBy.name}, {when(rev.submittedAt)}</> : null}</span>
        <span className="small muted rv-meaning">{STATE_MEANING[rev.state]}</span>
        {older && <Link className="small" href={`${pageBase}/diff?a=${older.id}&b=${rev.id}`} data-testid="diff-link">What changed since revision {older.number}</Link>}
      </div>
      {canAct && (
        <div className="actions rv-actions">
          {rev.actions.filter((a) => a !== "return").map((a) => (
            <button key={a} type="button" className={a === "approve" ? "" : "quiet"} disabled={busy}
              onClick={() => (a === "approve" ? (setError(null), setSigning(true)) : a === "submit" || a === "resubmit" ? setConfirming(a) : act(a))} data-testid={`review-${a}`}>
              {ACTION_LABEL[a]}{a === "approve" || a === "submit" || a === "resubmit" ? "…" : ""}
            </button>
          ))}
          {rev.actions.includes("return") && !asking && <button type="button" className="quiet" disabled={busy} onClick={() => setAsking(true)} data-testid="review-return">{ACTION_LABEL.return}…</button>}
          {status.canRevise && rev.state === "sealed" && <button type="button" className="quiet" disabled={busy} onClick={revise} data-testid="review-revise">Start a new revision</button>}
        </div>
      )}
      {asking && (
        <form className="rv-ask" onSubmit={(e) => { e.preventDefault(); void act("return"); }}>
          <label htmlFor="rv-comment" className="small"><strong>What needs changing?</strong> (required; the author sees this)</label>
          <textarea id="rv-comment" value={comment} onChange={(e) => setComment(e.target.value)} required data-testid="return-comment" />
          <div className="actions">
            <button type="submit" disabled={busy || !comment.trim()} data-testid="return-send">Send the request</button>
            <button type="button" className="quiet" onClick={() => { setAsking(false); setError(null); }}>Cancel</button>
          </div>
        </form>
      )}
      {error && <p className="form-error" role="alert" data-testid="review-error">{error}</p>}
      {signing && <SignDialog apiBase={apiBase} revision={{ id: rev.id, number: rev.number, version: rev.version }} onCancel={() => setSigning(false)} onDone={() => { setSigning(false); void after(); }} />}
      {confirming && <SubmitConfirm number={rev.number} action={confirming} busy={busy} onConfirm={() => act(confirming)} onCancel={() => setConfirming(null)} />}
      {rev.seal && <LockPanel apiBase={apiBase} pageBase={pageBase} revision={{ id: rev.id, number: rev.number, state: rev.state, seal: rev.seal }} />}
      {history.length > 0 && (
        <details className="rv-history" data-testid="decision-history" open={rev.state === "returned"}>
          <summary className="small">Decisions ({history.length})</summary>
          <ol>
            {history.map((d, i) => (
              <li key={i}>
                <span className="small muted">{when(d.at)} · revision {d.number}</span> <strong>{d.reviewer?.name ?? "former member"}</strong> {DECISION_LABEL[d.decision] ?? d.decision}
                {d.comment && <blockquote>{d.comment}</blockquote>}
              </li>
            ))}
          </ol>
        </details>
      )}
    </div>
  );
}
