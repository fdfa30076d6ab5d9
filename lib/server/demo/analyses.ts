/**
 * Demo notebooks (INVENTED DATA): one worked analysis per sample of the demo series, built
 * through the same functions the app uses, each opened once so its outputs are computed.
 * The superconducting sample gets a normal-state fit in 2 T and the transition analysis.
 */
import type { Db } from "../db/client";
import type { Member } from "../access";
import { createAnalysis, openNotebook, updateStep, addStep } from "../notebook";
import { memberOf } from "../access";
import { reviewTransition, reviseSealed } from "../review";
import { DEMO_PASSWORD } from "./seed";
import { createSeries } from "../series";
import { NORMAL_STATE_FIELDS_T } from "./fieldCurves";

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

/** Submit the newest revision (analyst) and, unless `stop`, approve it (reviewer). */
async function review(db: Db, analyst: Member, reviewer: Member, analysisId: string, stop?: "in_review"): Promise<void> {
  const nb = await openNotebook(db, analyst, analysisId);
  const sub = await reviewTransition(db, analyst, analysisId, nb.revision.id, { action: "submit", version: nb.revision.version });
  if (stop) return;
  await reviewTransition(db, reviewer, analysisId, nb.revision.id, { action: "approve", version: sub.version, meaning: "internal", password: DEMO_PASSWORD, comment: "Window scan plateau and residuals look fine. (demo)" });
}

/**
 * Review states for the demo: NM-01, NM-02, NM-06 sealed; NM-03 sealed, revised with a narrower
 * window and sealed again (its first revision superseded); NM-04 waiting for review; NM-05 drafting.
 * And the series record of the six samples.
 */
async function seedDemoReviews(db: Db, analyst: Member): Promise<void> {
  const reviewerUser = await db.user.findUniqueOrThrow({ where: { email: "rosa.reviewer@demo.heatbook" } });
  const reviewer = await memberOf(db, reviewerUser.id, analyst.group.slug);
  const analyses = await db.analysis.findMany({ where: { groupId: analyst.group.id }, include: { sample: true } });
  const byLabel = (prefix: string) => analyses.find((a) => a.sample.label.startsWith(prefix))!;
  for (const p of ["NM-01", "NM-02", "NM-06"]) await review(db, analyst, reviewer, byLabel(p).id);
  const nm03 = byLabel("NM-03");
  await review(db, analyst, reviewer, nm03.id);
  await reviseSealed(db, analyst, nm03.id);
  await configure(db, analyst, nm03.id, { fit: { tMinK: 1.8, tMaxK: 5 } });
  await review(db, analyst, reviewer, nm03.id);
  await review(db, analyst, reviewer, byLabel("NM-04").id, "in_review");
  const samples = await db.sample.findMany({ where: { groupId: analyst.group.id, seriesLabel: { not: null } }, orderBy: { compositionValue: "asc" } });
  await createSeries(db, analyst, { name: "Nb1-xMox (demo)", compositionVariable: "x", description: "Invented demo series: bcc Nb–Mo solid solutions, x = Mo fraction. INVENTED DEMO DATA.", sampleIds: samples.map((s) => s.id) });
}

export async function seedDemoAnalyses(db: Db, member: Member): Promise<void> {
  const samples = await db.sample.findMany({ where: { groupId: member.group.id, seriesLabel: { not: null } }, orderBy: { compositionValue: "asc" } });
  const addenda = await db.measurement.findFirst({ where: { groupId: member.group.id, kind: "addenda" } });
  for (const s of samples) {
    const ms = await db.measurement.findMany({ where: { sampleId: s.id }, orderBy: { createdAt: "asc" } });
    const zero = ms.find((m) => m.fieldT === 0)!;
    // The superconductor's first normal-state field (2 T); its mixed-state curves are not for this analysis.
    const inField = ms.find((m) => m.fieldT === NORMAL_STATE_FIELDS_T[0]);
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
  await seedDemoReviews(db, member);
}
