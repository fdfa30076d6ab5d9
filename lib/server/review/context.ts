/**
 * The sealed context of a revision: the sample fields its numbers were computed and shown with,
 * as sealed, and what changed in the sample record since. Pure (no database).
 *
 * Format heatbook-seal/2 pins every field below (snapshot.context). Format heatbook-seal/1
 * pinned the chain's sample fields (formula, molar mass, atoms per formula unit, mass, density,
 * valences: snapshot.inputs.sample) but not the composition: for those, composition x and its
 * variable are shown from the sample record as it is now and marked as not pinned — never
 * presented as sealed.
 */
import type { RevisionSnapshot, SealedContext } from "./snapshot";

export type ContextField = "formula" | "molarMassGPerMol" | "atomsPerFormulaUnit" | "massMg" | "densityGPerCm3" | "valences" | "compositionVariable" | "compositionValue";

export const CONTEXT_FIELDS: readonly ContextField[] = ["formula", "molarMassGPerMol", "atomsPerFormulaUnit", "massMg", "densityGPerCm3", "valences", "compositionVariable", "compositionValue"];
const CHAIN_FIELDS: readonly ContextField[] = ["formula", "molarMassGPerMol", "atomsPerFormulaUnit", "massMg", "densityGPerCm3", "valences"];

export const CONTEXT_LABEL: Record<ContextField | "seriesVariable", string> = {
  formula: "formula", molarMassGPerMol: "molar mass", atomsPerFormulaUnit: "atoms per formula unit", massMg: "mass", densityGPerCm3: "density",
  valences: "valences", compositionVariable: "composition variable", compositionValue: "composition x", seriesVariable: "series variable",
};

/** The sample record's fields that the context compares (what Sample rows hold). */
export interface LiveSample {
  formula: string; molarMassGPerMol: number; atomsPerFormulaUnit: number; massMg: number | null; densityGPerCm3: number | null;
  valences: unknown; compositionVariable: string | null; compositionValue: number | null;
}

export interface PinnedContext {
  /** "full": format 2; "chain": format 1 (composition not pinned). */
  pinned: "full" | "chain";
  /** The fields as sealed; for "chain", composition fields are null (not known). */
  sample: SealedContext["sample"];
  /** The fields actually pinned. */
  fields: readonly ContextField[];
  /** Series at sealing (format 2), or null when not pinned. */
  series: SealedContext["series"] | null;
  /** A sentence for "chain": what is not pinned and why. */
  note: string | null;
}

export const NOT_PINNED_NOTE = "composition x not pinned: sealed before composition was part of the seal (snapshot format heatbook-seal/1); shown from the sample record as it is now";

/** The pinned context of a sealed snapshot. */
export function pinnedContext(s: Pick<RevisionSnapshot, "format" | "inputs" | "context">): PinnedContext {
  if (s.context) return { pinned: "full", sample: s.context.sample, fields: CONTEXT_FIELDS, series: s.context.series, note: null };
  const c = s.inputs.sample;
  return {
    pinned: "chain",
    sample: { id: c.id, label: c.label, formula: c.formula, molarMassGPerMol: c.molarMassGPerMol, atomsPerFormulaUnit: c.atomsPerFormulaUnit, massMg: c.massMg, densityGPerCm3: c.densityGPerCm3, valences: c.valences ?? {}, compositionVariable: null, compositionValue: null, seriesLabel: null },
    fields: CHAIN_FIELDS, series: null, note: NOT_PINNED_NOTE,
  };
}

export interface ContextChange {
  field: ContextField | "seriesVariable";
  label: string;
  sealed: unknown;
  now: unknown;
}

const same = (a: unknown, b: unknown) => JSON.stringify(sortKeys(a)) === JSON.stringify(sortKeys(b));
function sortKeys(v: unknown): unknown {
  if (!v || typeof v !== "object" || Array.isArray(v)) return v ?? null;
  return Object.fromEntries(Object.keys(v).sort().map((k) => [k, sortKeys((v as Record<string, unknown>)[k])]));
}

/** Pinned fields whose value in the sample record differs now; with `series`, its variable too. */
export function contextChanges(ctx: PinnedContext, live: LiveSample, series?: { id: string; compositionVariable: string }): ContextChange[] {
  const out: ContextChange[] = [];
  for (const f of ctx.fields) {
    const sealed = ctx.sample[f];
    const now = f === "valences" ? (live.valences ?? {}) : live[f];
    if (!same(sealed, now)) out.push({ field: f, label: CONTEXT_LABEL[f], sealed, now });
  }
  const atSeal = series && ctx.series?.find((x) => x.id === series.id);
  if (series && atSeal && atSeal.compositionVariable !== series.compositionVariable) out.push({ field: "seriesVariable", label: CONTEXT_LABEL.seriesVariable, sealed: atSeal.compositionVariable, now: series.compositionVariable });
  return out;
}

const show = (v: unknown) => (v === null || v === undefined ? "—" : typeof v === "object" ? Object.entries(v as Record<string, unknown>).map(([k, x]) => `${k} ${String(x)}`).join(", ") || "none" : String(v));

/** "formula Nb0.8Mo0.2 → Mo" (sealed → now). */
export function changeText(c: ContextChange): string {
  return `${c.label} ${show(c.sealed)} → ${show(c.now)}`;
}

/** "sample record changed since sealing: formula Nb0.8Mo0.2 → Mo; density 8.6 → 10.2", or null. */
export function describeContextChanges(changes: readonly ContextChange[]): string | null {
  if (changes.length === 0) return null;
  return `sample record changed since sealing: ${changes.map(changeText).join("; ")}`;
}
