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
import { cleanText, formatCount, formatNumber, formatQuantity, formatUnit, modelLabel, stepKindLabel, term } from "../../display";
import { formatStatSyst } from "../../engine/scan/statSyst";
import { authorise, type Member } from "../access";
import { uuidOrNone } from "../samples";
import { intactSnapshot } from "./served";
import type { RevisionSnapshot } from "./snapshot";
import type { SealSignature } from "./signature";
import { changeText, contextChanges, pinnedContext, type LiveSample } from "./context";
import { resultOf } from "../../engine/notebook/registry";
import { toTrade } from "../../engine/units/named";
import type { JointParameter } from "../../engine/fit/joint";
import { parameterSpecOf } from "../../engine/fit/jointModels";

export const SAFETY_SENTENCE = "These results need expert review under local practice before use in any safety-relevant decision.";

/**
 * One reported number. `symbol` is markup ("Θ_D", lib/display/typeset.ts), `label` its name in
 * words, `unit` typeset ("mJ mol⁻¹ K⁻²", "" when dimensionless), `compact` "value(σ) unit" by
 * the one display rule (lib/display/numbers.ts). `value`/`stdError` are in `unit`.
 */
export interface ReportValue { name: string; symbol: string; label: string; value: number; stdError: number | null; unit: string; compact: string; note?: string; systematicError?: number | null }

export interface RevisionReport {
  title: string;
  group: { name: string; slug: string };
  analysisId: string;
  revision: { id: string; number: number; state: "sealed" | "replaced"; basedOnId: string | null };
  sample: { label: string; formula: string; molarMassGPerMol: number; atomsPerFormulaUnit: number; massMg: number | null; densityGPerCm3: number | null };
  provenance: { measurementId: string; label: string; kind: string; fileName: string; sha256: string; sizeBytes: number; pointCount: number; tMinK: number; tMaxK: number; fieldT: number; units: unknown }[];
  corrections: { position: number; kind: string; summary: string }[];
  fits: {
    position: number; model: string; modelLabel: string; basis: string; tMinK: number; tMaxK: number; nPoints: number; weighted: boolean;
    reducedChiSquare: number | null;
    /** Unweighted fits: √(Σr²/(n − p)) in mJ mol⁻¹ K⁻¹, the residual standard deviation in data units. */
    residualStdMJ: number | null;
    parameters: ReportValue[];
    /** For the figures: the points (with in-window flags), the model curve, residuals of the window's points and the window scan, SI. */
    plot: { points: unknown; curve: unknown; residuals: unknown; windowIndices: unknown; scan: unknown };
  }[];
  derived: ReportValue[];
  /** Results of the steps across fields and over wide ranges (joint fit, γ(H), lattice views), each with a sentence saying what was done. */
  stepResults: { position: number; kind: string; heading: string; summary: string; values: ReportValue[] }[];
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

/** SI unit text of the engine ("J/(mol*K^2)") → display factor and unit (mJ for molar heat-capacity coefficients). */
function displayUnit(unit: string): { factor: number; unit: string } {
  const u = unit.replace(/\s+/g, "");
  if (/^J\/\(mol\*K\^[\d.]+\)$/.test(u) || /^J\*K\/mol$/.test(u) || /^J\/\(mol\*K\)$/.test(u)) return { factor: 1e3, unit: formatUnit(`m${u}`) };
  return { factor: 1, unit: formatUnit(unit) };
}

/** A fit parameter in display units; with a systematic σ (SI, a recommended fit's γ or β) written value(stat)(syst). */
export function parameter(p: { name: string; value: number; stdError: number | null; unit: string; fixed?: boolean }, systematicSI: number | null | undefined = null): ReportValue {
  const t = term(p.name);
  const d = displayUnit(p.unit);
  const value = p.value * d.factor, stdError = p.stdError === null ? null : p.stdError * d.factor;
  const sys = typeof systematicSI === "number" && Number.isFinite(systematicSI) ? Math.abs(systematicSI * d.factor) : null;
  const compact = sys === null ? formatQuantity(value, stdError, d.unit) : `${formatStatSyst(value, stdError, sys)}${d.unit ? ` ${d.unit}` : ""} (stat)(syst)`;
  return { name: p.name, symbol: t.symbol ?? t.label, label: t.label, value, stdError, unit: d.unit, compact: p.fixed ? `${compact} (held fixed)` : compact, ...(sys !== null ? { systematicError: sys } : {}) };
}

const PER = (b: unknown) => (b === "atom" ? "per mole of atoms" : "per mole formula unit");

/** What a correction step actually did, from its stored result (never from what it might have done). */
export function describeCorrection(kind: string, config: Record<string, any>, result: Record<string, any> | null): string {
  if (!result) return `${stepKindLabel(kind)}: no result stored`;
  if (kind === "addenda") return `addenda “${result.addendaLabel}” subtracted (${result.method === "linear" ? "linear interpolation" : "smooth fit"} of the addenda curve); the addenda were at most ${formatNumber(100 * result.maxAddendaFraction, 3)} % of the total`;
  if (kind === "normalise") {
    const per = PER(result.per), mm = `M = ${formatNumber(result.molarMassGPerMol, 6)} g mol⁻¹`;
    if (result.from === "sample")
      return `whole-sample heat capacity converted ${per} with the sample mass m = ${formatNumber(result.massMg, 6)} mg${config.massMg ? " (entered in this step)" : ""} and ${mm}${typeof result.moles === "number" ? ` (n = ${formatNumber(result.moles, 4)} mol)` : ""}`;
    if (result.from === "specific") return `specific heat capacity (per kilogram) converted ${per} with ${mm}`;
    if (result.from === result.per) return `data imported already ${per}: no conversion`;
    return `data imported ${PER(result.from)}, restated ${per} (${formatCount(result.atomsPerFormulaUnit, "atom")} per formula unit)`;
  }
  if (kind === "data") {
    const range = config.tMinK != null || config.tMaxK != null ? ` in ${config.tMinK != null ? formatNumber(config.tMinK) : "…"}–${config.tMaxK != null ? formatNumber(config.tMaxK) : "…"} K` : "";
    const out = config.excluded?.length ? `; ${formatCount(config.excluded.length, "point")} left out by hand (${config.excluded.map((e: any) => e.reason).join("; ")})` : "";
    return `${formatCount(result.points, "point")} used${range}${out}`;
  }
  return stepKindLabel(kind);
}

function derivedValue(stored: { name: string; symbol: string; value: number; stdError: number | null; unit: string; note?: string; systematicError?: number | null }): ReportValue {
  const q = toTrade(stored); // stored SI (or, before engine 0.4, already in the trade's units)
  const t = term(q.name);
  const unit = formatUnit(q.unit);
  // a systematic σ (from a recommended fit) is written value(stat)(syst)
  const sys = typeof q.systematicError === "number" ? q.systematicError : null;
  const compact = sys === null ? formatQuantity(q.value, q.stdError, q.unit) : `${formatStatSyst(q.value, q.stdError, sys)}${unit ? ` ${unit}` : ""} (stat)(syst)`;
  return { name: q.name, symbol: t.symbol ?? q.symbol, label: t.label, value: q.value, stdError: q.stdError, unit, compact, ...(q.note ? { note: cleanText(q.note) } : {}), ...(sys !== null ? { systematicError: sys } : {}) };
}

/** A parameter of a joint fit, "γ" or "g (2 T)", in display units, named by its model's spec (a user expression's by its own name). */
function jointValue(model: string, p: JointParameter, fieldT: number | null): ReportValue {
  const v = parameter({ name: p.name, value: p.value, stdError: p.stdError, unit: p.unit, fixed: p.fixed });
  const spec = parameterSpecOf(model, p.name);
  const named = { ...v, name: p.key, symbol: spec?.symbol ?? p.name, label: spec?.label ?? "parameter of the expression" };
  return fieldT === null ? named : { ...named, symbol: `${named.symbol} (${formatNumber(fieldT, 4)} T)`, label: `${named.label}, measurement ${p.measurement}` };
}

/** The report entry of a joint fit, γ(H) or lattice views step (null for other kinds). */
export function otherResult(kind: string, position: number, output: { kind: string; ok: boolean; result: unknown }): RevisionReport["stepResults"][number] | null {
  const joint = resultOf(output, "joint-fit");
  if (joint) {
    const f = joint.fit;
    const fields = f.measurements.map((m) => m.fieldT);
    return {
      position, kind, heading: `${stepKindLabel(kind)}: ${f.title}`,
      summary: `${formatCount(f.measurements.length, "measurement")} in ${formatNumber(Math.min(...fields), 4)}–${formatNumber(Math.max(...fields), 4)} T fitted together (${formatCount(f.nPoints, "point")} in the windows, ${PER(joint.basis)}); shared: ${f.shared.join(", ") || "none"}; χ² = ${formatNumber(f.chiSquare, 5)} on ${f.dof} degrees of freedom${f.weighted && f.reducedChiSquare !== null ? `, χ²_red = ${formatNumber(f.reducedChiSquare, 4)}` : ", unweighted"}${f.aicc !== null ? `, AICc = ${formatNumber(f.aicc, 6)}` : ""}; standard errors from the joint covariance${f.converged ? "" : "; NOT converged"}`,
      values: f.parameters.map((p) => jointValue(f.model, p, p.measurement === null ? null : f.measurements[p.measurement - 1]!.fieldT)),
    };
  }
  const gh = resultOf(output, "gamma-field");
  if (gh) {
    const law = (l: (typeof gh.laws)[number]): ReportValue[] => [
      { name: `${l.law}-a`, symbol: "a", label: `intercept, ${l.title}`, value: l.intercept.value, stdError: l.intercept.stdError, unit: "", compact: formatQuantity(l.intercept.value, l.intercept.stdError, "1") },
      { name: `${l.law}-b`, symbol: "b", label: `slope, ${l.title}`, value: l.slope.value, stdError: l.slope.stdError, unit: "", compact: formatQuantity(l.slope.value, l.slope.stdError, "1") },
    ];
    return {
      position, kind, heading: stepKindLabel(kind),
      summary: `γ(H)/γ_n at ${formatCount(gh.fields.length, "field")} below H_c2 = ${formatNumber(gh.hc2T, 4)} T fitted by a + b·H/H_c2 and by a + b·√(H/H_c2); preferred: ${gh.preferred === "linear" ? "linear in H" : "√H"}${gh.deltaAicc !== null ? ` (ΔAICc = ${formatNumber(gh.deltaAicc, 3)})` : " (by χ²: too few fields for AICc)"}; γ_n = ${formatQuantity(gh.gammaN.value * 1e3, gh.gammaN.stdError === null ? null : gh.gammaN.stdError * 1e3, "mJ mol^-1 K^-2")} from ${gh.gammaNFrom}. ${gh.cautions[0]}`,
      values: gh.laws.flatMap(law),
    };
  }
  const lat = resultOf(output, "lattice");
  if (lat) {
    const th = lat.curve.thetaDK.filter((v): v is number => v !== null);
    return {
      position, kind, heading: stepKindLabel(kind),
      summary: `C − γT inverted through the Debye function at ${formatCount(lat.points, "point")}: effective Θ_D from ${th.length ? `${formatNumber(Math.min(...th), 4)} to ${formatNumber(Math.max(...th), 4)} K` : "— (none in range)"}${lat.peak ? `; (C − γT)/T³ peaks at ${formatNumber(lat.peak.temperatureK, 3)} K` : "; no peak of (C − γT)/T³ in range"}`,
      values: [],
    };
  }
  return null;
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
    corrections: [], fits: [], derived: [], stepResults: [], warnings: [], notes: [],
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
    for (const w of out?.warnings ?? []) report.warnings.push(`${stepKindLabel(st.kind)} (step ${st.position + 1}): ${cleanText(w)}`);
    if (st.kind === "data" || st.kind === "addenda" || st.kind === "normalise") report.corrections.push({ position: st.position, kind: st.kind, summary: describeCorrection(st.kind, config, r) });
    else if (st.kind === "fit" && r?.fit) {
      report.fits.push({
        position: st.position, model: r.fit.model, modelLabel: modelLabel(r.fit.model), basis: r.basis, tMinK: r.window.tMinK, tMaxK: r.window.tMaxK, nPoints: r.window.nPoints, weighted: r.fit.weighted,
        reducedChiSquare: r.fit.weighted ? r.fit.reducedChiSquare : null,
        residualStdMJ: !r.fit.weighted && typeof r.fit.reducedChiSquare === "number" ? Math.sqrt(r.fit.reducedChiSquare) * 1e3 : null,
        // γ and β of a recommended fit carry the systematic σ of the model-and-window choice: value(stat)(syst)
        parameters: r.fit.parameters.map((p: any) => parameter(p, r.recommendation?.recommended ? (p.name === "gamma" ? r.summary?.gamma?.systematicError : p.name === "beta" ? r.summary?.beta?.systematicError : null) : null)),
        plot: { points: r.points, curve: r.curve, residuals: r.fit.residuals ?? null, windowIndices: r.fit.window?.indices ?? null, scan: r.scan ?? null },
      });
    } else if (st.kind === "derive" && r?.quantities)
      for (const q of r.quantities) report.derived.push(derivedValue(q));
    else if (st.kind === "note" && typeof r?.markdown === "string" && r.markdown.trim()) report.notes.push(r.markdown);
    else if (out?.ok) {
      const extra = otherResult(st.kind, st.position, { kind: st.kind, ok: true, result: r });
      if (extra) report.stepResults.push(extra);
    }
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
