/**
 * Notebook engine: the analysis as a chain of physics steps, computed purely from plain data.
 *
 *   computeChain(steps, ctx)              every step's output, top to bottom
 *   computeChainFrom(steps, ctx, i, st)   steps i.. from the state handed down above step i
 *   computeStep(step, state, ctx)         one step from the state above it
 *   parseStepConfig(kind, config)         validated configuration with defaults (InputError on bad input)
 *   stepDefinition(kind)                  title, schema, dependencies of a kind
 *   STEP_DEFINITIONS, STEP_ORDER          the kinds
 */
export { computeChain, computeChainFrom, computeStep, parseStepConfig, stepDefinition, EMPTY_STATE } from "./chain";
export { STEP_DEFINITIONS, STEP_ORDER, isStepKind, resultOf } from "./registry";
export { StepFailure } from "./steps/shared";
export { packSources, sourceAt, type PackedSources, type PointSource } from "./pointSource";
export { defineStep } from "./steps/shared";
export type { StepDefinition, StepComputation, ResultOf } from "./steps/shared";
export type * from "./types";
