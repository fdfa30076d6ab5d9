"use client";
/** Derived quantities: Θ_D, D(E_F), m* / m, λ … from γ and β (engine: lib/engine/notebook/steps/derive.ts). */
import { NumField, SelectField, TextField, pairsText, parsePairs } from "../fields";
import { BASIS_LABEL, num } from "../display";
import { Sym } from "../../Sym";
import { formatRange, formatUnit, modelLabel, symbolOf } from "@/lib/display";
import { formatStatSyst } from "@/lib/engine/scan/statSyst";
import { toTrade } from "@/lib/engine/units/named";
import { FitStepSelect, QuantityRows, n, q, type FormProps, type StepUi, type ViewProps } from "./ui";

function measuredField(p: FormProps<"derive">,  field: "gammaBandMJ" | "kwA", label: string, unit: string) {
  const v = p.draft[field] as { value: number; stdError: number | null } | null | undefined;
  return (
    <>
      <NumField name={field} label={<Sym m={label} />} unit={unit} value={v?.value ?? null} onChange={(x) => p.set({ [field]: x === null ? null : { ...(v ?? { stdError: null }), value: x } })} />
      <NumField name={field} label={<>σ of <Sym m={label.split(" ")[0]!} /></>} unit={unit} value={v?.stdError ?? null} onChange={(x) => p.set({ [field]: v ? { ...v, stdError: x } : null })} />
    </>
  );
}

function DeriveForm(p: FormProps<"derive">) {
  const chi = p.draft.chi as { value: number; stdError: number | null; unit: "m3/mol" | "emu/mol" } | null | undefined;
  return (
    <>
      <FitStepSelect label="γ and β from" field="fitStepId" step={p.step} ctx={p.ctx} value={p.draft.fitStepId} onChange={(v) => p.set({ fitStepId: v })} />
      <SelectField name="basis" label="Show per" value={String(p.draft.basis ?? "formula-unit") as "formula-unit" | "atom"} options={[{ value: "formula-unit", label: "mole formula unit" }, { value: "atom", label: "mole of atoms" }]} onChange={(v) => p.set({ basis: v })} />
      <NumField name="densityGPerCm3" label="Density override" unit="g cm⁻³" value={n(p.draft.densityGPerCm3)} onChange={(v) => p.set({ densityGPerCm3: v })} hint="empty: the sample's density" />
      <TextField name="valences" label="Valence overrides (El=z)" value={pairsText(p.draft.valences as Record<string, number>)} onChange={(v) => p.set({ valences: parsePairs(v) })} placeholder="Nb=5, Mo=6" mono />
      {measuredField(p, "gammaBandMJ", "γ_band (band structure)", "mJ mol⁻¹ K⁻² per f.u.")}
      <NumField name="muStar" label="μ* (Coulomb pseudopotential)" value={n(p.draft.muStar)} onChange={(v) => p.set({ muStar: v })} hint="for McMillan’s Tc, e.g. 0.13" />
      <NumField name="tcK" label={<>Measured <Sym m="T_c" /></>} unit="K" value={n(p.draft.tcK)} onChange={(v) => p.set({ tcK: v })} />
      <NumField name="chi" label="χ (Pauli susceptibility)" value={chi?.value ?? null} onChange={(x) => p.set({ chi: x === null ? null : { stdError: null, unit: "m3/mol", ...(chi ?? {}), value: x } })} />
      <NumField name="chi" label="σ of χ" value={chi?.stdError ?? null} onChange={(x) => p.set({ chi: chi ? { ...chi, stdError: x } : null })} />
      <SelectField name="chi" label="Unit of χ" value={chi?.unit ?? "m3/mol"} options={[{ value: "m3/mol", label: "m³ mol⁻¹ (SI)" }, { value: "emu/mol", label: "emu mol⁻¹ (cgs)" }]} onChange={(u) => p.set({ chi: chi ? { ...chi, unit: u } : null })} />
      {measuredField(p, "kwA", "A (resistivity T² coefficient)", "μΩ cm K⁻²")}
    </>
  );
}

function DeriveView({ result: r }: ViewProps<"derive">) {
  const contrast = r.quantities.find((x) => x.name === "electronicToClassical");
  const rest = r.quantities.filter((x) => x.name !== "electronicToClassical");
  return (
    <div className="nb-result">
      <p className="small muted">From the fit of <Sym m={modelLabel(r.fitModel)} /> over {formatRange(r.fitWindow.tMinK, r.fitWindow.tMaxK, "K")} in {num(r.fieldT)} T; shown {BASIS_LABEL[r.basis]}. Valences used: {Object.entries(r.valences).map(([k, v]) => `${k} ${v}`).join(", ") || "none"}; density {r.densityGPerCm3 === null ? "not given" : `${num(r.densityGPerCm3, 5)} g cm⁻³`}.</p>
      <table className="nb-compact" data-testid="derived-quantities">
        <thead><tr><th>Quantity</th><th className="num">Value(σ)</th><th>Unit</th><th>Note</th></tr></thead>
        <tbody><QuantityRows items={rest} /></tbody>
      </table>
      {contrast && (
        <div className="nb-contrast">
          <strong>Room temperature, electrons against the classical gas.</strong> At 300 K the electronic heat capacity is {num(contrast.value * 100, 3)} % of the classical 3/2 R per conduction electron
          (ratio (π²/3)·T/T_F). Only electrons within ~k_BT of the Fermi level can take up heat, which is why γ is small and measured at low temperature.
          <div className="nb-bar" aria-hidden="true"><span style={{ width: `${Math.max(0.5, Math.min(100, contrast.value * 100))}%` }} /></div>
        </div>
      )}
    </div>
  );
}

/** value(stat)(syst) when a systematic σ is known (a recommended fit), else value(σ). */
const qs = (v: { value: number; stdError: number | null } | null | undefined, syst: number | null | undefined) =>
  v && typeof syst === "number" ? formatStatSyst(v.value, v.stdError, syst) : q(v);

export const deriveUi: StepUi<"derive"> = {
  hint: "Θ_D, D(E_F), m*/m, λ … from γ and β",
  Form: DeriveForm,
  View: DeriveView,
  summary: (r) => {
    const by = new Map(r.quantities.map(toTrade).map((x) => [x.name, x]));
    const pick = ["thetaD", "dosEF", "massRatio", "lambda"].map((k) => by.get(k)).filter((x) => !!x);
    return pick.map((x) => `${symbolOf(x!.name)} = ${qs(x, x!.systematicError)} ${formatUnit(x!.unit)}`.trim()).join(" · ");
  },
  typesetSummary: true,
};
