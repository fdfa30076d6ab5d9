"use client";
/**
 * What every step kind's UI file provides (see registry.ts beside this folder), and the small
 * parts several kinds share. A kind's form edits a draft of its stored configuration, typed from
 * the engine's zod schema of that kind; the server validates it and says which field is wrong.
 */
import { createContext, useContext, type ComponentType, type ReactNode } from "react";
import type { StepConfig, StepKind, StepResult } from "@/lib/engine/notebook/registry";
import type { Quantity } from "@/lib/charts/notebook";
import { toTrade } from "@/lib/engine/units/named";
import { SelectField } from "../fields";
import { compact } from "../display";
import { Sym } from "../../Sym";
import { cleanText, formatUnit, modelLabel, plainSymbol, symbolOf, term } from "@/lib/display";
import type { NotebookContext, StepView } from "../types";

/** A draft of a kind's configuration while its form is open (fields may still be missing). */
export type Draft<K extends StepKind> = Partial<StepConfig<K>>;

export interface FormProps<K extends StepKind> {
  step: StepView;
  draft: Draft<K>;
  set: (patch: Draft<K>) => void;
  ctx: NotebookContext;
}

export interface ViewProps<K extends StepKind> {
  step: StepView;
  result: StepResult<K>;
  ctx: NotebookContext;
  /** Save a configuration straight from a chart (a brushed window, a point left out). */
  save: (config: Record<string, unknown>) => Promise<boolean>;
  /** The molar basis of the data above this step, when known. */
  basisAbove: "formula-unit" | "atom" | undefined;
  /** A note step's Markdown, rendered and sanitised on the server. */
  noteHtml: string | null;
}

/** One step kind in the browser: words, form, result view and the one-line summary. */
export interface StepUi<K extends StepKind> {
  /** What the kind does, in the "Add step" list. */
  hint: string;
  /** The settings form; null when the kind has no settings. */
  Form: ComponentType<FormProps<K>> | null;
  View: ComponentType<ViewProps<K>>;
  /** The line under the step's heading. */
  summary: (result: StepResult<K>, step: StepView) => string | null;
  /** Whether the summary is built only from our own symbols and numbers (safe to typeset). */
  typesetSummary: boolean;
}

/** The configuration field the last computation named as wrong (forms highlight it). */
export const FieldFault = createContext<{ field: string | null; message: string | null }>({ field: null, message: null });

/** Whether `name` (a schema key, or the first part of a dotted path) is the field at fault. */
export function useFault(name: string | undefined): string | null {
  const f = useContext(FieldFault);
  if (!name || !f.field) return null;
  return f.field === name || f.field.startsWith(`${name}.`) || f.field.startsWith(`${name}[`) ? f.message : null;
}

export const n = (v: unknown) => (typeof v === "number" ? v : null);

/** value(σ) of a {value, stdError} pair times k (display units), or "—". */
export const q = (v: { value: number; stdError: number | null } | null | undefined, k = 1) => (v ? compact(v.value * k, v.stdError === null ? null : v.stdError * k) : "—");

/** Fit steps above, and joint fits (which hand down γ and β when both are shared). */
function fitStepsAbove(ctx: NotebookContext, step: StepView) {
  const above = ctx.steps.filter((s) => (s.kind === "fit" || s.kind === "joint-fit") && s.position < step.position);
  return above.map((s, i) => ({ value: s.id, label: s.title || `${s.kind === "joint-fit" ? "Joint fit" : "Fit"} ${i + 1}: ${plainSymbol(modelLabel(String((s.config as { model?: string }).model ?? "sommerfeld")))}` }));
}

/** Choose a fit step above (or the nearest one) for a configuration field holding a step id. */
export function FitStepSelect({ label, field, step, ctx, value, onChange }: { label: ReactNode; field: string; step: StepView; ctx: NotebookContext; value: string | null | undefined; onChange: (id: string | null) => void }) {
  const options = [{ value: "", label: "the nearest fit above" }, ...fitStepsAbove(ctx, step)];
  return <SelectField label={label} name={field} value={String(value ?? "")} options={options} onChange={(v) => onChange(v || null)} />;
}

/** Rows of engine quantities (stored SI, shown in the trade's units): symbol and words, value(σ), unit, note. */
export function QuantityRows({ items }: { items: readonly Quantity[] }) {
  return (
    <>{items.map(toTrade).map((x) => (
      <tr key={x.name}>
        <td><Sym m={symbolOf(x.name)} /> <span className="muted small">{term(x.name).label}</span></td>
        <td className="num" data-testid={`quantity-${x.name}`}>{compact(x.value, x.stdError)}</td>
        <td className="nb-unit">{formatUnit(x.unit)}</td>
        <td className="small muted">{x.note ? <Sym m={cleanText(x.note)} /> : ""}</td>
      </tr>
    ))}</>
  );
}

