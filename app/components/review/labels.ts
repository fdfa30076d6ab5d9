/**
 * Our words for review states and actions (display only), shared by the review bar, queues,
 * diff and report pages. The database names stay inside; people read these.
 */
import type { ReviewAction, RevisionState } from "@/lib/server/review";

export const STATE_LABEL: Record<RevisionState, string> = {
  open: "Drafting",
  in_review: "With reviewer",
  returned: "Changes requested",
  sealed: "Sealed",
  replaced: "Superseded",
};

export const STATE_MEANING: Record<RevisionState, string> = {
  open: "Analysts can still change every step.",
  in_review: "Steps are frozen while a reviewer looks at them.",
  returned: "The reviewer asked for changes: edit the steps, then send it back.",
  sealed: "Inputs and outputs are locked by the database and carry a content hash.",
  replaced: "A newer sealed revision took its place; this one stays as it was.",
};

export const ACTION_LABEL: Record<ReviewAction, string> = {
  submit: "Send for review",
  withdraw: "Take back from review",
  return: "Ask for changes",
  approve: "Approve and seal",
  resubmit: "Send back for review",
};

export const DECISION_LABEL: Record<string, string> = { approved: "approved and sealed", returned: "asked for changes" };

/** A SHA-256 hex string in groups of eight, easier to compare by eye. */
export function groupedHash(hex: string): string {
  return hex.replace(/(.{8})(?=.)/g, "$1 ");
}

/** ISO time → "2026-03-02 14:05 UTC" (same text on server and client). */
export function when(iso: string | null | undefined): string {
  if (!iso) return "—";
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toISOString().slice(0, 16).replace("T", " ") + " UTC";
}
