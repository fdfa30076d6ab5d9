/**
 * Running the chain: each step gets the state the step above handed down. A step that fails
 * (StepFailure) reports its message and hands down the state it received, so the steps below
 * it still show what they can (and say what they miss).
 */
import type { z } from "zod";
import type { ChainContext, ChainState, StepOutput, StepSpec } from "./types";
import { StepFailure, type StepDefinition } from "./steps/shared";
import { STEP_DEFINITIONS, isStepKind } from "./registry";
import { InputError } from "../errors";

export const EMPTY_STATE: ChainState = Object.freeze({ dataset: null, fit: null, fits: {} }) as ChainState;

/** A kind's definition seen without its types (for code that handles every kind alike). */
export function stepDefinition(kind: string): StepDefinition<string, z.ZodType, unknown> {
  if (!isStepKind(kind)) throw new InputError(`invalid step kind: ${JSON.stringify(kind)}`, { field: "kind" });
  return STEP_DEFINITIONS[kind] as StepDefinition<string, z.ZodType, unknown>;
}

/** A failed output: the reason, and the configuration field at fault when one is known. */
function failed(spec: StepSpec, error: string, field: string | null | undefined, state: ChainState): StepOutput {
  return { kind: spec.kind, ok: false, error, field: field ?? null, warnings: [], result: null, state } as StepOutput;
}

/** Validate (and fill defaults of) a step configuration; throws InputError naming the field. */
export function parseStepConfig(kind: string, config: unknown): unknown {
  const parsed = stepDefinition(kind).schema.safeParse(config ?? {});
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0]!;
  const field = issue.path.map(String).join(".");
  throw new InputError(issue.message, { field: field ? `config.${field}` : "config" });
}

/** Compute one step from the state above it. Never throws for a step's own trouble. */
export function computeStep(spec: StepSpec, state: ChainState, ctx: ChainContext): StepOutput {
  const def = stepDefinition(spec.kind);
  const parsed = def.schema.safeParse(spec.config ?? {});
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    const field = issue.path.map(String).join(".");
    return failed(spec, `configuration: ${field || "config"}: ${issue.message}`, field || null, state);
  }
  try {
    const r = def.compute(parsed.data, state, ctx);
    let next = r.state;
    if (next.fit && next.fit !== state.fit) {
      const fit = { ...next.fit, stepId: spec.id };
      next = { ...next, fit, fits: { ...next.fits, [spec.id]: fit } };
    }
    if (next.jointFit && next.jointFit !== state.jointFit) {
      const jointFit = { ...next.jointFit, stepId: spec.id };
      next = { ...next, jointFit, jointFits: { ...(next.jointFits ?? {}), [spec.id]: jointFit } };
    }
    return { kind: spec.kind, ok: true, error: null, warnings: r.warnings, result: r.result, state: next } as StepOutput;
  } catch (err) {
    if (err instanceof StepFailure || err instanceof InputError) return failed(spec, err.message, err.field, state);
    throw err;
  }
}

/** Compute the whole chain from the top. */
export function computeChain(steps: readonly StepSpec[], ctx: ChainContext): StepOutput[] {
  return computeChainFrom(steps, ctx, 0, EMPTY_STATE);
}

/**
 * Compute steps[from..] given the state the step above `from` handed down (its outputs only;
 * the caller keeps those of the steps above). Used to resume a chain whose top is unchanged.
 */
export function computeChainFrom(steps: readonly StepSpec[], ctx: ChainContext, from: number, state: ChainState): StepOutput[] {
  const out: StepOutput[] = [];
  for (const s of steps.slice(from)) {
    const o = computeStep(s, state, ctx);
    out.push(o);
    state = o.state;
  }
  return out;
}
