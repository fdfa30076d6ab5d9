/** Audit actions in words, for the group's activity list: the display vocabulary's phrases (lib/display). */
import { activityLabel } from "@/lib/display";

/** "added sample", "stored measurement"; a key with no phrase is written as words, never as the key. */
export function describeAction(action: string): string {
  return activityLabel(action);
}
