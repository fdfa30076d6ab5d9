"use client";
/**
 * The notebook page's live part: the revision bar, the chain of step cards joined by a thin
 * connector, and the discussion column. It re-reads the notebook (GET) after every change made
 * here, and — through server-sent events — within about a second of a change made by anyone
 * else, saying who; open forms keep what was typed (StepCard compares versions).
 */
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { renderNotes } from "@/app/g/[slug]/analyses/[id]/actions";
import { StepCard } from "./StepCard";
import { AddStep } from "./AddStep";
import { Threads, type Composer } from "./Threads";
import { RevisionBar } from "./RevisionBar";
import { ReviewBar } from "@/app/components/review/ReviewBar";
import { kindLabel } from "./registry";
import type { Anchor, MeasurementChoice, ModelInfo, NotebookContext, NotebookData, ThreadData } from "./types";

interface Props {
  slug: string;
  initial: NotebookData;
  initialThreads: ThreadData[];
  initialNotes: Record<string, string>;
  models: ModelInfo[];
  jointModels: ModelInfo[];
  measurements: MeasurementChoice[];
  meId: string;
  members: Record<string, string>;
  /** Members by @handle, for mention completion in discussions. */
  mentionables: { handle: string; name: string }[];
  canComment: boolean;
  /** The revision asked for in the URL (null: the newest). */
  revisionId: string | null;
}

export function Notebook(props: Props) {
  const { slug } = props;
  const apiBase = `/api/groups/${encodeURIComponent(slug)}`;
  const [nb, setNb] = useState(props.initial);
  const [threads, setThreads] = useState(props.initialThreads);
  const [notes, setNotes] = useState(props.initialNotes);
  const [composer, setComposer] = useState<Composer | null>(null);
  const [flash, setFlash] = useState<string | null>(null);
  const [live, setLive] = useState<"connecting" | "live" | "offline">("connecting");
  const [loadError, setLoadError] = useState<string | null>(null);
  // The worker's progress on a long computation (live "progress" events), cleared by the next read.
  const [progress, setProgress] = useState<{ position: number; runningMs: number } | null>(null);
  const analysisId = nb.analysis.id;
  const seq = useRef(0);

  const refresh = useCallback(async () => {
    const mine = ++seq.current;
    const q = props.revisionId ? `?revision=${encodeURIComponent(props.revisionId)}` : "";
    const [a, t] = await Promise.all([
      callJson<{ notebook: NotebookData }>(`${apiBase}/analyses/${analysisId}${q}`, "GET"),
      callJson<{ threads: ThreadData[] }>(`${apiBase}/analyses/${analysisId}/threads`, "GET"),
    ]);
    if (mine !== seq.current) return; // a newer refresh is on its way
    if (!a.ok) { setLoadError(a.error); return; }
    setLoadError(null);
    const next = a.data!.notebook;
    const noteSteps = next.steps.filter((s) => s.kind === "note" && s.output?.ok);
    if (noteSteps.length) {
      try {
        const html = await renderNotes(slug, noteSteps.map((s) => String((s.output!.result as { markdown?: string }).markdown ?? "")));
        setNotes(Object.fromEntries(noteSteps.map((s, i) => [s.id, html[i]!])));
      } catch { /* keep the previous rendering */ }
    }
    setNb(next);
    setProgress(null);
    if (t.ok) setThreads(t.data!.threads);
  }, [apiBase, analysisId, slug, props.revisionId]);

  // Live updates: debounce bursts of events (one save notifies once per step written).
  useEffect(() => {
    const es = new EventSource(`${apiBase}/events?analysisId=${encodeURIComponent(analysisId)}`);
    let timer: ReturnType<typeof setTimeout> | null = null;
    let flashTimer: ReturnType<typeof setTimeout> | null = null;
    const actors = new Set<string>();
    es.onopen = () => setLive("live");
    es.onerror = () => setLive("offline");
    es.addEventListener("progress", (ev) => {
      try {
        const e = JSON.parse((ev as MessageEvent).data as string) as { progress?: { position: number; runningMs: number } };
        if (e.progress) setProgress(e.progress);
      } catch { /* ignore a malformed event */ }
    });
    es.addEventListener("change", (ev) => {
      let e: { actorId?: string; actorName?: string } = {};
      try { e = JSON.parse((ev as MessageEvent).data as string); } catch { return; }
      if (e.actorId && e.actorId !== props.meId) actors.add(e.actorName ?? props.members[e.actorId] ?? "another member");
      if (timer) clearTimeout(timer);
      timer = setTimeout(() => {
        void refresh();
        if (actors.size) {
          setFlash(`Updated by ${[...actors].join(", ")}`);
          actors.clear();
          if (flashTimer) clearTimeout(flashTimer);
          flashTimer = setTimeout(() => setFlash(null), 6000);
        }
      }, 250);
    });
    return () => { es.close(); if (timer) clearTimeout(timer); if (flashTimer) clearTimeout(flashTimer); };
  }, [apiBase, analysisId, props.meId, props.members, refresh]);

  const startThread = useCallback((stepId: string | null, anchor: Anchor | null) => setComposer({ stepId, anchor }), []);
  const ctx: NotebookContext = useMemo(() => ({
    slug, apiBase, analysisId, editable: nb.editable, canComment: props.canComment, models: props.models, jointModels: props.jointModels, measurements: props.measurements,
    steps: nb.steps, revisionVersion: nb.revision.version, revisionId: nb.revision.id, threads, refresh, startThread, mentionables: props.mentionables,
  }), [slug, apiBase, analysisId, nb, props.canComment, props.models, props.jointModels, props.measurements, threads, refresh, startThread, props.mentionables]);

  const basisAt = (i: number) => {
    for (let k = i - 1; k >= 0; k--) {
      const s = nb.steps[k]!;
      if (s.kind === "normalise") return ((s.config as { per?: string }).per === "atom" ? "atom" : "formula-unit") as "atom" | "formula-unit";
    }
    return undefined;
  };

  return (
    <div className="nb-page">
      <RevisionBar nb={nb} live={live} />
      {/* The review actions (app/components/review); remounted when the revision's state or version moves. */}
      <ReviewBar key={`${nb.revision.id}:${nb.revision.state}:${nb.revision.version}`} slug={slug} analysisId={analysisId} revision={{ id: nb.revision.id }} onChanged={() => void refresh()} />
      {nb.sealProblem && <p className="form-error" role="alert" data-testid="seal-problem">{nb.sealProblem}</p>}
      {flash && <div className="nb-flash" role="status" data-testid="live-notice">{flash}</div>}
      {(nb.computing || progress) && (
        <div className="nb-flash" role="status" data-testid="computing-notice">
          Computing in the background{progress ? `: step ${progress.position + 1} (${kindLabel(nb.steps[progress.position]?.kind ?? "step")}), ${Math.floor(progress.runningMs / 1000)} s so far` : ""}. The page updates when it ends.
        </div>
      )}
      {loadError && <p className="form-error" role="alert">The notebook could not be re-read: {loadError}</p>}
      <div className="nb-layout">
        <div className="nb-chain" aria-label="Steps of the analysis">
          {nb.steps.length === 0 && (
            <div className="sheet"><p>This analysis has no steps yet.</p>{nb.editable && <AddStep ctx={ctx} position={0} label="Add the first step" />}</div>
          )}
          {nb.steps.map((s, i) => (
            <StepCard key={s.id} step={s} first={i === 0} last={i === nb.steps.length - 1} ctx={ctx} noteHtml={notes[s.id] ?? null} basisAbove={basisAt(i)} />
          ))}
        </div>
        <Threads ctx={ctx} composer={composer} setComposer={setComposer} />
      </div>
    </div>
  );
}
