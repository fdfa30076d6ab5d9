/**
 * Change notices for live pages: every notebook change sends a PostgreSQL NOTIFY on one channel
 * inside the writing transaction (so it is delivered only if the change commits, and reaches
 * every app instance that listens — see listener.ts).
 */
export const EVENT_CHANNEL = "heatbook_events";

export interface NotebookEvent {
  groupId: string;
  analysisId: string;
  revisionId?: string;
  stepId?: string;
  kind: "step" | "structure" | "comment" | "review" | "analysis" | "computing";
  /** kind "computing": the step the worker started and how long the computation has run. */
  progress?: { position: number; runningMs: number };
  actorId: string;
  actorName?: string;
  at: string;
}

type Notifier = { $executeRaw(query: TemplateStringsArray, ...values: unknown[]): Promise<number> };

export async function notify(tx: Notifier, event: Omit<NotebookEvent, "at">): Promise<void> {
  const payload = JSON.stringify({ ...event, at: new Date().toISOString() });
  await tx.$executeRaw`SELECT pg_notify(${EVENT_CHANNEL}, ${payload})`;
}
