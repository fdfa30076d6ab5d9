import type { z } from "zod";
import type { ChainContext, ChainState, StepDependencies } from "../types";

/** A step that cannot be computed from its configuration or its inputs: shown on the step, not thrown. */
export class StepFailure extends Error {
  /** The configuration field at fault (a key of the step's schema, dotted when nested), when one is. */
  readonly field: string | undefined;
  constructor(message: string, field?: string) {
    super(message);
    this.name = "StepFailure";
    this.field = field;
  }
}

/** What a step's computation returns: its result (JSON-safe, SI), warnings, and the state it hands down. */
export interface StepComputation<R> {
  result: R;
  warnings: string[];
  state: ChainState;
}

/**
 * One kind of step: its stored name, heading, configuration schema (zod: the handler's and the
 * form's type), what it reads outside the chain, and its computation. The result type R is
 * inferred from `compute`; the registry (registry.ts) derives every output type from it.
 */
export interface StepDefinition<K extends string, S extends z.ZodType, R> {
  kind: K;
  title: string;
  schema: S;
  /** The configuration a step added with "Add step" starts from (default: {}, the schema's defaults). */
  initial?: z.input<S>;
  dependencies(config: z.output<S>): StepDependencies;
  compute(config: z.output<S>, state: ChainState, ctx: ChainContext): StepComputation<R>;
}

/** Declare a step kind; the literal kind, schema and result type are kept for the registry. */
export function defineStep<const K extends string, S extends z.ZodType, R>(def: StepDefinition<K, S, R>): StepDefinition<K, S, R> {
  return def;
}

/** The result type of a step definition. */
export type ResultOf<D> = D extends StepDefinition<string, z.ZodType, infer R> ? R : never;

export function requireDataset(state: ChainState, what: string) {
  if (!state.dataset) throw new StepFailure(`${what} needs a data step above it`);
  return state.dataset;
}

/** Downsample a curve for display: at most `max` points, evenly by index, ends kept. */
export function thin<T>(values: readonly T[], max = 600): T[] {
  if (values.length <= max) return [...values];
  const out: T[] = [];
  const step = (values.length - 1) / (max - 1);
  for (let k = 0; k < max; k++) out.push(values[Math.round(k * step)]!);
  return out;
}

/** Thin every array of a curve alike (the same indices), for display. */
export function thinCurve<T extends Record<string, readonly number[]>>(curve: T, max = 600): T {
  const n = Object.values(curve)[0]?.length ?? 0;
  if (n <= max) return curve;
  const keep = thin(Array.from({ length: n }, (_, i) => i), max);
  return Object.fromEntries(Object.entries(curve).map(([k, v]) => [k, keep.map((i) => v[i]!)])) as unknown as T;
}
