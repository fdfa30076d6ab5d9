"use client";
/**
 * The discussion column: threads on a step or on a range of points of a chart (shown there as a
 * numbered band), with replies, resolve and reopen, author and time of each comment.
 */
import { useEffect, useRef, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { num, when } from "./display";
import { kindLabel } from "./registry";
import type { Anchor, NotebookContext, ThreadData } from "./types";
import { MentionBox } from "./MentionBox";

export interface Composer {
  stepId: string | null;
  anchor: Anchor | null;
}

const PLOT_NAME: Record<string, string> = { "ct-vs-t2": "C/T vs T² chart", "c-vs-t": "data chart" };

function anchorText(a: Anchor): string {
  const t = a.plot === "ct-vs-t2" ? [Math.sqrt(Math.max(0, a.xMin)), Math.sqrt(Math.max(0, a.xMax))] : [a.xMin, a.xMax];
  return `${PLOT_NAME[a.plot] ?? a.plot}, T = ${num(t[0], 3)}–${num(t[1], 3)} K${a.points ? ` (${a.points.length} points)` : ""}`;
}

function stepName(ctx: NotebookContext, stepId: string | null): string {
  const s = ctx.steps.find((x) => x.id === stepId);
  return s ? s.title || kindLabel(s.kind) : stepId ? "a removed step" : "the analysis";
}

/** The note shown after posting when a mention reached nobody (null when all matched). */
function unmatchedNote(handles: string[] | undefined): string | null {
  return handles && handles.length ? `Posted, but ${handles.map((h) => `@${h}`).join(", ")} ${handles.length === 1 ? "matches" : "match"} no member: nobody was notified for ${handles.length === 1 ? "it" : "them"}.` : null;
}

function Thread({ t, n, ctx }: { t: ThreadData; n: number; ctx: NotebookContext }) {
  const [reply, setReply] = useState("");
  const [error, setError] = useState<string | null>(null);
  const url = `${ctx.apiBase}/analyses/${ctx.analysisId}/threads/${t.id}`;
  async function send() {
    const res = await callJson<{ unmatchedMentions?: string[] }>(url, "POST", { body: reply });
    if (!res.ok) return setError(res.error);
    setReply("");
    setError(unmatchedNote(res.data?.unmatchedMentions));
    await ctx.refresh();
  }
  async function setState(state: "open" | "resolved") {
    const res = await callJson(url, "PATCH", { state });
    if (!res.ok) setError(res.error);
    await ctx.refresh();
  }
  return (
    <li className={`nb-thread${t.state === "resolved" ? " nb-resolved" : ""}`} id={`thread-${t.id}`} data-testid="thread">
      <div className="nb-thread-head">
        <span className="nb-thread-no">#{n}</span>
        <a href={t.stepId ? `#step-${t.stepId}` : undefined}>{stepName(ctx, t.stepId)}</a>
        {t.anchor && <span className="small muted"> · {anchorText(t.anchor)}</span>}
        <span className={`nb-thread-state ${t.state}`}>{t.state === "open" ? "open" : `resolved ${when(t.resolvedAt)}`}</span>
      </div>
      <ol className="nb-comments">
        {t.comments.map((c) => (
          <li key={c.id}>
            <div className="small"><strong>{c.authorName}</strong> <time className="muted" dateTime={c.createdAt}>{when(c.createdAt)}</time></div>
            <p className="nb-comment-body">{c.body}</p>
          </li>
        ))}
      </ol>
      {ctx.canComment && (
        <div className="nb-reply">
          <label htmlFor={`reply-${t.id}`} className="sr-only">Reply to discussion #{n}</label>
          <MentionBox id={`reply-${t.id}`} rows={2} value={reply} onChange={setReply} members={ctx.mentionables} placeholder="Reply… (@handle notifies a member)" />
          <div className="actions">
            <button type="button" className="small" disabled={!reply.trim()} onClick={send}>Reply</button>
            {t.state === "open"
              ? <button type="button" className="quiet small" onClick={() => setState("resolved")}>Resolve</button>
              : <button type="button" className="quiet small" onClick={() => setState("open")}>Reopen</button>}
          </div>
          {error && <p className="field-error">{error}</p>}
        </div>
      )}
    </li>
  );
}

export function Threads({ ctx, composer, setComposer }: { ctx: NotebookContext; composer: Composer | null; setComposer: (c: Composer | null) => void }) {
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [showResolved, setShowResolved] = useState(false);
  const [posted, setPosted] = useState<string | null>(null);
  const box = useRef<HTMLTextAreaElement>(null);
  useEffect(() => { if (composer) box.current?.focus(); }, [composer]);
  async function post() {
    if (!composer) return;
    const res = await callJson<{ unmatchedMentions?: string[] }>(`${ctx.apiBase}/analyses/${ctx.analysisId}/threads`, "POST", { stepId: composer.stepId, anchor: composer.anchor, body });
    if (!res.ok) return setError(res.error);
    setBody("");
    setError(null);
    setPosted(unmatchedNote(res.data?.unmatchedMentions));
    setComposer(null);
    await ctx.refresh();
  }
  const shown = ctx.threads.map((t, i) => ({ t, n: i + 1 })).filter(({ t }) => showResolved || t.state === "open");
  const resolved = ctx.threads.filter((t) => t.state === "resolved").length;
  return (
    <aside className="nb-side" aria-labelledby="discussion-heading">
      <h2 id="discussion-heading">Discussion</h2>
      {composer ? (
        <div className="nb-composer" data-testid="thread-composer">
          <p className="small">New discussion on <strong>{stepName(ctx, composer.stepId)}</strong>{composer.anchor && <> · {anchorText(composer.anchor)}</>}</p>
          <label htmlFor="new-thread" className="sr-only">Comment</label>
          <MentionBox id="new-thread" boxRef={box} rows={3} value={body} onChange={setBody} members={ctx.mentionables} placeholder="What do you see here? (@handle notifies a member)" testId="thread-body" />
          <div className="actions">
            <button type="button" className="small" disabled={!body.trim()} onClick={post} data-testid="post-thread">Post</button>
            <button type="button" className="quiet small" onClick={() => setComposer(null)}>Cancel</button>
          </div>
          {error && <p className="field-error">{error}</p>}
        </div>
      ) : ctx.canComment && (
        <button type="button" className="quiet small" onClick={() => setComposer({ stepId: null, anchor: null })}>Comment on the analysis</button>
      )}
      {posted && <p className="field-error" role="status">{posted}</p>}
      {shown.length === 0 && <p className="muted small">No open discussions. Comment on a step, or drag across a chart to discuss a range of points.</p>}
      <ul className="nb-threads">{shown.map(({ t, n }) => <Thread key={t.id} t={t} n={n} ctx={ctx} />)}</ul>
      {resolved > 0 && <button type="button" className="quiet small" onClick={() => setShowResolved((v) => !v)}>{showResolved ? "Hide" : "Show"} {resolved} resolved</button>}
    </aside>
  );
}
