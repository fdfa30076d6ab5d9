"use client";
/**
 * The group's background jobs with their progress: polls GET /api/groups/[slug]/jobs every
 * two seconds while a job is queued or running (every 15 s otherwise). With `seriesId` it
 * offers "Refit the series", with `analysisId` + `fitStepId` "Large window scan" (owners and
 * analysts; the server decides, a refusal is shown). Place it on a series or notebook page.
 */
import { useCallback, useEffect, useState } from "react";
import { callJson } from "@/app/_lib/api";
import { formatTime } from "@/lib/display";

export interface JobRow {
  id: string;
  kind: "refit-series" | "window-scan";
  state: "queued" | "running" | "done" | "failed";
  done: number;
  total: number;
  message: string;
  error: string | null;
  attempts: { worker: string; startedAt: string }[];
  createdAt: string;
  finishedAt: string | null;
}

const KIND_LABEL: Record<JobRow["kind"], string> = { "refit-series": "Refit of a series", "window-scan": "Large window scan" };

function Progress({ job }: { job: JobRow }) {
  const pct = job.total > 0 ? Math.round((100 * job.done) / job.total) : job.state === "done" ? 100 : 0;
  return (
    <div className="stack" data-testid="job-progress">
      <progress max={100} value={pct} aria-label={`${KIND_LABEL[job.kind]} progress`} />
      <small>
        {job.state} · {job.done} of {job.total} · {job.state === "failed" ? job.error : job.message}
        {job.attempts.length > 1 ? ` · try ${job.attempts.length}` : ""}
      </small>
    </div>
  );
}

export function JobsPanel({ slug, seriesId, analysisId, fitStepId }: { slug: string; seriesId?: string; analysisId?: string; fitStepId?: string }) {
  const base = `/api/groups/${encodeURIComponent(slug)}/jobs`;
  const [jobs, setJobs] = useState<JobRow[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const refresh = useCallback(async () => {
    const r = await callJson<{ jobs: JobRow[] }>(base, "GET");
    if (r.ok && r.data) setJobs(r.data.jobs);
    else setError(r.error);
  }, [base]);

  const active = jobs.some((j) => j.state === "queued" || j.state === "running");
  useEffect(() => {
    void refresh();
    const t = setInterval(() => void refresh(), active ? 2000 : 15000);
    return () => clearInterval(t);
  }, [refresh, active]);

  async function enqueue(body: object) {
    setBusy(true);
    setError(null);
    const r = await callJson<{ job: JobRow }>(base, "POST", body);
    setBusy(false);
    if (!r.ok) return setError(r.error);
    await refresh();
  }

  return (
    <section className="stack" data-testid="jobs-panel" aria-label="Background jobs">
      <h3>Background jobs</h3>
      <div className="inline-form">
        {seriesId ? <button type="button" disabled={busy} onClick={() => void enqueue({ kind: "refit-series", seriesId })}>Refit the series</button> : null}
        {analysisId && fitStepId ? <button type="button" disabled={busy} onClick={() => void enqueue({ kind: "window-scan", analysisId, stepId: fitStepId })}>Large window scan</button> : null}
      </div>
      {error ? <p role="alert">{error}</p> : null}
      {jobs.length === 0 ? <p>No jobs yet. Jobs run in worker processes (<code>npm run worker</code>).</p> : null}
      <ul className="stack">
        {jobs.map((j) => (
          <li key={j.id} data-testid={`job-${j.id}`}>
            <strong>{KIND_LABEL[j.kind]}</strong> <small>{formatTime(j.createdAt)}</small>
            <Progress job={j} />
          </li>
        ))}
      </ul>
    </section>
  );
}
