"use client";
/** Normalisation step: per mole formula unit or per mole of atoms (engine: lib/engine/notebook/steps/normalise.ts). */
import { NumField, SelectField } from "../fields";
import { BASIS_LABEL, num } from "../display";
import { formatCount } from "@/lib/display";
import { n, type FormProps, type StepUi, type ViewProps } from "./ui";

function NormaliseForm(p: FormProps<"normalise">) {
  return (
    <>
      <SelectField name="per" label="Per" value={String(p.draft.per ?? "formula-unit") as "formula-unit" | "atom"} options={[{ value: "formula-unit", label: "mole formula unit" }, { value: "atom", label: "mole of atoms" }]} onChange={(v) => p.set({ per: v })} />
      <NumField name="massMg" label="Sample mass for this analysis" unit="mg" value={n(p.draft.massMg)} onChange={(v) => p.set({ massMg: v })} hint="empty: the mass on the sample record" />
    </>
  );
}

function NormaliseView({ result: r }: ViewProps<"normalise">) {
  return (
    <dl className="facts nb-facts">
      <dt>From</dt><dd>{BASIS_LABEL[r.from] ?? r.from}</dd>
      <dt>To</dt><dd>{BASIS_LABEL[r.per]}</dd>
      <dt>Formula, M</dt><dd>{r.formula}, {num(r.molarMassGPerMol, 7)} g mol⁻¹, {formatCount(Number(num(r.atomsPerFormulaUnit, 4)), "atom")} per formula unit</dd>
      {typeof r.moles === "number" && r.massMg !== null && <><dt>Amount</dt><dd>{num(r.massMg, 6)} mg → {num(r.moles * 1e3, 6)} mmol formula units</dd></>}
    </dl>
  );
}

export const normaliseUi: StepUi<"normalise"> = {
  hint: "per mole formula unit or per mole of atoms",
  Form: NormaliseForm,
  View: NormaliseView,
  summary: (r) => `${BASIS_LABEL[r.per]} · ${r.formula}, M = ${num(r.molarMassGPerMol, 6)} g mol⁻¹${r.moles && r.massMg !== null ? ` · ${num(r.massMg, 5)} mg = ${num(r.moles * 1e3, 5)} mmol` : ""}`,
  typesetSummary: false,
};
