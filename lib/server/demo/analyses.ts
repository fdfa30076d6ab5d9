/**
 * Demo notebooks (INVENTED DATA): one worked analysis per sample of the demo series, built
 * through the same functions the app uses, each opened once so its outputs are computed.
 * The superconducting sample gets a normal-state fit in 2 T and the transition analysis.
 */
import type { Db } from "../db/client";
import type { Member } from "../access";
import { createAnalysis, openNotebook, updateStep, addStep } from "../notebook";

async function configure(db: Db, member: Member, analysisId: string, edits: Record<string, Record<string, unknown>>): Promise<void> {
  const nb = await openNotebook(db, member, analysisId);
  for (const step of nb.steps) {
    const patch = edits[step.kind];
    if (patch) await updateStep(db, member, analysisId, step.id, { version: step.version, config: { ...(step.config as object), ...patch } });
  }
}

async function append(db: Db, member: Member, analysisId: string, kind: string, config: Record<string, unknown>, title = ""): Promise<void> {
  const nb = await openNotebook(db, member, analysisId);
  await addStep(db, member, analysisId, { revisionId: nb.revision.id, revisionVersion: nb.revision.version, kind, title, config });
}

export async function seedDemoAnalyses(db: Db, member: Member): Promise<void> {
  const samples = await db.sample.findMany({ where: { groupId: member.group.id, seriesLabel: { not: null } }, orderBy: { compositionValue: "asc" } });
  const addenda = await db.measurement.findFirst({ where: { groupId: member.group.id, kind: "addenda" } });
  for (const s of samples) {
    const ms = await db.measurement.findMany({ where: { sampleId: s.id }, orderBy: { createdAt: "asc" } });
    const zero = ms.find((m) => m.fieldT === 0)!;
    const inField = ms.find((m) => m.fieldT > 0);
    if (inField && addenda) {
      // Superconductor: normal state from the 2 T curve, then the zero-field transition.
      const a = await createAnalysis(db, member, { sampleId: s.id, title: `${s.label}: normal state and transition`, starter: "standard" });
      await configure(db, member, a.id, { data: { measurementIds: [inField.id] }, fit: { tMinK: 1.8, tMaxK: 7, scan: true } });
      await append(db, member, a.id, "note", { markdown: "Normal state taken from the **2 T** curve (above H_c2 for this sample). *Invented demo data.*" });
      await append(db, member, a.id, "data", { measurementIds: [zero.id] }, "Zero-field curve");
      await append(db, member, a.id, "addenda", { addendaMeasurementId: addenda.id, method: "smooth", outsideRange: "flag" });
      await append(db, member, a.id, "normalise", { per: "formula-unit" });
      await append(db, member, a.id, "transition", { normalState: "field-above-hc2" });
      await append(db, member, a.id, "entropy", {});
      await openNotebook(db, member, a.id);
      continue;
    }
    const a = await createAnalysis(db, member, { sampleId: s.id, title: `${s.label}: γ and Θ_D`, starter: "standard" });
    const low = zero.tMinK < 1;
    await configure(db, member, a.id, {
      fit: low ? { model: "nuclear", tMinK: zero.tMinK, tMaxK: 6, scan: false } : { tMinK: 1.8, tMaxK: 6, scan: true },
      derive: { muStar: 0.13 },
    });
    await openNotebook(db, member, a.id);
  }
}
