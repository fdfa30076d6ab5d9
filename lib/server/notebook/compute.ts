/**
 * Computing a revision's steps on the server: hash each step's inputs; when every stored
 * output matches its hash, nothing is computed; otherwise the chain is computed in the worker
 * pool (lib/server/compute: never on the request thread, each task within a time budget; a step
 * stopped at the budget is stored as the failure "stopped after N s: time budget" and kept in
 * ComputeStop by its input hash, so it is not run again) and the outputs that changed are
 * written back — only for editable revisions (sealed ones are immutable and were fresh when
 * sealed). Two requests that need the same computation share it.
 *
 * Stored outputs are read only when needed and kept per process by (step id, stored input
 * hash): a step's output and its input hash are always written together, and the hash names
 * every input of the engine's deterministic computation, so the pair names one output for
 * good — a cached copy can never be out of date, whichever instance wrote the row. The cache
 * keeps each output's JSON text beside the parsed value, so a notebook response can carry the
 * text as it is (outputJson) instead of serialising the same output on every read.
 */
import { sqlRows, type Db } from "../db/client";
import { ENGINE_VERSION } from "../../engine/version";
import { computeChainFrom, EMPTY_STATE, type ChainState, type StepOutput, type StepSpec, type ChainContext, type ChainMeasurement, type ChainSample } from "../../engine/notebook";
import { inputHashes, loadMeasurements, loadSample, referencedMeasurements } from "./context";
import type { StepRow } from "./read";
import { computeChainBounded, defaultBudgetMs, knownStops, recordStops } from "../compute";

export type StoredOutput = Omit<StepOutput, "state">;

export interface StepView {
  id: string;
  position: number;
  kind: string;
  title: string;
  config: unknown;
  version: number;
  output: StoredOutput | null;
  inputHash: string;
  /** Whether the stored output was computed from exactly these inputs. */
  fresh: boolean;
  engineVersion: string | null;
  computedAt: string | null;
  updatedAt: string;
}

/** Everything of a step row but its output (which is read separately, and only if needed). */
const STEP_META = { id: true, position: true, kind: true, title: true, config: true, version: true, inputHash: true, engineVersion: true, computedAt: true, updatedAt: true } as const;

const strip = ({ state: _state, ...rest }: StepOutput): StoredOutput => rest;

/**
 * The state each computed step handed down, by its input hash (per process, small LRU). A hash
 * names the step's inputs exactly, so a hit is the state that step would hand down now; it lets a
 * changed fit window recompute the fit and the steps below without redoing the data steps above.
 */
const STATE_CACHE_SIZE = 128;
const stateCache = new Map<string, ChainState>();

function rememberState(hash: string, state: ChainState): void {
  stateCache.delete(hash);
  stateCache.set(hash, state);
  while (stateCache.size > STATE_CACHE_SIZE) stateCache.delete(stateCache.keys().next().value!);
}

/** The first step to compute, and the state to start it from: after the longest fresh, cached top. */
function resumePoint(stale: readonly boolean[], hashes: readonly string[]): { from: number; state: ChainState } {
  let from = 0;
  let state: ChainState = EMPTY_STATE;
  for (let i = 0; i < stale.length && !stale[i]; i++) {
    const cached = stateCache.get(hashes[i]!);
    if (!cached) break;
    from = i + 1;
    state = cached;
  }
  return { from, state };
}

/**
 * Stored outputs by `${step id} ${input hash}` (per process, LRU, bounded by the total length of
 * their JSON text; each value is immutable and shared by every view that shows it).
 */
const OUTPUT_CACHE_CHARS = 32 * 2 ** 20;
const outputCache = new Map<string, StoredOutput>();
const textOf = new WeakMap<object, string>();
let cachedChars = 0;
const outputKey = (id: string, hash: string) => `${id} ${hash}`;

/** The output as parsed from its JSON text, remembered with that text. */
function fromText(text: string): StoredOutput {
  const value = JSON.parse(text) as StoredOutput;
  textOf.set(value, text);
  return value;
}

/** The JSON text of an output handed out by this module (what is stored), else its serialisation. */
export function outputJson(output: StoredOutput): string {
  return textOf.get(output) ?? JSON.stringify(output);
}

function rememberOutput(key: string, output: StoredOutput): void {
  const old = outputCache.get(key);
  if (old) {
    outputCache.delete(key);
    cachedChars -= outputJson(old).length;
  }
  outputCache.set(key, output);
  cachedChars += outputJson(output).length;
  while (cachedChars > OUTPUT_CACHE_CHARS && outputCache.size > 1) {
    const [k, v] = outputCache.entries().next().value!;
    outputCache.delete(k);
    cachedChars -= outputJson(v).length;
  }
}

/**
 * The stored output of each wanted row (null when it has none), from the cache or in one query.
 * `hashes` starts as each row's stored input hash and is updated if a row was rewritten since
 * it was read, so output and hash always belong together.
 */
async function storedOutputs(db: Db, rows: readonly StepRow[], wanted: readonly boolean[], hashes: (string | null)[]): Promise<(StoredOutput | null)[]> {
  const out: (StoredOutput | null)[] = rows.map(() => null);
  const missing: string[] = [];
  rows.forEach((r, i) => {
    if (!wanted[i] || hashes[i] === null) return;
    const key = outputKey(r.id, hashes[i]!);
    const hit = outputCache.get(key);
    if (hit) rememberOutput(key, (out[i] = hit));
    else missing.push(r.id);
  });
  if (missing.length === 0) return out;
  const got = await sqlRows<{ id: string; inputHash: string | null; output: string | null }>(db, `SELECT "id"::text AS "id", "inputHash", "output"::text AS "output" FROM "Step" WHERE "id" = ANY($1::uuid[])`, [missing]);
  for (const g of got) {
    const i = rows.findIndex((r) => r.id === g.id);
    const output = g.output === null || g.output === "null" ? null : fromText(g.output);
    hashes[i] = g.inputHash;
    out[i] = output;
    if (output && g.inputHash) rememberOutput(outputKey(g.id, g.inputHash), output);
  }
  return out;
}

/**
 * Write recomputed outputs in one statement (one JSON text parameter per row; Prisma's own Json
 * write walks the object and took ~3× as long for a 400 kB fit output). "updatedAt" stays: it is
 * when the step was last edited (computedAt says when it was computed), so a view shows the same
 * row before and after its outputs are written. A row whose version changed meanwhile (someone
 * saved it) is left alone. Not waiting for the commit to reach disk is safe here: an output is a cache
 * of a deterministic computation, written with its input hash in the same row, so a crash can
 * only lose the new pair and leave the old one, which the next open finds stale and recomputes.
 */
async function writeOutputs(db: Db, rows: { id: string; version: number; output: StoredOutput; inputHash: string }[], now: Date): Promise<void> {
  if (rows.length === 0) return;
  const at = now.toISOString();
  await db.$transaction([
    db.$executeRaw`SET LOCAL synchronous_commit = off`,
    db.$executeRaw`UPDATE "Step" AS s SET "output" = u.o::json, "inputHash" = u.h, "engineVersion" = ${ENGINE_VERSION},
      "computedAt" = (${at}::timestamptz AT TIME ZONE 'UTC')
      FROM unnest(${rows.map((r) => r.id)}::uuid[], ${rows.map((r) => outputJson(r.output))}::text[], ${rows.map((r) => r.inputHash)}::text[], ${rows.map((r) => r.version)}::int[]) AS u(id, o, h, v)
      WHERE s."id" = u.id AND s."version" = u.v`,
  ]);
}

/** Computations under way in this process, by revision, input hashes and budget. */
const inflight = new Map<string, Promise<{ from: number; outputs: StoredOutput[]; context: ChainContext }>>();

/** Compute the stale part of a chain in the pool and write the outputs that changed. */
async function recompute(db: Db, groupId: string, rows: readonly StepRow[], specs: readonly StepSpec[], context: ChainContext, hashes: readonly string[], stale: readonly boolean[], now: Date, budgetMs: number | null, onProgress?: ComputeOptions["onProgress"]) {
  const { from, state } = resumePoint(stale, hashes);
  // Point arrays only for the measurements the steps to compute read (none for a refit).
  const needed = referencedMeasurements(specs.slice(from));
  if (needed.length) context = { ...context, measurements: { ...context.measurements, ...(await loadMeasurements(db, groupId, needed)) } };
  const started = performance.now();
  const onStart = onProgress && ((i: number) => onProgress({ stepId: rows[i]!.id, position: i, runningMs: performance.now() - started }));
  // budgetMs null: on this thread (job processes), else in the pool within the budget.
  const { outputs: fresh, stopped } = budgetMs === null
    ? { outputs: computeChainFrom(specs, context, from, state), stopped: [] as number[] }
    : await computeChainBounded(specs, context, from, state, { budgetMs, skip: await knownStops(db, specs, hashes, from, budgetMs), onStart });
  fresh.forEach((o, k) => rememberState(hashes[from + k]!, o.state));
  // Each new output as its JSON text reads back: the same value whether computed or stored.
  const outputs = fresh.map((o) => fromText(JSON.stringify(strip(o))));
  if (budgetMs !== null) await recordStops(db, stopped.map((i) => ({ inputHash: hashes[i]!, kind: specs[i]!.kind, error: fresh[i - from]!.error ?? "" })), budgetMs);
  // Every stale step is at or below `from` (resumePoint stops at the first stale one).
  await writeOutputs(db, rows.flatMap((r, i) => (stale[i] ? [{ id: r.id, version: r.version, output: outputs[i - from]!, inputHash: hashes[i]! }] : [])), now);
  rows.forEach((r, i) => { if (i >= from) rememberOutput(outputKey(r.id, hashes[i]!), outputs[i - from]!); });
  return { from, outputs, context };
}

export interface ComputeResult {
  steps: StepView[];
  context: ChainContext;
  computed: boolean;
  /** True when the answer came before the computation ended (waitMs): stale steps have no output yet. */
  computing?: boolean;
  millis: number;
}

export interface ComputeOptions {
  /** Time budget of each task in the pool (default HEATBOOK_COMPUTE_BUDGET_MS). */
  budgetMs?: number;
  /** Answer after this long even if the computation goes on (then `computing` is set); default: wait for it. */
  waitMs?: number;
  /** Called when a computation answered as `computing` has ended (its outputs are written). */
  whenDone?: () => void;
  /**
   * Compute on this thread, without the pool or a budget: for background-job processes, which
   * serve no requests and have their own time limit (the job's expiry).
   */
  inThread?: boolean;
  /** Told as the worker starts each step (shared computations tell only the first caller). */
  onProgress?: (p: { stepId: string; position: number; runningMs: number }) => void;
}

/** How long a page request waits for its notebook's computation before it answers "computing" (HEATBOOK_COMPUTE_WAIT_MS). */
export function defaultWaitMs(): number {
  const raw = process.env.HEATBOOK_COMPUTE_WAIT_MS;
  const n = raw === undefined || raw === "" ? 15_000 : Number(raw);
  if (!Number.isInteger(n) || n < 0) throw new Error(`invalid HEATBOOK_COMPUTE_WAIT_MS: ${JSON.stringify(raw)} (milliseconds, a whole number)`);
  return n;
}

/**
 * The steps of one revision. "edit": stale outputs are recomputed and written back (each write
 * only if the step's version is still the one computed from). "frozen" (sealed revisions):
 * stored outputs as they are; `fresh` says whether today's engine and inputs give the same hash.
 */
export async function computeRevisionSteps(
  db: Db, groupId: string, sampleId: string, revisionId: string, mode: "edit" | "frozen",
  preloaded?: { steps: StepRow[]; sample: ChainSample; measurements: Record<string, ChainMeasurement> },
  opts: ComputeOptions = {},
): Promise<ComputeResult> {
  const t0 = performance.now();
  const rows: StepRow[] = preloaded?.steps ?? (await db.step.findMany({ where: { revisionId }, orderBy: { position: "asc" }, select: STEP_META }));
  const specs: StepSpec[] = rows.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  // Hashes need no point arrays; load them only if something must be computed.
  const ids = referencedMeasurements(specs);
  const [sample, meta] = preloaded
    ? [preloaded.sample, Object.fromEntries(ids.flatMap((id) => (preloaded.measurements[id] ? [[id, preloaded.measurements[id]!]] : [])))]
    : await Promise.all([loadSample(db, groupId, sampleId), loadMeasurements(db, groupId, ids, { points: false })]);
  let context: ChainContext = { sample, measurements: meta };
  const hashes = inputHashes(specs, context);
  const storedHash = rows.map((r) => r.inputHash);
  let stale = rows.map((r, i) => storedHash[i] !== hashes[i]);
  // Editing recomputes from the first stale step down, so only the outputs above it are read.
  const firstStale = stale.indexOf(true);
  const wanted = rows.map((_, i) => mode === "frozen" || firstStale < 0 || i < firstStale);
  let outputs = await storedOutputs(db, rows, wanted, storedHash);
  stale = rows.map((_, i) => storedHash[i] !== hashes[i] || (wanted[i] && outputs[i] === null));
  const computed = mode === "edit" && stale.some(Boolean);
  const now = new Date();
  if (computed) {
    const key = `${revisionId} ${hashes.join(" ")} ${opts.budgetMs ?? ""}`;
    let shared = inflight.get(key);
    if (!shared) {
      shared = recompute(db, groupId, rows, specs, context, hashes, stale, now, opts.inThread ? null : (opts.budgetMs ?? defaultBudgetMs()), opts.onProgress).finally(() => inflight.delete(key));
      inflight.set(key, shared);
    }
    const done = opts.waitMs === undefined ? await shared : await Promise.race([shared, new Promise<null>((ok) => setTimeout(() => ok(null), opts.waitMs).unref())]);
    if (done === null) {
      // Still computing: answer with what is stored (the stale steps say so) and tell the caller when it is done.
      shared.then(() => opts.whenDone?.(), () => opts.whenDone?.());
      const steps = rows.map((r, i): StepView => ({
        id: r.id, position: r.position, kind: r.kind, title: r.title, config: r.config, version: r.version, output: stale[i] ? null : (outputs[i] ?? null),
        inputHash: hashes[i]!, fresh: !stale[i], engineVersion: r.engineVersion, computedAt: r.computedAt?.toISOString() ?? null, updatedAt: r.updatedAt.toISOString(),
      }));
      return { steps, context, computed: false, computing: true, millis: performance.now() - t0 };
    }
    context = done.context;
    outputs = [...outputs.slice(0, done.from), ...done.outputs];
  }
  const steps = rows.map((r, i): StepView => {
    const recomputed = computed && stale[i];
    return {
      id: r.id, position: r.position, kind: r.kind, title: r.title, config: r.config, version: r.version, output: outputs[i] ?? null,
      inputHash: hashes[i]!, fresh: recomputed || !stale[i], engineVersion: recomputed ? ENGINE_VERSION : r.engineVersion,
      computedAt: recomputed ? now.toISOString() : (r.computedAt?.toISOString() ?? null), updatedAt: r.updatedAt.toISOString(),
    };
  });
  return { steps, context, computed, millis: performance.now() - t0 };
}
