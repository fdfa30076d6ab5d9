import type { z } from "zod";
import type { ChainContext, ChainState, StepDependencies, StepKind } from "../types";

/** A step that cannot be computed from its configuration or its inputs: shown on the step, not thrown. */
export class StepFailure extends Error {
  readonly field: string | undefined;
  constructor(message: string, field?: string) {
    super(message);
    this.name = "StepFailure";
    this.field = field;
  }
}

export interface StepComputation {
  result: unknown;
  warnings: string[];
  state: ChainState;
}

/** One kind of step: its configuration schema, what it reads outside the chain, and its computation. */
export interface StepDefinition<C> {
  kind: StepKind;
  title: string;
  schema: z.ZodType<C>;
  dependencies(config: C): StepDependencies;
  compute(config: C, state: ChainState, ctx: ChainContext): StepComputation;
}

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
