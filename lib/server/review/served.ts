/**
 * What pages, the JSON API, series tables and exports serve of a sealed (or replaced) revision:
 * its snapshot, never the step rows beside it. Before serving, the snapshot is checked against
 * the revision's content hash; a snapshot that does not match is refused with a ConflictError
 * that names the revision (nothing of it is served). The stored rows are compared with the
 * snapshot by Verify (integrity.ts), which names what differs.
 */
import { ConflictError } from "../../engine/errors";
import { contentHash } from "../hash";
import type { RevisionSnapshot, SnapshotStep } from "./snapshot";
import type { StepView, StoredOutput } from "../notebook/compute";
import type { StepRow } from "../notebook/read";
import type { Db } from "../db/client";
import type { StepSpec } from "../../engine/notebook";
import { inputHashes } from "../notebook/context";
import { contextFromSnapshot } from "./verify";

export const SEALED_STATES = ["sealed", "replaced"] as const;
export const isSealedState = (state: string) => state === "sealed" || state === "replaced";

/** The refusal when a sealed revision's stored snapshot does not match its content hash. */
export function snapshotMismatch(number: number, analysisTitle?: string): ConflictError {
  return new ConflictError(
    `revision ${number}${analysisTitle ? ` of “${analysisTitle}”` : ""} is sealed, but its stored snapshot no longer matches its content hash: its numbers are not served. Run Verify on the analysis page or \`heatbook audit verify\`, and restore the group from a backup`,
    { check: "content-hash" },
  );
}

/** The revision's snapshot, checked against its content hash (ConflictError otherwise). */
export function intactSnapshot(rev: { number: number; contentHash: string | null; snapshot: unknown }, analysisTitle?: string): RevisionSnapshot {
  if (!rev.snapshot || !rev.contentHash || contentHash(rev.snapshot) !== rev.contentHash) throw snapshotMismatch(rev.number, analysisTitle);
  return rev.snapshot as RevisionSnapshot;
}

export interface SealedStep extends SnapshotStep {
  output: StoredOutput | null;
}

/** The snapshot's steps in order, each with its sealed output. */
export function sealedSteps(s: RevisionSnapshot): SealedStep[] {
  return s.inputs.steps.map((st, i) => ({ ...st, output: s.outputs.steps[i]?.id === st.id ? s.outputs.steps[i]!.output : (s.outputs.steps.find((o) => o.id === st.id)?.output ?? null) }));
}

/**
 * The notebook's step views of a sealed revision, from its snapshot. `fresh` says whether
 * today's engine, given the sealed inputs (pinned context), gives the same input hash. Verified
 * snapshots are remembered per process by (revision id, content hash): both are fixed at sealing.
 * A snapshot that does not match its content hash gives the rows without outputs and `problem`.
 */
export async function sealedStepViews(db: Db, rev: { id: string; number: number; contentHash: string | null }, rows: readonly StepRow[]): Promise<{ steps: StepView[]; problem: string | null }> {
  const key = `${rev.id} ${rev.contentHash}`;
  let snap = verified.get(key) ?? null;
  if (!snap) {
    const r = await db.analysisRevision.findUnique({ where: { id: rev.id }, select: { number: true, contentHash: true, snapshot: true } });
    try {
      snap = intactSnapshot(r ?? { number: rev.number, contentHash: null, snapshot: null });
    } catch (err) {
      const steps = rows.map((r): StepView => ({ id: r.id, position: r.position, kind: r.kind, title: r.title, config: r.config, version: r.version, output: null, inputHash: r.inputHash ?? "", fresh: false, engineVersion: r.engineVersion, computedAt: r.computedAt?.toISOString() ?? null, updatedAt: r.updatedAt.toISOString() }));
      return { steps, problem: (err as Error).message };
    }
    verified.set(key, snap);
    while (verified.size > VERIFIED_CACHE) verified.delete(verified.keys().next().value!);
  }
  const s = snap;
  const specs: StepSpec[] = s.inputs.steps.map((st) => ({ id: st.id, kind: st.kind as StepSpec["kind"], config: st.config }));
  const hashes = inputHashes(specs, contextFromSnapshot(s));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const steps = sealedSteps(s).map((st, i): StepView => {
    const row = byId.get(st.id);
    return {
      id: st.id, position: st.position, kind: st.kind, title: st.title, config: st.config, version: row?.version ?? 1, output: st.output, inputHash: st.inputHash,
      fresh: hashes[i] === st.inputHash, engineVersion: st.engineVersion, computedAt: row?.computedAt?.toISOString() ?? null, updatedAt: row?.updatedAt.toISOString() ?? s.seal.sealedAt,
    };
  });
  return { steps, problem: null };
}

const VERIFIED_CACHE = 64;
const verified = new Map<string, RevisionSnapshot>();
