/**
 * The starting chain of a new analysis: data (the sample's zero-field measurements), addenda
 * (the group's newest addenda curve, when the data are whole-sample J/K), normalisation,
 * a Sommerfeld–Debye fit over the low-temperature part with a window scan, derived quantities.
 */
import type { Db } from "../db/client";
import type { StepKind } from "../../engine/notebook";

export interface StarterStep {
  kind: StepKind;
  title: string;
  config: Record<string, unknown>;
}

export async function starterSteps(db: Db, groupId: string, sample: { id: string }): Promise<StarterStep[]> {
  const ms = await db.measurement.findMany({ where: { groupId, sampleId: sample.id, kind: "sample", archivedAt: null }, select: { id: true, fieldT: true, basis: true, tMinK: true, tMaxK: true }, orderBy: { createdAt: "asc" } });
  if (ms.length === 0) return [{ kind: "note", title: "", config: { markdown: "No measurement of this sample yet: import one, then add a data step." } }];
  const zero = ms.filter((m) => m.fieldT === 0);
  const chosen = zero.length ? zero : [ms[0]!];
  const steps: StarterStep[] = [{ kind: "data", title: "", config: { measurementIds: chosen.map((m) => m.id) } }];
  const basis = chosen[0]!.basis;
  if (basis === "sample") {
    const addenda = await db.measurement.findFirst({ where: { groupId, kind: "addenda", archivedAt: null }, orderBy: { createdAt: "desc" }, select: { id: true } });
    if (addenda) steps.push({ kind: "addenda", title: "", config: { addendaMeasurementId: addenda.id, method: "smooth", outsideRange: "flag" } });
  }
  steps.push({ kind: "normalise", title: "", config: { per: "formula-unit" } });
  const tMin = Math.min(...chosen.map((m) => m.tMinK));
  const tMax = Math.max(...chosen.map((m) => m.tMaxK));
  steps.push({ kind: "fit", title: "", config: { model: "sommerfeld", tMinK: tMin, tMaxK: Math.min(tMax, Math.max(tMin * 3, 6)), scan: true } });
  steps.push({ kind: "derive", title: "", config: {} });
  return steps;
}
