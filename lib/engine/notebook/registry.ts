/**
 * Every step kind the notebook knows, by its stored name: the one list. A kind is added here
 * with one line; its name (StepKind), configuration (StepConfig) and result (StepResult) types
 * and the output union (StepOutput) all follow from this object.
 */
import type { z } from "zod";
import type { ChainState } from "./types";
import type { StepDefinition } from "./steps/shared";
import { dataStep } from "./steps/data";
import { addendaStep } from "./steps/addenda";
import { noteStep } from "./steps/note";
import { normaliseStep } from "./steps/normalise";
import { fitStep } from "./steps/fit";
import { deriveStep } from "./steps/derive";
import { transitionStep } from "./steps/transition";
import { entropyStep } from "./steps/entropy";
import { latticeStep } from "./steps/lattice";
import { jointFitStep } from "./steps/jointFit";
import { gammaFieldStep } from "./steps/gammaField";

export const STEP_DEFINITIONS = {
  data: dataStep,
  addenda: addendaStep,
  normalise: normaliseStep,
  fit: fitStep,
  "joint-fit": jointFitStep,
  derive: deriveStep,
  transition: transitionStep,
  "gamma-field": gammaFieldStep,
  entropy: entropyStep,
  lattice: latticeStep,
  note: noteStep,
} as const satisfies { [K in string]: StepDefinition<K, z.ZodType, unknown> };

type Definitions = typeof STEP_DEFINITIONS;

/** A step kind's stored name. */
export type StepKind = keyof Definitions;

/** The order kinds are offered in (every kind once; a test checks). */
export const STEP_ORDER = Object.keys(STEP_DEFINITIONS) as readonly StepKind[];

/** A kind's configuration as the handler sees it (defaults filled). */
export type StepConfig<K extends StepKind> = z.output<Definitions[K]["schema"]>;
/** A kind's configuration as stored and edited (defaults optional). */
export type StepConfigInput<K extends StepKind> = z.input<Definitions[K]["schema"]>;
/** A kind's result (JSON-safe, SI values with their units named). */
export type StepResult<K extends StepKind> = ReturnType<Definitions[K]["compute"]>["result"];

/** The stored output of one step of kind K: a result, or the reason and the field at fault. */
export type StepOutputOf<K extends StepKind> =
  | { kind: K; ok: true; error: null; field?: null; warnings: string[]; result: StepResult<K>; state: ChainState }
  | { kind: K; ok: false; error: string; /** The configuration field at fault (schema key, dotted), when one is. */ field?: string | null; warnings: string[]; result: null; state: ChainState };

/** A step's stored output, discriminated by kind (and by ok). */
export type StepOutput = { [K in StepKind]: StepOutputOf<K> }[StepKind];

/** Whether a stored kind name is one of ours. */
export function isStepKind(kind: string): kind is StepKind {
  return Object.hasOwn(STEP_DEFINITIONS, kind);
}

/** The result of a stored output when it is a computed step of that kind, else null. */
export function resultOf<K extends StepKind>(output: { kind: string; ok: boolean; result: unknown } | null | undefined, kind: K): StepResult<K> | null {
  return output && output.ok && output.kind === kind ? (output.result as StepResult<K>) : null;
}
