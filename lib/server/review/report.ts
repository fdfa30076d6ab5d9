/**
 * The report of a sealed revision, as one plain JSON-safe object built from its snapshot alone
 * (so it shows exactly what was sealed): sample, data provenance with file checksums,
 * corrections, fit windows and models, parameter tables with uncertainties in compact form,
 * derived quantities, warnings, reviewer, time, content hash, the reviewer's signature (meaning,
 * note, role), the sealed composition and what changed in the sample record since sealing, and
 * the expert-review sentence. A snapshot that no longer matches its content hash is refused.
 * The print page and the PDF both render this object; neither computes anything.
 */
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { formatUncertainty, formatWithUnit, DISPLAY_UNITS } from "../../engine/units";
import { authorise, type Member } from "../access";
import { uuidOrNone } from "../samples";
import { intactSnapshot } from "./served";
import type { RevisionSnapshot } from "./snapshot";
import type { SealSignature } from "./signature";
import { changeText, contextChanges, pinnedContext, type LiveSample } from "./context";

export const SAFETY_SENTENCE = "These results need expert review under local practice before use in any safety-relevant decision.";

export interface ReportValue { name: string; symbol: string; value: number; stdError: number | null; unit: string; compact: string; note?: string }

export interface RevisionReport {
  title: string;
  group: { name: string; slug: string };
  analysisId: string;
  revision: { id: string; number: number; state: "sealed" | "replaced"; basedOnId: string | null };
  sample: { label: string; formula: string; molarMassGPerMol: number; atomsPerFormulaUnit: number; massMg: number | null; densityGPerCm3: number | null };
  provenance: { measurementId: string; label: string; kind: string; fileName: string; sha256: string; sizeBytes: number; pointCount: number; tMinK: number; tMaxK: number; fieldT: number; units: unknown }[];
  corrections: { position: number; kind: string; summary: string }[];
  fits: {
    position: number; model: string; basis: string; tMinK: number; tMaxK: number; nPoints: number; weighted: boolean;
    reducedChiSquare: number | null; parameters: ReportValue[];
    /** For the page's plot: the points (with in-window flags) and the model curve, SI. */
    plot: { points: unknown; curve: unknown };
  }[];
  derived: ReportValue[];
  warnings: string[];
  notes: string[];
  review: { submittedBy: string | null; submittedAt: string | null; sealedBy: string | null; sealedAt: string; decisions: { decision: string; reviewer: string | null; at: string; comment: string }[] };
  contentHash: string;
  engineVersion: string;
  safetyNote: typeof SAFETY_SENTENCE;
  /** The reviewer's signature (null: sealed before approvals were signed). */
  signature: SealSignature | null;
  /** Composition as sealed (null fields when not pinned) and what changed in the sample record since. */
  context: { pinned: "full" | "chain"; compositionVariable: string | null; compositionValue: number | null; series: { name: string; compositionVariable: string }[]; note: string | null; changedSinceSealing: string[] };
}

type Out = { ok: boolean; warnings: string[]; result: Record<string, any> | null };
const SYMBOLS: Record<string, string> = { gamma: "γ", beta: "β", delta: "δ", epsilon: "ε", thetaD: "Θ_D", thetaE: "Θ_E" };

function parameter(p: { name: string; value: number; stdError: number | null; unit: string; fixed?: boolean }, basis: string): ReportValue {
  const du = (DISPLAY_UNITS as Record<string, (typeof DISPLAY_UNITS)["gamma"]>)[p.name];
  const per = basis === "atom" ? "atom" : "formula-unit";
  const compact = du ? formatWithUnit(p.value, p.stdError, du, { per }) : `${formatUncertainty(p.value, p.stdError)} ${p.unit}`.trim();
  return { name: p.name, symbol: SYMBOLS[p.name] ?? p.name, value: p.value, stdError: p.stdError, unit: p.unit, compact: p.fixed ? `${compact} (fixed)` : compact };
}

function correction(kind: string, config: Record<string, any>, result: Record<string, any> | null): string {
  if (kind === "addenda") return `addenda ${result?.addendaLabel ?? config.addendaMeasurementId} subtracted (${config.method ?? "smooth"}); largest addenda fraction ${result ? (100 * result.maxAddendaFraction).toFixed(1) + " %" : "n/a"}`;
  if (kind === "normalise") return `normalised per mole ${config.per === "atom" ? "of atoms" : "formula unit"}${config.massMg ? ` with mass ${config.massMg} mg (set in the step)` : " with the sample's mass"}`;
  if (kind === "data") return `data: ${result?.points ?? "?"} points${config.tMinK || config.tMaxK ? ` in ${config.tMinK ?? "…"}–${config.tMaxK ?? "…"} K` : ""}${config.excluded?.length ? `, ${config.excluded.length} left out by hand (${config.excluded.map((e: any) => e.reason).join("; ")})` : ""}`;
  return kind;
}

/** The report object from a sealed snapshot and the names of the people involved. Pure. */
export function reportFromSnapshot(s: RevisionSnapshot, meta: { group: { name: string; slug: string }; state: "sealed" | "replaced"; contentHash: string; names: Record<string, string>; decisions: RevisionReport["review"]["decisions"]; liveSample?: LiveSample | null }): RevisionReport {
  const name = (id: string | null) => (id ? (meta.names[id] ?? "former member") : null);
  const ctx = pinnedContext(s);
  const report: RevisionReport = {
    title: s.analysis.title, group: meta.group, analysisId: s.analysis.id,
    revision: { id: s.revision.id, number: s.revision.number, state: meta.state, basedOnId: s.revision.basedOnId },
    sample: { label: s.inputs.sample.label, formula: s.inputs.sample.formula, molarMassGPerMol: s.inputs.sample.molarMassGPerMol, atomsPerFormulaUnit: s.inputs.sample.atomsPerFormulaUnit, massMg: s.inputs.sample.massMg, densityGPerCm3: s.inputs.sample.densityGPerCm3 },
    provenance: s.inputs.measurements.map((m) => ({
      measurementId: m.id, label: m.label, kind: m.kind, fileName: m.file.fileName, sha256: m.file.sha256, sizeBytes: m.file.sizeBytes, pointCount: m.pointCount,
      tMinK: Math.min(...m.points.temperatureK), tMaxK: Math.max(...m.points.temperatureK), fieldT: m.fieldT, units: m.units,
    })),
    corrections: [], fits: [], derived: [], warnings: [], notes: [],
    review: { submittedBy: name(s.revision.submittedById), submittedAt: s.revision.submittedAt, sealedBy: name(s.seal.sealedById), sealedAt: s.seal.sealedAt, decisions: meta.decisions },
    contentHash: meta.contentHash, engineVersion: s.engineVersion, safetyNote: SAFETY_SENTENCE,
    signature: s.signature ?? null,
    context: {
      pinned: ctx.pinned, compositionVariable: ctx.sample.compositionVariable, compositionValue: ctx.sample.compositionValue, series: (ctx.series ?? []).map((x) => ({ name: x.name, compositionVariable: x.compositionVariable })),
      note: ctx.note, changedSinceSealing: meta.liveSample ? contextChanges(ctx, meta.liveSample).map(changeText) : [],
    },
  };
  s.inputs.steps.forEach((st, i) => {
    const out = s.outputs.steps[i]?.output as unknown as Out | undefined;
    const r = out?.result ?? null;
    const config = (st.config ?? {}) as Record<string, any>;
    for (const w of out?.warnings ?? []) report.warnings.push(`step ${st.position + 1} (${st.kind}): ${w}`);
    if (st.kind === "data" || st.kind === "addenda" || st.kind === "normalise") report.corrections.push({ position: st.position, kind: st.kind, summary: correction(st.kind, config, r) });
    else if (st.kind === "fit" && r?.fit) {
      report.fits.push({
        position: st.position, model: r.fit.model, basis: r.basis, tMinK: r.window.tMinK, tMaxK: r.window.tMaxK, nPoints: r.window.nPoints, weighted: r.fit.weighted,
        reducedChiSquare: r.fit.reducedChiSquare, parameters: r.fit.parameters.map((p: any) => parameter(p, r.basis)), plot: { points: r.points, curve: r.curve },
      });
    } else if (st.kind === "derive" && r?.quantities)
      for (const q of r.quantities) report.derived.push({ name: q.name, symbol: q.symbol, value: q.value, stdError: q.stdError, unit: q.unit, compact: `${formatUncertainty(q.value, q.stdError)} ${q.unit}`, ...(q.note ? { note: q.note } : {}) });
    else if (st.kind === "note" && typeof r?.markdown === "string" && r.markdown.trim()) report.notes.push(r.markdown);
  });
  return report;
}

/** The report of a sealed (or replaced) revision; default: the analysis's sealed revision. */
export async function buildReport(db: Db, member: Member, analysisId: string, revisionId?: string): Promise<RevisionReport> {
  authorise(member, "group.read");
  const rev = await db.analysisRevision.findFirst({
    where: { analysisId: uuidOrNone(analysisId), analysis: { groupId: member.group.id }, ...(revisionId ? { id: uuidOrNone(revisionId) } : { state: "sealed" }) },
    include: { decisions: { orderBy: { at: "asc" } }, analysis: { select: { sample: true } } },
  });
  if (!rev) throw new NotFoundError(revisionId ? "revision" : "sealed revision");
  if ((rev.state !== "sealed" && rev.state !== "replaced") || !rev.snapshot || !rev.contentHash) throw new ConflictError(`revision ${rev.number} is not sealed: only a sealed revision has a report`);
  const s = intactSnapshot(rev);
  const ids = [s.revision.submittedById, s.seal.sealedById, ...rev.decisions.map((d) => d.reviewerId)].filter((x): x is string => !!x);
  const names = Object.fromEntries((await db.user.findMany({ where: { id: { in: ids } }, select: { id: true, name: true } })).map((u) => [u.id, u.name]));
  return reportFromSnapshot(s, {
    group: { name: member.group.name, slug: member.group.slug }, state: rev.state, contentHash: rev.contentHash, names,
    decisions: rev.decisions.map((d) => ({ decision: d.decision, reviewer: names[d.reviewerId] ?? null, at: d.at.toISOString(), comment: d.comment })),
    liveSample: rev.analysis.sample,
  });
}
