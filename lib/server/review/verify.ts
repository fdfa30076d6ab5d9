/**
 * Verifying a sealed revision: (1) the stored snapshot still hashes to its content hash;
 * (2) each measurement's original file still has the checksum the snapshot recorded; (2b) the
 * stored step rows, measurements and the approval's audit event agree with the snapshot
 * (integrity.ts names the first that does not); (3) the
 * notebook engine, re-run on the snapshot's inputs alone (computeChain, pure), reproduces every
 * step's output — exactly under the same engine version, or within a relative tolerance of
 * 1e-9 on every number when the engine version differs. Reported per step.
 */
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { ENGINE_VERSION } from "../../engine/version";
import { computeChain, EMPTY_STATE, type ChainContext, type ChainMeasurement, type StepOutput, type StepSpec } from "../../engine/notebook";
import { computeChainBounded, defaultBudgetMs, isBudgetFailure } from "../compute";
import { inputHashes } from "../notebook/context";
import { authorise, type Member } from "../access";
import { contentHash } from "../hash";
import { uuidOrNone } from "../samples";
import { compareJson } from "./compare";
import type { RevisionSnapshot } from "./snapshot";
import { checkSealedRevision, type MismatchCheck } from "./integrity";
import { describeContextChanges, pinnedContext, type ContextChange } from "./context";

/** Relative tolerance across engine versions (every number of every output). */
export const CROSS_VERSION_TOLERANCE = 1e-9;

export interface StepVerification {
  stepId: string;
  position: number;
  kind: string;
  inputHashReproduced: boolean;
  outcome: "identical" | "within-tolerance" | "differs";
  /** Largest relative difference of a number; null when something other than a number differs. */
  maxRelDiff: number | null;
  firstDifference: string | null;
}

export interface VerifyReport {
  revisionId: string;
  number: number;
  ok: boolean;
  storedHash: string;
  recomputedHash: string;
  hashMatches: boolean;
  files: { measurementId: string; fileId: string; sha256: string; matches: boolean }[];
  sealedEngineVersion: string;
  currentEngineVersion: string;
  tolerance: number;
  steps: StepVerification[];
  summary: string;
  /** Everything stored that differs from the snapshot, in check order (integrity.ts); empty when ok. */
  mismatches: { check: MismatchCheck; what: string }[];
  /** Sample fields changed since sealing (not a failure: the sealed context is pinned). */
  contextChanges: ContextChange[];
  /** Set when the snapshot predates pinning composition (format 1). */
  contextNote: string | null;
}

/** The chain's context rebuilt from the snapshot alone (no database). */
export function contextFromSnapshot(s: RevisionSnapshot): ChainContext {
  const measurements: Record<string, ChainMeasurement> = {};
  for (const m of s.inputs.measurements)
    measurements[m.id] = { id: m.id, label: m.label, kind: m.kind, basis: m.basis, fieldT: m.fieldT, sha256: m.file.sha256, temperatureK: m.points.temperatureK, heatCapacity: m.points.heatCapacity, sigma: m.points.sigma };
  return { sample: s.inputs.sample, measurements };
}

/** Re-run the snapshot's chain and compare with its stored outputs, step by step (on this thread: CLI and jobs). */
export function reproduceSnapshot(s: RevisionSnapshot, engineVersion = ENGINE_VERSION): StepVerification[] {
  const specs = snapshotSpecs(s);
  const ctx = contextFromSnapshot(s);
  return compareOutputs(s, specs, ctx, computeChain(specs, ctx), engineVersion);
}

/**
 * reproduceSnapshot with the chain computed in the worker pool (lib/server/compute), for request
 * handlers: a verification never blocks other requests. A step over the budget (default 6× the
 * notebook's) does not reproduce, and says why.
 */
export async function reproduceSnapshotOffThread(s: RevisionSnapshot, budgetMs = 6 * defaultBudgetMs()): Promise<StepVerification[]> {
  const specs = snapshotSpecs(s);
  const ctx = contextFromSnapshot(s);
  const { outputs } = await computeChainBounded(specs, ctx, 0, EMPTY_STATE, { budgetMs });
  return compareOutputs(s, specs, ctx, outputs, ENGINE_VERSION);
}

const snapshotSpecs = (s: RevisionSnapshot): StepSpec[] => s.inputs.steps.map((st) => ({ id: st.id, kind: st.kind as StepSpec["kind"], config: st.config }));

function compareOutputs(s: RevisionSnapshot, specs: StepSpec[], ctx: ChainContext, outputs: StepOutput[], engineVersion: string): StepVerification[] {
  const hashes = inputHashes(specs, ctx);
  const rel = s.engineVersion === engineVersion ? 0 : CROSS_VERSION_TOLERANCE;
  return s.inputs.steps.map((st, i) => {
    const { state: _state, ...fresh } = outputs[i]!;
    const c = compareJson(JSON.parse(JSON.stringify(fresh)), s.outputs.steps[i]?.output ?? null, rel);
    return {
      stepId: st.id, position: st.position, kind: st.kind, inputHashReproduced: hashes[i] === st.inputHash,
      outcome: c.exact ? "identical" : c.equal ? "within-tolerance" : "differs", maxRelDiff: Number.isFinite(c.maxRelDiff) ? c.maxRelDiff : null,
      // A re-run stopped at its time budget says so instead of naming the first differing field.
      firstDifference: !c.equal && isBudgetFailure(fresh) ? fresh.error : c.firstDifference,
    };
  });
}

/** Verify one sealed (or replaced) revision of an analysis in the member's group. */
export async function verifyRevision(db: Db, member: Member, analysisId: string, revisionId: string): Promise<VerifyReport> {
  authorise(member, "group.read");
  const rev = await db.analysisRevision.findFirst({ where: { id: uuidOrNone(revisionId), analysisId: uuidOrNone(analysisId), analysis: { groupId: member.group.id } } });
  if (!rev) throw new NotFoundError("revision");
  if (!rev.snapshot || !rev.contentHash) throw new ConflictError(`revision ${rev.number} is not sealed: there is nothing to verify`);
  const snapshot = rev.snapshot as unknown as RevisionSnapshot;
  const recomputedHash = contentHash(snapshot);
  const check = await checkSealedRevision(db, { ...rev, groupId: member.group.id }, { offThread: true });
  const steps = check.steps;
  const hashMatches = recomputedHash === rev.contentHash;
  const ok = check.mismatches.length === 0;
  const first = check.mismatches[0];
  const context = pinnedContext(snapshot);
  const changed = describeContextChanges(check.contextChanges);
  const verdict = first
    ? `${check.mismatches.length} mismatch${check.mismatches.length === 1 ? "" : "es"} with the sealed snapshot; first: ${first.what}`
    : snapshot.engineVersion === ENGINE_VERSION
      ? `content hash verified; stored steps, measurements and files match the snapshot; all ${steps.length} steps reproduce exactly (engine ${ENGINE_VERSION})`
      : `content hash verified; stored steps, measurements and files match the snapshot; all ${steps.length} steps reproduce within ${CROSS_VERSION_TOLERANCE} relative (sealed with engine ${snapshot.engineVersion}, now ${ENGINE_VERSION})`;
  const summary = [verdict, changed ? `${changed} (the sealed numbers and the sealed context are unchanged)` : null, context.note].filter(Boolean).join(". ");
  return {
    revisionId: rev.id, number: rev.number, ok, storedHash: rev.contentHash, recomputedHash, hashMatches, files: check.files,
    sealedEngineVersion: snapshot.engineVersion, currentEngineVersion: ENGINE_VERSION, tolerance: snapshot.engineVersion === ENGINE_VERSION ? 0 : CROSS_VERSION_TOLERANCE, steps, summary,
    mismatches: check.mismatches.map((m) => ({ check: m.check, what: m.what })), contextChanges: check.contextChanges, contextNote: context.note,
  };
}
