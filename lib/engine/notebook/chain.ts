/**
 * Running the chain: each step gets the state the step above handed down. A step that fails
 * (StepFailure) reports its message and hands down the state it received, so the steps below
 * it still show what they can (and say what they miss).
 */
import type { ChainContext, ChainState, StepKind, StepOutput, StepSpec } from "./types";
import { StepFailure, type StepDefinition } from "./steps/shared";
import { STEP_DEFINITIONS } from "./registry";
import { InputError } from "../errors";

export const EMPTY_STATE: ChainState = Object.freeze({ dataset: null, fit: null, fits: {} }) as ChainState;

export function stepDefinition(kind: string): StepDefinition<unknown> {
  const def = STEP_DEFINITIONS[kind as StepKind];
  if (!def) throw new InputError(`invalid step kind: ${JSON.stringify(kind)}`, { field: "kind" });
  return def as StepDefinition<unknown>;
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
    return { kind: spec.kind, ok: false, error: `configuration: ${issue.path.join(".") || "config"}: ${issue.message}`, warnings: [], result: null, state };
  }
  try {
    const r = def.compute(parsed.data, state, ctx);
    let next = r.state;
    if (next.fit && next.fit !== state.fit) {
      const fit = { ...next.fit, stepId: spec.id };
      next = { ...next, fit, fits: { ...next.fits, [spec.id]: fit } };
    }
    return { kind: spec.kind, ok: true, error: null, warnings: r.warnings, result: r.result, state: next };
  } catch (err) {
    if (err instanceof StepFailure || err instanceof InputError) return { kind: spec.kind, ok: false, error: err.message, warnings: [], result: null, state };
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
