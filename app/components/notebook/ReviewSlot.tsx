"use client";
/**
 * Where the review actions (submit, approve, ask for changes, withdraw, new revision) sit in the
 * revision bar. The review feature supplies them; until then this shows what the state means.
 * Props are the contract for that component: the group, the analysis and the revision shown,
 * and `onChanged` to re-read the notebook after an action.
 */
import type { RevisionView } from "./types";

export interface ReviewSlotProps {
  slug: string;
  analysisId: string;
  revision: RevisionView;
  onChanged: () => void;
}

const MEANING: Record<RevisionView["state"], string> = {
  open: "Steps can be changed by analysts.",
  in_review: "Waiting for a reviewer; steps are frozen.",
  returned: "The reviewer asked for changes; steps can be changed again.",
  sealed: "Approved: inputs and outputs are locked.",
  replaced: "A newer revision replaced this one.",
};

export function ReviewSlot({ revision }: ReviewSlotProps) {
  return <span className="small nb-review-note">{MEANING[revision.state]}</span>;
}
