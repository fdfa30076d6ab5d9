/**
 * The sealed snapshot: a revision's complete inputs (sample fields, every measurement it reads
 * with its original file's checksum and the parsed points, units and column mapping, every
 * step's kind, position, configuration, input hash and engine version) and outputs (every
 * step's output), as JSON-safe data. Its content hash is SHA-256 of its canonical JSON
 * (lib/engine/canonical.ts): keys sorted, shortest round-trip numbers.
 *
 * Format heatbook-seal/2 adds the sealed context (the sample record's fields as they were at
 * sealing, composition x and its variable included, and the series the sample belonged to with
 * their composition variables) and the reviewer's signature (who, role, when, meaning, note,
 * how identity was re-checked, acknowledged threads). Both are covered by the content hash.
 * Snapshots of format heatbook-seal/1 have neither (see context.ts for how they are shown).
 */
import type { Db } from "../db/client";
import { ConflictError } from "../../engine/errors";
import { ENGINE_VERSION } from "../../engine/version";
import { stepDefinition, parseStepConfig, type ChainSample, type StepSpec } from "../../engine/notebook";
import type { StoredOutput } from "../notebook/compute";
import { inputHashes, loadSample, referencedMeasurements, loadMeasurements } from "../notebook/context";
import { contentHash } from "../hash";
import { unpackFloat64 } from "../packing";
import type { SealSignature } from "./signature";

export const SNAPSHOT_FORMAT = "heatbook-seal/2";
/** Formats this build reads. */
export type SnapshotFormat = "heatbook-seal/1" | "heatbook-seal/2";

export interface SnapshotMeasurement {
  id: string;
  label: string;
  kind: "sample" | "addenda";
  basis: "sample" | "molar" | "specific";
  fieldT: number;
  units: unknown;
  columnMapping: unknown;
  file: { id: string; fileName: string; sha256: string; sizeBytes: number };
  pointCount: number;
  /** SI, per `basis`: K, and J/K, J/(mol K) or J/(kg K). */
  points: { temperatureK: number[]; heatCapacity: number[]; sigma: number[] | null };
}

export interface SnapshotStep {
  id: string;
  position: number;
  kind: string;
  title: string;
  config: unknown;
  inputHash: string;
  engineVersion: string;
}

/** The sample record and its series as they were at sealing (format 2). */
export interface SealedContext {
  sample: {
    id: string; label: string; formula: string; molarMassGPerMol: number; atomsPerFormulaUnit: number;
    massMg: number | null; densityGPerCm3: number | null; valences: Record<string, number>;
    compositionVariable: string | null; compositionValue: number | null; seriesLabel: string | null;
  };
  series: { id: string; name: string; compositionVariable: string }[];
}

export interface RevisionSnapshot {
  format: SnapshotFormat;
  engineVersion: string;
  analysis: { id: string; title: string; groupId: string };
  revision: { id: string; number: number; basedOnId: string | null; submittedById: string | null; submittedAt: string | null };
  seal: { sealedById: string; sealedAt: string };
  inputs: { sample: ChainSample; sampleFieldsUsed: string[]; measurements: SnapshotMeasurement[]; steps: SnapshotStep[] };
  outputs: { steps: { id: string; position: number; kind: string; output: StoredOutput }[] };
  /** Format 2 on. */
  context?: SealedContext;
  /** Format 2 on. */
  signature?: SealSignature;
}

/** The Prisma transaction client (or the client itself): reads only. */
export type Reader = Pick<Db, "step" | "sample" | "measurement" | "seriesMember">;

type StepRow = Awaited<ReturnType<Db["step"]["findMany"]>>[number];

export interface RevisionRef {
  id: string;
  number: number;
  basedOnId: string | null;
  submittedById: string | null;
  submittedAt: Date | null;
  analysis: { id: string; title: string; groupId: string; sampleId: string };
}

/** Steps not fit for sealing: stale (inputs changed since computed), never computed, or failed. */
export function readinessProblems(rows: readonly StepRow[], hashes: readonly string[]): string[] {
  if (rows.length === 0) return ["the revision has no steps"];
  const out: string[] = [];
  rows.forEach((r, i) => {
    const name = `step ${r.position + 1} (${r.kind})`;
    const output = r.output as StoredOutput | null;
    if (output === null || r.inputHash !== hashes[i]) out.push(`${name} is stale: its inputs changed since it was computed; open the notebook to recompute it`);
    else if (!output.ok) out.push(`${name} failed: ${output.error ?? "no result"}`);
  });
  return out;
}

function sampleFieldsUsed(specs: readonly StepSpec[]): string[] {
  const used = new Set<string>(["id", "label"]);
  for (const s of specs) {
    try {
      for (const f of stepDefinition(s.kind).dependencies(parseStepConfig(s.kind, s.config) as never).sampleFields) used.add(f);
    } catch {
      /* an invalid step reads nothing (and readiness refuses it anyway) */
    }
  }
  return [...used].sort();
}

async function snapshotMeasurements(db: Reader, groupId: string, ids: readonly string[]): Promise<SnapshotMeasurement[]> {
  const rows = await db.measurement.findMany({ where: { groupId, id: { in: [...ids] } }, include: { file: { select: { id: true, fileName: true, sha256: true, sizeBytes: true } } }, orderBy: { id: "asc" } });
  return rows.map((m) => ({
    id: m.id, label: m.label, kind: m.kind, basis: m.basis, fieldT: m.fieldT, units: m.units, columnMapping: m.columnMapping,
    file: m.file, pointCount: m.pointCount,
    points: { temperatureK: unpackFloat64(m.temperatureK), heatCapacity: unpackFloat64(m.heatCapacity), sigma: m.sigma ? unpackFloat64(m.sigma) : null },
  }));
}

/** The sample record and the series it belongs to, as they are now (sealed into the snapshot). */
export async function sealedContext(db: Reader, groupId: string, sampleId: string): Promise<SealedContext> {
  const s = await db.sample.findFirst({ where: { id: sampleId, groupId } });
  if (!s) throw new ConflictError("cannot seal: the analysis's sample is missing");
  const series = await db.seriesMember.findMany({ where: { sampleId, series: { groupId } }, select: { series: { select: { id: true, name: true, compositionVariable: true } } } });
  return {
    sample: {
      id: s.id, label: s.label, formula: s.formula, molarMassGPerMol: s.molarMassGPerMol, atomsPerFormulaUnit: s.atomsPerFormulaUnit, massMg: s.massMg, densityGPerCm3: s.densityGPerCm3,
      valences: (s.valences ?? {}) as Record<string, number>, compositionVariable: s.compositionVariable, compositionValue: s.compositionValue, seriesLabel: s.seriesLabel,
    },
    series: series.map((m) => m.series).sort((a, b) => a.id.localeCompare(b.id)),
  };
}

/**
 * Build the snapshot of a revision for sealing by `sealedById` at `sealedAt`, inside the
 * approving transaction, with the reviewer's `signature`. Throws ConflictError naming every
 * stale or failed step. Returns the snapshot exactly as it will be stored (passed through JSON)
 * and its hash.
 */
export async function buildSnapshot(db: Reader, rev: RevisionRef, sealedById: string, sealedAt: Date, signature: SealSignature): Promise<{ snapshot: RevisionSnapshot; contentHash: string }> {
  const rows = await db.step.findMany({ where: { revisionId: rev.id }, orderBy: { position: "asc" } });
  const specs: StepSpec[] = rows.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  const readers = db as unknown as Db; // loadSample / loadMeasurements only read sample and measurement
  const [sample, chainMeasurements] = await Promise.all([loadSample(readers, rev.analysis.groupId, rev.analysis.sampleId), loadMeasurements(readers, rev.analysis.groupId, referencedMeasurements(specs))]);
  const hashes = inputHashes(specs, { sample, measurements: chainMeasurements });
  const problems = readinessProblems(rows, hashes);
  if (problems.length) throw new ConflictError(`cannot seal revision ${rev.number}: ${problems.join("; ")}`, { problems });
  const snapshot: RevisionSnapshot = {
    format: SNAPSHOT_FORMAT,
    engineVersion: ENGINE_VERSION,
    analysis: { id: rev.analysis.id, title: rev.analysis.title, groupId: rev.analysis.groupId },
    revision: { id: rev.id, number: rev.number, basedOnId: rev.basedOnId, submittedById: rev.submittedById, submittedAt: rev.submittedAt?.toISOString() ?? null },
    seal: { sealedById, sealedAt: sealedAt.toISOString() },
    inputs: {
      sample,
      sampleFieldsUsed: sampleFieldsUsed(specs),
      measurements: await snapshotMeasurements(db, rev.analysis.groupId, Object.keys(chainMeasurements)),
      steps: rows.map((r) => ({ id: r.id, position: r.position, kind: r.kind, title: r.title, config: r.config, inputHash: r.inputHash!, engineVersion: r.engineVersion ?? ENGINE_VERSION })),
    },
    outputs: { steps: rows.map((r) => ({ id: r.id, position: r.position, kind: r.kind, output: r.output as unknown as StoredOutput })) },
    context: await sealedContext(db, rev.analysis.groupId, rev.analysis.sampleId),
    signature,
  };
  const stored = JSON.parse(JSON.stringify(snapshot)) as RevisionSnapshot;
  return { snapshot: stored, contentHash: contentHash(stored) };
}
