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
import { DEMO_HC2_T, NORMAL_STATE_FIELDS_T } from "./fieldCurves";

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

/** The id of the analysis's step with this title (in the newest revision). */
async function stepIdByTitle(db: Db, member: Member, analysisId: string, title: string): Promise<string> {
  const nb = await openNotebook(db, member, analysisId);
  const step = nb.steps.find((s) => s.title === title);
  if (!step) throw new Error(`demo: no step titled ${JSON.stringify(title)}`);
  return step.id;
}

/**
 * The superconductor across fields (fieldCurves.ts): the normal state fitted jointly at 2 and 3 T,
 * γ(H) per field from a joint fit of the zero-field and mixed-state curves below 3 K (β shared),
 * then γ(H)/γ_n against H/H_c2 with the invented H_c2(0) = 1.8 T.
 */
async function seedFieldAnalysis(db: Db, member: Member, sample: { id: string; label: string }, ms: { id: string; fieldT: number }[], addendaId: string): Promise<void> {
  const a = await createAnalysis(db, member, { sampleId: sample.id, title: `${sample.label}: γ(H) across fields`, starter: "empty" });
  const normal = ms.filter((m) => m.fieldT >= DEMO_HC2_T).map((m) => m.id);
  const below = ms.filter((m) => m.fieldT < DEMO_HC2_T).sort((x, y) => x.fieldT - y.fieldT).map((m) => m.id);
  await append(db, member, a.id, "note", { markdown: `γ(H) of the superconductor: normal state from the curves above H_c2 (2 T and 3 T), γ per field from the zero-field and mixed-state curves (0–1.5 T) fitted together with a common β below 3 K, well below T_c(H). H_c2(0) = ${DEMO_HC2_T} T is invented for the demo. *Invented demo data.*` });
  await append(db, member, a.id, "data", { measurementIds: normal }, "Normal state, 2 T and 3 T");
  await append(db, member, a.id, "addenda", { addendaMeasurementId: addendaId, method: "smooth", outsideRange: "flag" });
  await append(db, member, a.id, "normalise", { per: "formula-unit" });
  await append(db, member, a.id, "joint-fit", { model: "normal-state", tMinK: 1.8, tMaxK: 6 }, "Normal state across fields");
  await append(db, member, a.id, "lattice", {}, "Lattice of the normal state, 1.8–20 K");
  await append(db, member, a.id, "data", { measurementIds: below }, "Zero field and mixed state");
  await append(db, member, a.id, "addenda", { addendaMeasurementId: addendaId, method: "smooth", outsideRange: "flag" });
  await append(db, member, a.id, "normalise", { per: "formula-unit" });
  await append(db, member, a.id, "joint-fit", { model: "sommerfeld", shared: ["beta"], tMaxK: 3 }, "γ per field below 3 K");
  const normalFit = await stepIdByTitle(db, member, a.id, "Normal state across fields");
  await append(db, member, a.id, "gamma-field", { hc2T: DEMO_HC2_T, normalFitStepId: normalFit });
  await openNotebook(db, member, a.id);
}

/** The dilute magnetic alloy: one joint fit of its four fields (Zeeman Schottky and nuclear tail), derived quantities from its γ and β. */
async function seedAlloyAnalysis(db: Db, member: Member, sample: { id: string; label: string }, ms: { id: string; fieldT: number }[], addendaId: string): Promise<void> {
  const a = await createAnalysis(db, member, { sampleId: sample.id, title: `${sample.label}: Schottky term across fields`, starter: "empty" });
  await append(db, member, a.id, "data", { measurementIds: [...ms].sort((x, y) => x.fieldT - y.fieldT).map((m) => m.id) }, "All fields");
  await append(db, member, a.id, "addenda", { addendaMeasurementId: addendaId, method: "smooth", outsideRange: "flag" });
  await append(db, member, a.id, "normalise", { per: "formula-unit" });
  await append(db, member, a.id, "joint-fit", { model: "zeeman-schottky-nuclear", tMaxK: 10 }, "Zeeman Schottky and nuclear tail, shared γ and β");
  await append(db, member, a.id, "derive", {});
  await append(db, member, a.id, "note", { markdown: "γ and β are shared by the four fields; the Schottky term's n and g and the nuclear coefficient a (A = a H²) as well. *Invented demo data.*" });
  await openNotebook(db, member, a.id);
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
  // Each series sample's first analysis (γ and Θ_D, or the superconductor's transition); the analyses across fields and over a wide range stay drafts.
  const extra = (title: string) => title.endsWith("across fields") || title.endsWith("over a wide range");
  const byLabel = (prefix: string) => analyses.find((a) => a.sample.label.startsWith(prefix) && !extra(a.title))!;
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
    // The first zero-field curve (a sample may also have a wide-range one, analysed on its own below).
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
      await seedFieldAnalysis(db, member, s, ms, addenda.id);
      continue;
    }
    const wide = ms.find((m) => m.tMaxK > 50);
    if (wide) {
      // The wide-range curve: γ from its low end, then the lattice views (wideRange.ts).
      const w = await createAnalysis(db, member, { sampleId: s.id, title: `${s.label}: lattice over a wide range`, starter: "empty" });
      await append(db, member, w.id, "data", { measurementIds: [wide.id] }, "Wide-range curve");
      await append(db, member, w.id, "normalise", { per: "formula-unit" });
      await append(db, member, w.id, "fit", { model: "sommerfeld", tMinK: 2, tMaxK: 6 }, "γ and β at the low end");
      await append(db, member, w.id, "lattice", {});
      await openNotebook(db, member, w.id);
    }
    const a = await createAnalysis(db, member, { sampleId: s.id, title: `${s.label}: γ and Θ_D`, starter: "standard" });
    const low = zero.tMinK < 1;
    await configure(db, member, a.id, {
      data: { measurementIds: [zero.id] },
      fit: low ? { model: "nuclear", tMinK: zero.tMinK, tMaxK: 6, scan: false } : { tMinK: 1.8, tMaxK: 6, scan: true },
      derive: { muStar: 0.13 },
    });
    await openNotebook(db, member, a.id);
  }
  const alloy = await db.sample.findFirst({ where: { groupId: member.group.id, tags: { has: "magnetic" } } });
  if (alloy && addenda) await seedAlloyAnalysis(db, member, alloy, await db.measurement.findMany({ where: { sampleId: alloy.id, kind: "sample" } }), addenda.id);
  await seedDemoReviews(db, member);
}
