/**
 * seriesView: the table and trends of a composition series, for its page, the API and exports.
 *
 * Per member sample, the values come from the NEWEST SEALED revision among the sample's analyses
 * (reviewed results; an archived or renamed analysis keeps its sealed revision in the series);
 * with `includeDrafts`, the newest unsealed revision of a non-archived analysis that is newer than
 * that seal is shown too, as a separate row with `draft: true`. Trends are fitted to sealed rows
 * only unless `trendFrom: "shown"`. Axes: "x" (the sample's compositionValue) or "ea" (valence
 * electrons per atom from the formula and the sample's valences, engine chemistry).
 *
 * One truth for sealed numbers: a sealed row's values AND its context (formula, x, valences,
 * molar mass, density, atoms per formula unit) come from the revision's sealed snapshot (checked
 * against its content hash; a mismatch refuses the whole view with a ConflictError naming the
 * revision), never from step rows or the sample record as edited since. Where the record now
 * differs, the row says "sample record changed since sealing" and names the fields. Snapshots
 * sealed before composition was pinned show x from the record, marked as not pinned.
 */
import type { Db } from "../db/client";
import type { Member } from "../access";
import { parseFormula, valenceElectronsPerAtom, electronsPerFormulaUnit } from "../../engine/chemistry";
import { fitTrend, freeElectronGammaMJ, type TrendFit, type TrendPoint } from "../../engine/series";
import { getSeries, type SeriesInfo } from "./records";
import { valuesFromSteps, type RevisionValues, type Valued } from "./extract";
import { intactSnapshot, sealedSteps } from "../review/served";
import { changeText, contextChanges, describeContextChanges, pinnedContext, type LiveSample } from "../review/context";

export type SeriesAxis = "x" | "ea";
export type SeriesQuantity = "gamma" | "thetaD" | "dosEF" | "massRatio" | "tc";
export const SERIES_QUANTITIES: readonly SeriesQuantity[] = ["gamma", "thetaD", "dosEF", "massRatio", "tc"];
export const QUANTITY_UNITS: Readonly<Record<SeriesQuantity | "beta" | "gammaFree", string>> = {
  gamma: "mJ mol^-1 K^-2", beta: "mJ mol^-1 K^-4", thetaD: "K", dosEF: "states eV^-1 f.u.^-1", massRatio: "1", tc: "K", gammaFree: "mJ mol^-1 K^-2",
};

export interface SeriesViewOptions {
  axis?: SeriesAxis;
  includeDrafts?: boolean;
  trendFrom?: "sealed" | "shown";
}

export interface RowSource {
  analysisId: string;
  analysisTitle: string;
  revisionId: string;
  revisionNumber: number;
  state: "open" | "in_review" | "returned" | "sealed" | "replaced";
  contentHash: string | null;
  sealedAt: string | null;
  analysisArchived: boolean;
}

export interface RowContext {
  /** Where formula, x, e/a and the free-electron γ come from. */
  source: "sealed" | "sealed-chain-only" | "sample-record";
  /** "label sealed → now" per pinned field that differs in the sample record now. */
  changedSinceSealing: string[];
  note: string | null;
}

export interface SeriesRow extends Omit<RevisionValues, "source"> {
  sample: { id: string; label: string; formula: string; archived: boolean };
  x: number | null;
  electronsPerAtom: number | null;
  /** The chosen axis's value (x or e/a). */
  axisValue: number | null;
  /** Free-electron γ from average valence and density [mJ mol⁻¹ K⁻² per f.u.], null without a density. */
  gammaFree: number | null;
  /** true when the values come from a revision that is not sealed. */
  draft: boolean;
  /** Which step gave γ. */
  valueSource: RevisionValues["source"];
  /** null when the sample has no (sealed) analysis yet. */
  revision: RowSource | null;
  context: RowContext;
  warnings: string[];
}

export interface QuantityTrends {
  linear: TrendFit | null;
  quadratic: TrendFit | null;
}

export interface SeriesView {
  series: SeriesInfo;
  axis: SeriesAxis;
  axisLabel: string;
  includeDrafts: boolean;
  trendFrom: "sealed" | "shown";
  units: typeof QUANTITY_UNITS;
  rows: SeriesRow[];
  trends: Record<SeriesQuantity, QuantityTrends>;
}

type RevRow = { id: string; number: number; state: RowSource["state"]; contentHash: string | null; sealedAt: Date | null; updatedAt: Date; analysis: { id: string; title: string; sampleId: string; archivedAt: Date | null } };

function newest<T>(list: T[], key: (t: T) => number): T | null {
  return list.reduce<T | null>((best, t) => (best === null || key(t) > key(best) ? t : best), null);
}

function pickRevisions(revs: RevRow[], includeDrafts: boolean): { sealed: RevRow | null; draft: RevRow | null } {
  const sealed = newest(revs.filter((r) => r.state === "sealed"), (r) => r.sealedAt!.getTime());
  if (!includeDrafts) return { sealed, draft: null };
  const since = sealed?.sealedAt?.getTime() ?? -Infinity;
  const draft = newest(revs.filter((r) => (r.state === "open" || r.state === "in_review" || r.state === "returned") && r.analysis.archivedAt === null && r.updatedAt.getTime() > since), (r) => r.updatedAt.getTime());
  return { sealed, draft };
}

function axes(sample: { formula: string; valences: unknown; compositionValue: number | null; molarMassGPerMol: number; densityGPerCm3: number | null }, warnings: string[]) {
  try {
    const els = parseFormula(sample.formula).elements;
    const valences = (sample.valences ?? {}) as Record<string, number>;
    const z = electronsPerFormulaUnit(els, valences);
    return { ea: valenceElectronsPerAtom(els, valences), gammaFree: freeElectronGammaMJ({ molarMassGPerMol: sample.molarMassGPerMol, densityGPerCm3: sample.densityGPerCm3, electronsPerFormulaUnit: z }) };
  } catch (err) {
    warnings.push(`electrons per atom not computed: ${(err as Error).message}`);
    return { ea: null, gammaFree: null };
  }
}

const toSource = (r: RevRow): RowSource => ({
  analysisId: r.analysis.id, analysisTitle: r.analysis.title, revisionId: r.id, revisionNumber: r.number, state: r.state, contentHash: r.contentHash, sealedAt: r.sealedAt?.toISOString() ?? null,
  analysisArchived: r.analysis.archivedAt !== null,
});

type SampleRecord = LiveSample & { id: string; label: string; archivedAt: Date | null; valences: unknown };

/** A sealed row's values and context from the snapshot (intact, or ConflictError). */
async function sealedRowsData(db: Db, ids: string[]) {
  const rows = ids.length ? await db.analysisRevision.findMany({ where: { id: { in: ids } }, select: { id: true, number: true, contentHash: true, snapshot: true, analysis: { select: { title: true } } } }) : [];
  return new Map(rows.map((r) => {
    const snap = intactSnapshot(r, r.analysis.title);
    return [r.id, { steps: sealedSteps(snap), context: pinnedContext(snap) }];
  }));
}

function trendPoints(rows: SeriesRow[], q: SeriesQuantity): TrendPoint[] {
  return rows.flatMap((r) => {
    const v = r[q] as Valued | null;
    if (!v || r.axisValue === null) return [];
    return [{ x: r.axisValue, y: v.value, sigma: v.stdError !== null && v.stdError > 0 ? v.stdError : null }];
  });
}

function trendsOf(rows: SeriesRow[]): Record<SeriesQuantity, QuantityTrends> {
  const out = {} as Record<SeriesQuantity, QuantityTrends>;
  for (const q of SERIES_QUANTITIES) {
    const pts = trendPoints(rows, q);
    out[q] = { linear: pts.length >= 2 ? fitTrend(pts, { degree: 1 }) : null, quadratic: pts.length >= 3 ? fitTrend(pts, { degree: 2 }) : null };
  }
  return out;
}

/** The series table and trends; see the module comment. NotFoundError for another group's series. */
export async function seriesView(db: Db, member: Member, seriesId: string, options: SeriesViewOptions = {}): Promise<SeriesView> {
  const series = await getSeries(db, member, seriesId);
  const axis = options.axis ?? "x";
  const includeDrafts = options.includeDrafts ?? false;
  const trendFrom = options.trendFrom ?? "sealed";
  const samples: SampleRecord[] = await db.sample.findMany({ where: { id: { in: series.memberIds }, groupId: member.group.id } });
  const revs: RevRow[] = await db.analysisRevision.findMany({
    where: { analysis: { sampleId: { in: series.memberIds }, groupId: member.group.id } },
    select: { id: true, number: true, state: true, contentHash: true, sealedAt: true, updatedAt: true, analysis: { select: { id: true, title: true, sampleId: true, archivedAt: true } } },
  });
  const picks = new Map(samples.map((s) => [s.id, pickRevisions(revs.filter((r) => r.analysis.sampleId === s.id), includeDrafts)]));
  const sealedIds = [...picks.values()].flatMap((p) => (p.sealed ? [p.sealed.id] : []));
  const draftIds = [...picks.values()].flatMap((p) => (p.draft ? [p.draft.id] : []));
  const [sealed, draftSteps] = await Promise.all([
    sealedRowsData(db, sealedIds),
    draftIds.length ? db.step.findMany({ where: { revisionId: { in: draftIds } }, select: { revisionId: true, kind: true, position: true, output: true } }) : Promise.resolve([]),
  ]);
  const rows: SeriesRow[] = [];
  for (const s of samples) {
    const pick = picks.get(s.id)!;
    const emit = (rev: RevRow | null, draft: boolean) => {
      const warnings: string[] = [];
      const data = rev && !draft ? sealed.get(rev.id)! : null;
      const ctx = data?.context ?? null;
      // The context the row's numbers go with: sealed (pinned) for sealed rows, the record otherwise.
      const used = ctx ? { ...ctx.sample, compositionValue: ctx.pinned === "full" ? ctx.sample.compositionValue : s.compositionValue } : { ...s, valences: (s.valences ?? {}) as Record<string, number> };
      const { ea, gammaFree } = axes(used, warnings);
      const changes = ctx ? contextChanges(ctx, s, { id: series.id, compositionVariable: series.compositionVariable }) : [];
      const changed = describeContextChanges(changes);
      if (changed) warnings.push(changed);
      if (ctx?.note) warnings.push(ctx.note);
      const steps = data ? data.steps : rev ? draftSteps.filter((st) => st.revisionId === rev.id) : [];
      const v = valuesFromSteps(steps, used.atomsPerFormulaUnit);
      const { source, ...values } = v;
      if (rev && !v.gamma) warnings.push("the revision has no fit or derive output with γ");
      if (!rev) warnings.push("no sealed analysis revision yet");
      rows.push({
        sample: { id: s.id, label: s.label, formula: used.formula, archived: s.archivedAt !== null }, x: used.compositionValue, electronsPerAtom: ea,
        axisValue: axis === "x" ? used.compositionValue : ea, gammaFree, ...values, draft, valueSource: source, revision: rev ? toSource(rev) : null,
        context: { source: ctx ? (ctx.pinned === "full" ? "sealed" : "sealed-chain-only") : "sample-record", changedSinceSealing: changes.map(changeText), note: ctx?.note ?? null },
        warnings,
      });
    };
    if (pick.sealed || !pick.draft) emit(pick.sealed, false);
    if (pick.draft) emit(pick.draft, true);
  }
  rows.sort((a, b) => (a.axisValue ?? Infinity) - (b.axisValue ?? Infinity) || a.sample.label.localeCompare(b.sample.label) || Number(a.draft) - Number(b.draft));
  const fitted = rows.filter((r) => r.revision !== null && (trendFrom === "shown" ? true : !r.draft));
  return { series, axis, axisLabel: axis === "x" ? series.compositionVariable : "e/a (valence electrons per atom)", includeDrafts, trendFrom, units: QUANTITY_UNITS, rows, trends: trendsOf(fitted) };
}
