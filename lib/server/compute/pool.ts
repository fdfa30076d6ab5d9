/**
 * A pool of worker threads for the notebook engine, so no computation — bounded or not — runs on
 * the request thread. Each task computes a chain from one step down; a task that runs longer
 * than its time budget is stopped: its worker is terminated (and replaced) and the task resolves
 * with the steps it finished and the index of the one it was in. The finished steps are whole
 * (each arrives in one message after it ends), so nothing half-computed comes back.
 *
 * Settings (read when the pool starts):
 *   HEATBOOK_COMPUTE_THREADS    worker threads (default: available cores − 1, at least 2, so one runaway task does not hold up every other recompute)
 *   HEATBOOK_COMPUTE_BUDGET_MS  default time budget of a task (default 5000)
 *   HEATBOOK_COMPUTE_MEMORY_MB  heap limit of each worker (default 1024); a task over it is stopped too
 *   HEATBOOK_ROOT               folder holding lib/ (default: the working directory)
 *   HEATBOOK_TEST_HOOKS=1       honours the tests' `__testSlowMs` in a raw step config
 *
 * The worker entry is lib/server/compute/chainWorker.mjs (plain JavaScript, loaded from disk);
 * it loads the engine through engineBundle.mjs. One pool per process (kept on globalThis, as
 * Next may evaluate this module more than once).
 */
import { Worker } from "node:worker_threads";
import { availableParallelism } from "node:os";
import { existsSync } from "node:fs";
import { join } from "node:path";
import type { ChainContext, ChainState, StepOutput, StepSpec } from "../../engine/notebook";

/** A stored output without the state it handed down (kept per kind: Omit over the union). */
export type StoredStepOutput = StepOutput extends infer O ? (O extends StepOutput ? Omit<O, "state"> : never) : never;

export interface ChainTask {
  steps: readonly StepSpec[];
  context: ChainContext;
  /** First step to compute; `state` is what the step above it handed down. */
  from: number;
  state: ChainState;
  /** Steps not to compute, by index: their known output (the state received is handed down). */
  skip?: Record<number, StoredStepOutput>;
}

export interface ChainTaskResult {
  /** Outputs of steps from, from+1, … in order (all of them unless stopped). */
  outputs: StepOutput[];
  /** Set when the budget (time, or the worker's memory) ran out: the step that was running, and why. */
  stopped: { index: number; budgetMs: number; reason: "time" | "memory"; memoryMb: number } | null;
}

export interface RunOptions {
  budgetMs?: number;
  /** Told when the worker starts each step. */
  onStart?: (index: number) => void;
}

interface Pending {
  task: ChainTask;
  budgetMs: number;
  onStart?: (index: number) => void;
  resolve: (r: ChainTaskResult) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  job: (Pending & { id: number; outputs: StepOutput[]; current: number; timer: NodeJS.Timeout }) | null;
}

const positiveInt = (name: string, fallback: number): number => {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`invalid ${name}: ${JSON.stringify(raw)} (a positive whole number)`);
  return n;
};

export const defaultThreads = (): number => positiveInt("HEATBOOK_COMPUTE_THREADS", Math.max(2, availableParallelism() - 1));
export const defaultBudgetMs = (): number => positiveInt("HEATBOOK_COMPUTE_BUDGET_MS", 5000);
export const workerMemoryMb = (): number => positiveInt("HEATBOOK_COMPUTE_MEMORY_MB", 1024);

export class ComputePool {
  private readonly slots: Slot[] = [];
  private readonly queue: Pending[] = [];
  private nextId = 1;
  private readonly entry: string;
  private readonly root: string;
  private readonly memoryMb = workerMemoryMb();
  /** Times a worker was terminated at its budget (for tests and the health of the pool). */
  stops = 0;

  constructor(readonly size = defaultThreads(), root = process.env.HEATBOOK_ROOT ?? process.cwd()) {
    this.entry = join(root, "lib", "server", "compute", "chainWorker.mjs");
    if (!existsSync(this.entry)) throw new Error(`the compute worker ${this.entry} is missing (set HEATBOOK_ROOT to the app's folder)`);
    this.root = root;
  }

  /** Compute a chain task in a worker within its budget (default HEATBOOK_COMPUTE_BUDGET_MS). */
  run(task: ChainTask, opts: RunOptions = {}): Promise<ChainTaskResult> {
    return new Promise((resolve, reject) => {
      this.queue.push({ task, budgetMs: opts.budgetMs ?? defaultBudgetMs(), onStart: opts.onStart, resolve, reject });
      this.dispatch();
    });
  }

  /** Start every worker now (each loads the engine, ~1–5 s), so the first computation does not wait for it. */
  warm(): void {
    while (this.slots.length < this.size) this.spawn();
  }

  /** Stop every worker (tests; a server process just exits). */
  async close(): Promise<void> {
    const slots = this.slots.splice(0);
    await Promise.all(slots.map((s) => s.worker.terminate()));
  }

  private spawn(): Slot {
    const worker = new Worker(this.entry, { workerData: { root: this.root, testHooks: process.env.HEATBOOK_TEST_HOOKS === "1" }, resourceLimits: { maxOldGenerationSizeMb: this.memoryMb },
      // The entry is plain JavaScript: none of the parent's loader flags (e.g. a job process's --import tsx, which costs seconds per start).
      execArgv: [] });
    const slot: Slot = { worker, ready: false, job: null };
    worker.unref();
    worker.on("message", (m: WorkerMessage) => this.onMessage(slot, m));
    worker.on("error", (err) => this.onFailure(slot, err));
    worker.on("exit", (code) => { if (this.slots.includes(slot)) this.onFailure(slot, new Error(`compute worker exited (code ${code})`)); });
    this.slots.push(slot);
    return slot;
  }

  private dispatch(): void {
    while (this.queue.length) {
      const slot = this.slots.find((s) => s.ready && !s.job);
      if (!slot) {
        if (this.slots.length < this.size) this.spawn();
        return;
      }
      const p = this.queue.shift()!;
      const id = this.nextId++;
      const timer = setTimeout(() => this.stop(slot), p.budgetMs);
      slot.job = { ...p, id, outputs: [], current: p.task.from, timer };
      slot.worker.ref();
      const { steps, context, from, state, skip } = p.task;
      slot.worker.postMessage({ task: id, steps, context, from, state, skip: skip ?? {} });
    }
  }

  private onMessage(slot: Slot, m: WorkerMessage): void {
    if (m.type === "ready") {
      slot.ready = true;
      this.dispatch();
      return;
    }
    const job = slot.job;
    if (!job || m.task !== job.id) return;
    if (m.type === "start") {
      job.current = m.index;
      job.onStart?.(m.index);
    } else if (m.type === "step") {
      job.outputs.push(m.output);
      job.current = m.index + 1;
    } else {
      this.finish(slot);
      if (m.type === "end") job.resolve({ outputs: job.outputs, stopped: null });
      else job.reject(Object.assign(new Error(m.message), { stack: m.stack ?? m.message }));
    }
  }

  private finish(slot: Slot): void {
    if (slot.job) clearTimeout(slot.job.timer);
    slot.job = null;
    slot.worker.unref();
    this.dispatch();
  }

  /** Budget ran out: terminate the worker, replace it, hand back what was finished. */
  private stop(slot: Slot): void {
    const job = slot.job;
    if (!job) return;
    this.stops++;
    this.remove(slot);
    void slot.worker.terminate();
    job.resolve({ outputs: job.outputs, stopped: { index: job.current, budgetMs: job.budgetMs, reason: "time", memoryMb: this.memoryMb } });
    this.dispatch();
  }

  private onFailure(slot: Slot, err: Error): void {
    const job = slot.job;
    const wasReady = slot.ready;
    this.remove(slot);
    if (job) {
      clearTimeout(job.timer);
      // A step that outgrew the worker's heap is stopped like one over its time budget.
      if ((err as { code?: string }).code === "ERR_WORKER_OUT_OF_MEMORY") {
        this.stops++;
        job.resolve({ outputs: job.outputs, stopped: { index: job.current, budgetMs: job.budgetMs, reason: "memory", memoryMb: this.memoryMb } });
      } else job.reject(new Error(`the compute worker failed: ${err.message}`));
    }
    // A worker that cannot even start (its engine does not load) fails what waits, instead of respawning forever.
    if (!wasReady) for (const p of this.queue.splice(0)) p.reject(new Error(`the compute worker could not start: ${err.message}`));
    this.dispatch();
  }

  private remove(slot: Slot): void {
    const i = this.slots.indexOf(slot);
    if (i >= 0) this.slots.splice(i, 1);
  }
}

type WorkerMessage =
  | { type: "ready" }
  | { type: "start"; task: number; index: number }
  | { type: "step"; task: number; index: number; output: StepOutput }
  | { type: "end"; task: number }
  | { type: "error"; task: number; message: string; stack?: string };

const KEY = Symbol.for("heatbook.computePool");

/** This process's pool (created on first use). */
export function computePool(): ComputePool {
  const g = globalThis as { [KEY]?: ComputePool };
  return (g[KEY] ??= new ComputePool());
}
