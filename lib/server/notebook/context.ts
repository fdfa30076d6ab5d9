/**
 * Loading what a chain reads: the sample and every measurement its steps name (group-scoped),
 * and the input hash of each step, which covers the engine version, the step's kind and
 * configuration, the hash of the step above, and the records it reads.
 */
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import { ENGINE_VERSION } from "../../engine/version";
import { parseStepConfig, stepDefinition, type ChainContext, type ChainMeasurement, type ChainSample, type StepSpec } from "../../engine/notebook";
import { contentHash } from "../hash";
import { unpackFloat64 } from "../packing";
import { isUuid } from "../ids";

export async function loadSample(db: Db, groupId: string, sampleId: string): Promise<ChainSample> {
  const s = await db.sample.findFirst({ where: { id: sampleId, groupId } });
  if (!s) throw new NotFoundError("sample");
  return {
    id: s.id, label: s.label, formula: s.formula, molarMassGPerMol: s.molarMassGPerMol, atomsPerFormulaUnit: s.atomsPerFormulaUnit,
    massMg: s.massMg, densityGPerCm3: s.densityGPerCm3, valences: (s.valences ?? {}) as Record<string, number>,
  };
}

/** The measurement ids every step names (valid configurations only). */
export function referencedMeasurements(steps: readonly StepSpec[]): string[] {
  const ids = new Set<string>();
  for (const s of steps) {
    try {
      const config = parseStepConfig(s.kind, s.config);
      for (const id of stepDefinition(s.kind).dependencies(config as never).measurementIds) ids.add(id);
    } catch {
      /* an invalid step names nothing; it reports its own error when computed */
    }
  }
  return [...ids];
}

/** Measurements by id (group-scoped). With `points: false` only what the input hashes read (no point arrays). */
export async function loadMeasurements(db: Db, groupId: string, ids: readonly string[], opts: { points?: boolean } = {}): Promise<Record<string, ChainMeasurement>> {
  const uuids = ids.filter(isUuid);
  if (uuids.length === 0) return {};
  const withPoints = opts.points ?? true;
  const rows = await db.measurement.findMany({
    where: { groupId, id: { in: uuids } },
    select: {
      id: true, label: true, kind: true, basis: true, fieldT: true, pointCount: true, file: { select: { sha256: true } },
      ...(withPoints ? { temperatureK: true, heatCapacity: true, sigma: true } : {}),
    },
  });
  const out: Record<string, ChainMeasurement> = {};
  for (const m of rows) {
    const r = m as typeof m & { temperatureK?: Uint8Array; heatCapacity?: Uint8Array; sigma?: Uint8Array | null };
    out[m.id] = {
      id: m.id, label: m.label, kind: m.kind, basis: m.basis, fieldT: m.fieldT, sha256: m.file.sha256, pointCount: m.pointCount,
      temperatureK: r.temperatureK ? unpackFloat64(r.temperatureK) : [], heatCapacity: r.heatCapacity ? unpackFloat64(r.heatCapacity) : [], sigma: r.sigma ? unpackFloat64(r.sigma) : null,
    };
  }
  return out;
}

/** What a chain reads. `points: false` is enough for input hashes (a cached notebook needs no more). */
export async function loadContext(db: Db, groupId: string, sampleId: string, steps: readonly StepSpec[], opts: { points?: boolean } = {}): Promise<ChainContext> {
  const [sample, measurements] = await Promise.all([loadSample(db, groupId, sampleId), loadMeasurements(db, groupId, referencedMeasurements(steps), opts)]);
  return { sample, measurements };
}

/** What a step's hash covers besides the chain: the records it reads, by content. */
function externalInputs(step: StepSpec, ctx: ChainContext): unknown {
  let deps;
  try {
    deps = stepDefinition(step.kind).dependencies(parseStepConfig(step.kind, step.config) as never);
  } catch {
    return null;
  }
  return {
    measurements: deps.measurementIds.map((id) => {
      const m = ctx.measurements[id];
      return m ? { id, sha256: m.sha256, basis: m.basis, fieldT: m.fieldT, n: m.pointCount ?? m.temperatureK.length } : { id, missing: true };
    }),
    sample: Object.fromEntries(deps.sampleFields.map((f) => [f, ctx.sample[f]])),
  };
}

/** Input hash of every step, chained top to bottom. */
export function inputHashes(steps: readonly StepSpec[], ctx: ChainContext): string[] {
  const out: string[] = [];
  let prev: string | null = null;
  for (const s of steps) {
    const h = contentHash({ engine: ENGINE_VERSION, kind: s.kind, config: s.config ?? {}, prev, external: externalInputs(s, ctx) });
    out.push(h);
    prev = h;
  }
  return out;
}
