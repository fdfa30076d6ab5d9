/**
 * Analyses with stored step outputs for the series/API/backup tests. The derive step's output is
 * what deriveAll returns (the engine's own shape); the values are invented test data.
 */
import type { Db } from "../../lib/server/db/client";
import type { Member } from "../../lib/server/access";
import { deriveAll } from "../../lib/engine/derived";
import { recordAudit } from "../../lib/server/audit";
import { buildSnapshot, type SealSignature } from "../../lib/server/review";
import { inputHashes, loadContext } from "../../lib/server/notebook/context";
import { ENGINE_VERSION } from "../../lib/engine/version";
import type { StepSpec } from "../../lib/engine/notebook";

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
  const hash = await sealAsIs(db, member, rev.id);
  return { analysisId: a.id, revisionId: rev.id, contentHash: hash };
}

/**
 * Seal a revision with its stored outputs as they are (test fixture: the outputs need not be
 * what the engine would compute): input hashes brought up to date, a real snapshot (format 2,
 * pinned context, a signature by `member`) built by the sealing code, the seal written through
 * in_review as the triggers demand, and the approval's audit event recorded as approving does.
 */
export async function sealAsIs(db: Db, member: Member, revisionId: string): Promise<string> {
  const rev = await db.analysisRevision.findUniqueOrThrow({ where: { id: revisionId }, include: { analysis: true, steps: { orderBy: { position: "asc" } } } });
  const specs: StepSpec[] = rev.steps.map((r) => ({ id: r.id, kind: r.kind as StepSpec["kind"], config: r.config }));
  const hashes = inputHashes(specs, await loadContext(db, rev.analysis.groupId, rev.analysis.sampleId, specs));
  for (const [i, st] of rev.steps.entries()) await db.step.update({ where: { id: st.id }, data: { inputHash: hashes[i]!, engineVersion: ENGINE_VERSION, computedAt: new Date() } });
  await db.analysisRevision.update({ where: { id: rev.id }, data: { state: "in_review", submittedAt: new Date(), submittedById: member.userId } });
  const now = new Date();
  const signature: SealSignature = { signerId: member.userId, signerName: "fixture", signerEmail: "fixture@example.org", signerRole: member.role, meaning: "internal", statement: "fixture", note: "sealed by a test fixture", signedAt: now.toISOString(), method: "password", acknowledgedThreads: [] };
  const submitted = await db.analysisRevision.findUniqueOrThrow({ where: { id: rev.id } });
  const { snapshot, contentHash } = await buildSnapshot(db, { ...submitted, analysis: rev.analysis }, member.userId, now, signature);
  await db.analysisRevision.update({ where: { id: rev.id }, data: { state: "sealed", sealedAt: now, sealedById: member.userId, snapshot: snapshot as object, contentHash } });
  await recordAudit(db, { groupId: rev.analysis.groupId, actorId: member.userId, action: "revision.approve", objectType: "analysisRevision", objectId: rev.id, afterHash: contentHash, detail: { fixture: true } });
  return contentHash;
}
