/**
 * Computing a revision's steps on the server: hash each step's inputs; when every stored
 * output matches its hash, nothing is computed; otherwise the chain is computed (it is cheap:
 * milliseconds for thousands of points) and the outputs that changed are written back —
 * only for editable revisions (sealed ones are immutable and were fresh when sealed).
 */
import type { Db } from "../db/client";
import { ENGINE_VERSION } from "../../engine/version";
import { computeChainFrom, EMPTY_STATE, type ChainState, type StepOutput, type StepSpec, type ChainContext } from "../../engine/notebook";
import { inputHashes, loadContext } from "./context";

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

type StepRow = Awaited<ReturnType<Db["step"]["findMany"]>>[number];

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

export interface ComputeResult {
  steps: StepView[];
  context: ChainContext;
  computed: boolean;
  millis: number;
}

/**
 * The steps of one revision. "edit": stale outputs are recomputed and written back (each write
 * only if the step's version is still the one computed from). "frozen" (sealed revisions):
 * stored outputs as they are; `fresh` says whether today's engine and inputs give the same hash.
 */
export async function computeRevisionSteps(db: Db, groupId: string, sampleId: string, revisionId: string, mode: "edit" | "frozen"): Promise<ComputeResult> {
  const t0 = performance.now();
  const rows: StepRow[] = await db.step.findMany({ where: { revisionId }, orderBy: { position: "asc" } });
  const specs: StepSpec[] = rows.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  // Hashes need no point arrays; load them only if something must be computed.
  let context = await loadContext(db, groupId, sampleId, specs, { points: false });
  const hashes = inputHashes(specs, context);
  const stale = rows.map((r, i) => r.inputHash !== hashes[i] || r.output === null);
  let outputs: (StoredOutput | null)[] = rows.map((r) => (r.output as StoredOutput | null) ?? null);
  const computed = mode === "edit" && stale.some(Boolean);
  const now = new Date();
  if (computed) {
    context = await loadContext(db, groupId, sampleId, specs);
    const { from, state } = resumePoint(stale, hashes);
    const fresh = computeChainFrom(specs, context, from, state);
    fresh.forEach((o, k) => rememberState(hashes[from + k]!, o.state));
    outputs = [...outputs.slice(0, from), ...fresh.map(strip)];
    await db.$transaction(
      rows
        .map((r, i) => ({ r, i }))
        .filter(({ i }) => stale[i])
        .map(({ r, i }) =>
          db.step.updateMany({
            where: { id: r.id, version: r.version },
            data: { output: outputs[i] as object, inputHash: hashes[i]!, engineVersion: ENGINE_VERSION, computedAt: now },
          }),
        ),
    );
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
