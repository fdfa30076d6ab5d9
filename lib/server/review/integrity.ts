/**
 * Is what the database holds for a sealed revision still what was sealed? The snapshot is the
 * one truth; everything else is compared with it and every difference is named:
 *
 *   content-hash   the snapshot no longer hashes to the revision's content hash
 *   audit-seal     the approval's audit event records another content hash (or none exists)
 *   seal-record    the revision row's sealer, seal time, analysis or number differ from the snapshot
 *   step-row       a stored step row (kind, position, configuration, input hash, engine version,
 *                  output) differs from the snapshot, or a step row was added or removed
 *   measurement    a measurement the snapshot used is gone or its points, basis or field differ
 *   file           an original file is gone or no longer has the checksum recorded at sealing
 *   engine         the engine, re-run on the snapshot's inputs, does not reproduce a step
 *
 * A sample record edited since sealing is not a mismatch (the sealed numbers do not depend on
 * it: the context is pinned in the snapshot); it is reported separately as a context change.
 */
import type { Db } from "../db/client";
import { toSampleInfo } from "../samples";
import { canonicalJson } from "../../engine/canonical";
import { contentHash, sha256Hex } from "../hash";
import { unpackFloat64 } from "../packing";
import { compareJson } from "./compare";
import { contextChanges, describeContextChanges, pinnedContext, type ContextChange } from "./context";
import type { RevisionSnapshot } from "./snapshot";
import { reproduceSnapshot, reproduceSnapshotOffThread, type StepVerification } from "./verify";

export type MismatchCheck = "content-hash" | "audit-seal" | "seal-record" | "step-row" | "measurement" | "file" | "engine" | "context";

export interface SealMismatch {
  revisionId: string;
  analysisId: string;
  groupId: string;
  number: number;
  check: MismatchCheck;
  /** What differs, named: "step 3 (fit) output at result.fit.parameters[0].value". */
  what: string;
}

export interface SealedRevisionRow {
  id: string;
  number: number;
  analysisId: string;
  groupId: string;
  contentHash: string | null;
  snapshot: unknown;
  sealedById: string | null;
  sealedAt: Date | null;
}

export interface SealedRevisionCheck {
  mismatches: SealMismatch[];
  /** The engine re-run per step (empty when `engine: false`). */
  steps: StepVerification[];
  contextChanges: ContextChange[];
  /** Files: checksum recorded at sealing and whether the stored bytes still have it. */
  files: { measurementId: string; fileId: string; sha256: string; matches: boolean }[];
}

const stepName = (position: number, kind: string) => `step ${position + 1} (${kind})`;

function firstDiff(a: unknown, b: unknown): string | null {
  if (canonicalJson(a ?? null) === canonicalJson(b ?? null)) return null;
  return compareJson(a ?? null, b ?? null, 0).firstDifference ?? "(value)";
}

async function stepMismatches(db: Db, s: RevisionSnapshot, revisionId: string, push: (c: MismatchCheck, what: string) => void): Promise<void> {
  const rows = await db.step.findMany({ where: { revisionId }, orderBy: { position: "asc" }, select: { id: true, position: true, kind: true, config: true, inputHash: true, engineVersion: true, output: true } });
  const byId = new Map(rows.map((r) => [r.id, r]));
  for (const [i, st] of s.inputs.steps.entries()) {
    const row = byId.get(st.id);
    const name = stepName(st.position, st.kind);
    if (!row) { push("step-row", `${name}: its stored row is missing`); continue; }
    if (row.position !== st.position) push("step-row", `${name}: stored at position ${row.position + 1}`);
    if (row.kind !== st.kind) push("step-row", `${name}: stored kind is ${row.kind}`);
    const config = firstDiff(row.config, st.config);
    if (config) push("step-row", `${name}: stored configuration differs at ${config}`);
    if (row.inputHash !== st.inputHash) push("step-row", `${name}: stored input hash differs`);
    if ((row.engineVersion ?? null) !== st.engineVersion) push("step-row", `${name}: stored engine version ${row.engineVersion ?? "none"}, sealed ${st.engineVersion}`);
    const output = firstDiff(row.output, s.outputs.steps[i]?.output);
    if (output) push("step-row", `${name}: stored output differs from the sealed snapshot at ${output}`);
  }
  const sealedIds = new Set(s.inputs.steps.map((st) => st.id));
  for (const r of rows) if (!sealedIds.has(r.id)) push("step-row", `a stored ${stepName(r.position, r.kind)} is not in the sealed snapshot`);
}

function sameNumbers(a: readonly number[] | null, b: readonly number[] | null): boolean {
  if (a === null || b === null) return a === b;
  return a.length === b.length && a.every((v, i) => Object.is(v, b[i]));
}

async function measurementMismatches(db: Db, s: RevisionSnapshot, push: (c: MismatchCheck, what: string) => void): Promise<SealedRevisionCheck["files"]> {
  const files: SealedRevisionCheck["files"] = [];
  for (const m of s.inputs.measurements) {
    const row = await db.measurement.findUnique({ where: { id: m.id }, select: { basis: true, fieldT: true, temperatureK: true, heatCapacity: true, sigma: true, file: { select: { id: true, sha256: true, bytes: true } } } });
    const name = `measurement “${m.label}” (${m.id.slice(0, 8)})`;
    if (!row) { push("measurement", `${name} is missing`); files.push({ measurementId: m.id, fileId: m.file.id, sha256: m.file.sha256, matches: false }); continue; }
    if (row.basis !== m.basis || row.fieldT !== m.fieldT) push("measurement", `${name}: stored basis or field differs from the sealed snapshot`);
    if (!sameNumbers(unpackFloat64(row.temperatureK), m.points.temperatureK)) push("measurement", `${name}: stored temperatures differ from the sealed snapshot`);
    if (!sameNumbers(unpackFloat64(row.heatCapacity), m.points.heatCapacity)) push("measurement", `${name}: stored heat capacities differ from the sealed snapshot`);
    if (!sameNumbers(row.sigma ? unpackFloat64(row.sigma) : null, m.points.sigma)) push("measurement", `${name}: stored σ differ from the sealed snapshot`);
    const matches = row.file.id === m.file.id && row.file.sha256 === m.file.sha256 && sha256Hex(row.file.bytes) === m.file.sha256;
    if (!matches) push("file", `original file ${m.file.fileName} of ${name} no longer has the SHA-256 recorded at sealing`);
    files.push({ measurementId: m.id, fileId: m.file.id, sha256: m.file.sha256, matches });
  }
  return files;
}

/**
 * A sample record may change after sealing (the sealed context is pinned), but only through the
 * app, which audits every edit: a change with no audited edit of the sample after the seal, or a
 * record that differs from what its last audited edit recorded, was made behind the app's back.
 */
async function unauditedContextChange(db: Db, rev: SealedRevisionRow, sample: Parameters<typeof toSampleInfo>[0], what: string, push: (check: MismatchCheck, what: string) => void): Promise<void> {
  const events = await db.auditEvent.findMany({
    where: { objectType: "sample", objectId: sample.id, action: { in: ["sample.create", "sample.update", "sample.archive", "sample.restore"] } },
    orderBy: { id: "desc" }, select: { action: true, at: true, afterHash: true },
  });
  const sealedAt = rev.sealedAt?.getTime() ?? 0;
  if (!events.some((e) => e.action === "sample.update" && e.at.getTime() >= sealedAt)) {
    push("context", `the sample record differs from the sealed context (${what}) but no audited edit of the sample followed the seal`);
    return;
  }
  const last = events[0]!;
  if (last.action === "sample.update" && last.afterHash !== contentHash(toSampleInfo(sample))) push("context", `the sample record (${what}) differs from what its last audited edit recorded`);
}

/** Every check of one sealed (or replaced) revision; see the module comment. */
export async function checkSealedRevision(db: Db, rev: SealedRevisionRow, opts: { engine?: boolean; offThread?: boolean } = {}): Promise<SealedRevisionCheck> {
  const mismatches: SealMismatch[] = [];
  const push = (check: MismatchCheck, what: string) => mismatches.push({ revisionId: rev.id, analysisId: rev.analysisId, groupId: rev.groupId, number: rev.number, check, what });
  if (!rev.snapshot || !rev.contentHash) {
    push("seal-record", "the revision is sealed but has no snapshot or content hash");
    return { mismatches, steps: [], contextChanges: [], files: [] };
  }
  const s = rev.snapshot as RevisionSnapshot;
  if (contentHash(s) !== rev.contentHash) push("content-hash", "the stored snapshot does not match its content hash");
  if (!Array.isArray(s.inputs?.steps) || !Array.isArray(s.inputs?.measurements) || !Array.isArray(s.outputs?.steps) || !s.inputs?.sample) {
    push("seal-record", `the stored snapshot is not a Heatbook seal this build reads (format ${JSON.stringify(s.format ?? null)})`);
    return { mismatches, steps: [], contextChanges: [], files: [] };
  }
  const seal = await db.auditEvent.findFirst({ where: { action: "revision.approve", objectId: rev.id }, orderBy: { id: "desc" }, select: { id: true, afterHash: true } });
  if (!seal) push("audit-seal", "no audit event records this seal");
  else if (seal.afterHash !== rev.contentHash) push("audit-seal", `the approval's audit event ${seal.id} records content hash ${seal.afterHash?.slice(0, 12) ?? "none"}…, the revision carries ${rev.contentHash.slice(0, 12)}…`);
  if (s.analysis?.id !== rev.analysisId || s.revision?.id !== rev.id || s.revision?.number !== rev.number) push("seal-record", "the snapshot names another analysis or revision");
  if (s.seal?.sealedById !== rev.sealedById || s.seal?.sealedAt !== rev.sealedAt?.toISOString()) push("seal-record", "the revision row's sealer or seal time differs from the snapshot");
  await stepMismatches(db, s, rev.id, push);
  const files = await measurementMismatches(db, s, push);
  let steps: StepVerification[] = [];
  if (opts.engine ?? true) {
    // In a request handler the re-run goes to the worker pool (offThread) so it never blocks other requests.
    steps = opts.offThread ? await reproduceSnapshotOffThread(s) : reproduceSnapshot(s);
    for (const st of steps) if (st.outcome === "differs") push("engine", `${stepName(st.position, st.kind)} does not reproduce when the engine is re-run (at ${st.firstDifference})`);
  }
  const analysis = await db.analysis.findUnique({ where: { id: rev.analysisId }, select: { sample: true } });
  const changes = analysis ? contextChanges(pinnedContext(s), { ...analysis.sample, valences: analysis.sample.valences }) : [];
  if (analysis && changes.length) await unauditedContextChange(db, rev, analysis.sample, describeContextChanges(changes) ?? "", push);
  return { mismatches, steps, contextChanges: changes, files };
}

export interface SealedVerification {
  ok: boolean;
  checked: number;
  mismatches: SealMismatch[];
  /** Sealed revisions whose sample record changed since sealing (not a failure; named). */
  contextChanged: { revisionId: string; analysisId: string; number: number; what: string }[];
}

/**
 * Check every sealed and replaced revision (of one group, or of the whole database) against its
 * snapshot; see the module comment. Used by Verify, `heatbook audit verify` and backup restore.
 */
export async function verifySealedRevisions(db: Db, opts: { groupId?: string; engine?: boolean } = {}): Promise<SealedVerification> {
  const ids = await db.analysisRevision.findMany({
    where: { state: { in: ["sealed", "replaced"] }, ...(opts.groupId ? { analysis: { groupId: opts.groupId } } : {}) },
    select: { id: true }, orderBy: [{ sealedAt: "asc" }, { id: "asc" }],
  });
  const mismatches: SealMismatch[] = [];
  const contextChanged: SealedVerification["contextChanged"] = [];
  for (const { id } of ids) {
    const r = await db.analysisRevision.findUniqueOrThrow({ where: { id }, select: { id: true, number: true, analysisId: true, contentHash: true, snapshot: true, sealedById: true, sealedAt: true, analysis: { select: { groupId: true } } } });
    const c = await checkSealedRevision(db, { ...r, groupId: r.analysis.groupId }, { engine: opts.engine });
    mismatches.push(...c.mismatches);
    const what = describeContextChanges(c.contextChanges);
    if (what) contextChanged.push({ revisionId: r.id, analysisId: r.analysisId, number: r.number, what });
  }
  return { ok: mismatches.length === 0, checked: ids.length, mismatches, contextChanged };
}

/** One line per mismatch: "analysis A revision N: step 3 (fit) …". */
export function describeMismatch(m: SealMismatch): string {
  return `analysis ${m.analysisId} revision ${m.number} (${m.revisionId}): ${m.what}`;
}
