/**
 * Analyses with stored step outputs for the series/API/backup tests. The derive step's output is
 * what deriveAll returns (the engine's own shape); the values are invented test data.
 */
import type { Db } from "../../lib/server/db/client";
import type { Member } from "../../lib/server/access";
import { deriveAll } from "../../lib/engine/derived";
import { contentHash } from "../../lib/server/hash";

export interface AnalysisSpec {
  sampleId: string;
  /** γ [mJ mol⁻¹ K⁻²] and β [mJ mol⁻¹ K⁻⁴] per f.u. with σ. */
  gamma: [number, number];
  beta: [number, number];
  atoms?: number;
  molarMass?: number;
  state: "open" | "sealed";
  title?: string;
}

/** An analysis with one revision holding a derive step; sealed through in_review as the triggers demand. */
export async function makeAnalysis(db: Db, member: Member, spec: AnalysisSpec): Promise<{ analysisId: string; revisionId: string; contentHash: string | null }> {
  const derived = deriveAll({
    gamma: { value: spec.gamma[0] / 1e3, stdError: spec.gamma[1] / 1e3 }, beta: { value: spec.beta[0] / 1e3, stdError: spec.beta[1] / 1e3 },
    formula: { atomsPerFormulaUnit: spec.atoms ?? 1, molarMassGPerMol: spec.molarMass ?? 63.546 },
  });
  const a = await db.analysis.create({ data: { groupId: member.group.id, sampleId: spec.sampleId, title: spec.title ?? "Sommerfeld–Debye fit", createdById: member.userId } });
  const rev = await db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: member.userId } });
  await db.step.create({ data: { revisionId: rev.id, position: 0, kind: "note", config: { text: "invented test data" }, output: { kind: "note", ok: true, error: null, warnings: [], result: { html: "" } } } });
  await db.step.create({ data: { revisionId: rev.id, position: 1, kind: "derive", config: {}, output: { kind: "derive", ok: true, error: null, warnings: [], result: JSON.parse(JSON.stringify(derived)) } } });
  if (spec.state === "open") return { analysisId: a.id, revisionId: rev.id, contentHash: null };
  const snapshot = { inputs: { measurements: [] }, steps: [{ kind: "derive", result: JSON.parse(JSON.stringify(derived)) }] };
  const hash = contentHash(snapshot);
  await db.analysisRevision.update({ where: { id: rev.id }, data: { state: "in_review", submittedAt: new Date(), submittedById: member.userId } });
  await db.analysisRevision.update({ where: { id: rev.id }, data: { state: "sealed", sealedAt: new Date(), sealedById: member.userId, snapshot, contentHash: hash } });
  return { analysisId: a.id, revisionId: rev.id, contentHash: hash };
}
