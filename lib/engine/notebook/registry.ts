/** Every step kind the notebook knows, by its stored name. */
import type { StepKind } from "./types";
import type { StepDefinition } from "./steps/shared";
import { dataStep } from "./steps/data";
import { addendaStep } from "./steps/addenda";
import { noteStep } from "./steps/note";
import { normaliseStep } from "./steps/normalise";
import { fitStep } from "./steps/fit";
import { deriveStep } from "./steps/derive";
import { transitionStep } from "./steps/transition";
import { entropyStep } from "./steps/entropy";

export const STEP_DEFINITIONS: Record<StepKind, StepDefinition<never>> = {
  data: dataStep as StepDefinition<never>,
  addenda: addendaStep as StepDefinition<never>,
  normalise: normaliseStep as StepDefinition<never>,
  fit: fitStep as StepDefinition<never>,
  derive: deriveStep as StepDefinition<never>,
  transition: transitionStep as StepDefinition<never>,
  entropy: entropyStep as StepDefinition<never>,
  note: noteStep as StepDefinition<never>,
};

export const STEP_ORDER: readonly StepKind[] = ["data", "addenda", "normalise", "fit", "derive", "transition", "entropy", "note"];
