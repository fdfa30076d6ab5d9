/**
 * Every step kind in the browser: one entry per kind, checked by the compiler against the
 * engine's registry (lib/engine/notebook/registry.ts). Words shared with the server (the kind's
 * label) live in the display vocabulary (lib/display/vocabulary.ts, STEP_KINDS).
 */
import type { StepKind } from "@/lib/engine/notebook/registry";
import { STEP_KINDS } from "@/lib/display";
import type { StepUi } from "./steps/ui";
import { dataUi } from "./steps/data";
import { addendaUi } from "./steps/addenda";
import { normaliseUi } from "./steps/normalise";
import { fitUi } from "./steps/fit";
import { deriveUi } from "./steps/derive";
import { transitionUi } from "./steps/transition";
import { entropyUi } from "./steps/entropy";
import { latticeUi } from "./steps/lattice";
import { jointFitUi } from "./steps/jointFit";
import { gammaFieldUi } from "./steps/gammaField";
import { noteUi } from "./steps/note";

export const STEP_UI: { readonly [K in StepKind]: StepUi<K> } = {
  data: dataUi,
  addenda: addendaUi,
  normalise: normaliseUi,
  fit: fitUi,
  "joint-fit": jointFitUi,
  derive: deriveUi,
  transition: transitionUi,
  "gamma-field": gammaFieldUi,
  entropy: entropyUi,
  lattice: latticeUi,
  note: noteUi,
};

/** A kind's label ("Model fit"), or the stored name for a kind this build does not know. */
export function kindLabel(kind: string): string {
  return Object.hasOwn(STEP_KINDS, kind) ? STEP_KINDS[kind as StepKind].label : kind;
}

/** The UI of a stored kind, typed loosely for code that handles every kind alike (null if unknown). */
export function stepUi(kind: string): StepUi<StepKind> | null {
  return Object.hasOwn(STEP_UI, kind) ? (STEP_UI[kind as StepKind] as unknown as StepUi<StepKind>) : null;
}
