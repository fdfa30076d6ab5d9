/**
 * Computing a chain in the pool within a time budget per task. When a task is stopped at its
 * budget, the step it was in gets a failure "stopped after N s: time budget" and hands down the
 * state it received (as any failed step does), and the steps below are computed in a new task
 * with a budget of their own — so one runaway step costs one budget, and the others still show.
 */
import type { ChainContext, ChainState, StepOutput, StepSpec } from "../../engine/notebook";
import { computePool, defaultBudgetMs, type StoredStepOutput } from "./pool";

export const BUDGET_MARK = "time budget";

/** "stopped after 5 s: time budget" (seconds as written, no float artefacts). */
export function budgetFailureText(budgetMs: number): string {
  const s = Math.round(budgetMs / 100) / 10;
  return `stopped after ${s} s: ${BUDGET_MARK}`;
}

export function budgetFailure(kind: StepSpec["kind"], budgetMs: number): StoredStepOutput {
  return { kind, ok: false, error: budgetFailureText(budgetMs), field: null, warnings: [], result: null } as StoredStepOutput;
}

/** "stopped at 1024 MiB: memory limit" (the worker's heap limit). */
export function memoryFailureText(memoryMb: number): string {
  return `stopped at ${memoryMb} MiB: memory limit`;
}

export function isBudgetFailure(o: { ok: boolean; error: string | null } | null | undefined): boolean {
  return !!o && !o.ok && typeof o.error === "string" && /^stopped (after [\d.]+ s: time budget|at \d+ MiB: memory limit)$/.test(o.error);
}

export interface BoundedChainOptions {
  budgetMs?: number;
  /** Steps already known to exceed this budget with their current inputs: not run again. */
  skip?: Record<number, StoredStepOutput>;
  onStart?: (index: number) => void;
}

export interface BoundedChainResult {
  /** Outputs of steps[from..], every one of them. */
  outputs: StepOutput[];
  /** Indexes of the steps stopped at the budget in this run. */
  stopped: number[];
}

/** computeChainFrom, in the worker pool, each task within the budget. */
export async function computeChainBounded(steps: readonly StepSpec[], context: ChainContext, from: number, state: ChainState, opts: BoundedChainOptions = {}): Promise<BoundedChainResult> {
  const budgetMs = opts.budgetMs ?? defaultBudgetMs();
  const outputs: StepOutput[] = [];
  const stopped: number[] = [];
  let at = from;
  let above = state;
  while (at < steps.length) {
    const r = await computePool().run({ steps, context, from: at, state: above, skip: opts.skip }, { budgetMs, onStart: opts.onStart });
    outputs.push(...r.outputs);
    if (r.outputs.length) above = r.outputs.at(-1)!.state;
    if (!r.stopped) break;
    const i = r.stopped.index;
    if (i >= steps.length) break; // stopped between the last step and its end message: all done
    const failure = r.stopped.reason === "memory" ? { ...budgetFailure(steps[i]!.kind, budgetMs), error: memoryFailureText(r.stopped.memoryMb) } : budgetFailure(steps[i]!.kind, budgetMs);
    outputs.push({ ...failure, state: above } as StepOutput);
    stopped.push(i);
    at = i + 1;
  }
  return { outputs, stopped };
}
