"use client";
/** γ(H) of a superconductor (engine: lib/engine/notebook/steps/gammaField.ts). */
import { useCallback } from "react";
import { gammaFieldPlot, gammaFieldCsv } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { NumField, SelectField } from "../fields";
import { BASIS_LABEL, compact, num } from "../display";
import { Sym } from "../../Sym";
import { formatCount } from "@/lib/display";
import { FitStepSelect, n, q, useFault, type FormProps, type StepUi, type ViewProps } from "./ui";

function GammaFieldForm(p: FormProps<"gamma-field">) {
  const joints = p.ctx.steps.filter((s) => s.kind === "joint-fit" && s.position < p.step.position);
  const fits = p.ctx.steps.filter((s) => s.kind === "fit" && s.position < p.step.position);
  const chosen = new Set(p.draft.fitStepIds ?? []);
  const gn = p.draft.gammaNMJ ?? null;
  const fitsFault = useFault("fitStepIds");
  return (
    <>
      <NumField name="hc2T" label={<><Sym m="H_c2" /> at the measuring temperature</>} unit="T" value={n(p.draft.hc2T)} onChange={(v) => p.set({ hc2T: v })} required testId="gamma-field-hc2" />
      <SelectField name="jointFitStepId" label="γ per field from the joint fit" value={String(p.draft.jointFitStepId ?? "")}
        options={[{ value: "", label: "the nearest joint fit above" }, ...joints.map((s, i) => ({ value: s.id, label: s.title || `Joint fit ${i + 1}` }))]}
        onChange={(v) => p.set({ jointFitStepId: v || null })} />
      {fits.length > 0 && (
        <fieldset className={`wide nb-fieldset${fitsFault ? " nb-fault" : ""}`}>
          <legend>Also one point from each of these fits (its field and γ)</legend>
          {fits.map((s, i) => (
            <label key={s.id} className="checkbox nb-inline-check">
              <input type="checkbox" checked={chosen.has(s.id)} onChange={(e) => {
                const next = new Set(chosen);
                if (e.target.checked) next.add(s.id); else next.delete(s.id);
                p.set({ fitStepIds: [...next] });
              }} /> {s.title || `Fit ${i + 1}`}
            </label>
          ))}
          {fitsFault && <p className="field-error">{fitsFault}</p>}
        </fieldset>
      )}
      <FitStepSelect label={<>Normal-state <Sym m="γ_n" /> from the fit</>} field="normalFitStepId" step={p.step} ctx={p.ctx} value={p.draft.normalFitStepId} onChange={(v) => p.set({ normalFitStepId: v })} />
      <NumField name="gammaNMJ" label={<>or <Sym m="γ_n" /> given</>} unit="mJ mol⁻¹ K⁻²" value={gn?.value ?? null} onChange={(x) => p.set({ gammaNMJ: x === null ? null : { stdError: gn?.stdError ?? null, value: x } })}
        hint="empty: a normal-state fit, else the joint fit's fields at or above the upper critical field" />
      <NumField name="gammaNMJ" label={<>σ of <Sym m="γ_n" /> given</>} unit="mJ mol⁻¹ K⁻²" value={gn?.stdError ?? null} onChange={(x) => p.set({ gammaNMJ: gn ? { ...gn, stdError: x } : null })} />
    </>
  );
}

function GammaFieldView({ result: r }: ViewProps<"gamma-field">) {
  const build = useCallback((width: number) => gammaFieldPlot(r, { width }), [r]);
  return (
    <div className="nb-result">
      <ChartBox title={<><Sym m="γ(H)/γ_n" /> against <Sym m="H/H_c2" /></>} name="gamma-field" label="Field dependence of gamma" build={build} csv={() => gammaFieldCsv(r)} testId="gamma-field-chart" />
      <table className="nb-compact" data-testid="gamma-field-laws">
        <thead><tr><th>Law</th><th className="num">a (at H → 0)</th><th className="num">b</th><th className="num"><Sym m="χ²_red" /></th><th className="num">AICc</th><th /></tr></thead>
        <tbody>{r.laws.map((l) => (
          <tr key={l.law}>
            <td>{l.law === "linear" ? <><Sym m="γ(H)/γ_n = a + b·H/H_c2" /> — fully gapped</> : <><Sym m="γ(H)/γ_n = a + b·√(H/H_c2)" /> — line nodes</>}</td>
            <td className="num">{compact(l.intercept.value, l.intercept.stdError)}</td>
            <td className="num">{compact(l.slope.value, l.slope.stdError)}</td>
            <td className="num">{Number.isFinite(l.reducedChiSquare) ? num(l.reducedChiSquare, 3) : "—"}</td>
            <td className="num">{l.aicc === null ? "—" : num(l.aicc, 4)}</td>
            <td>{r.preferred === l.law ? <strong>preferred</strong> : ""}</td>
          </tr>
        ))}</tbody>
      </table>
      <p className="small">
        {formatCount(r.fields.length, "field")} below <Sym m="H_c2" /> = {num(r.hc2T, 4)} T; <Sym m="γ_n" /> = {q(r.gammaN, 1e3)} mJ mol⁻¹ K⁻² from {r.gammaNFrom} ({BASIS_LABEL[r.basis] ?? r.basis}).
        {r.deltaAicc !== null ? <> ΔAICc = {num(r.deltaAicc, 3)}; Akaike weight of the preferred law {num(r.weight, 3)}.</> : <> Too few fields for AICc: compared by χ².</>}
      </p>
      <ul className="small muted" aria-label="What the comparison can and cannot show">{r.cautions.map((c, i) => <li key={i}><Sym m={c} /></li>)}</ul>
    </div>
  );
}

export const gammaFieldUi: StepUi<"gamma-field"> = {
  hint: "γ(H)/γ_n against H/H_c2: linear or √H",
  Form: GammaFieldForm,
  View: GammaFieldView,
  summary: (r) => {
    const best = r.laws.find((l) => l.law === r.preferred)!;
    return `${r.preferred === "linear" ? "linear in H (fully gapped)" : "√H (line nodes)"} preferred${r.deltaAicc !== null ? `, ΔAICc = ${num(r.deltaAicc, 3)}` : ""} · γ_r/γ_n = ${compact(best.intercept.value, best.intercept.stdError)} · ${formatCount(r.fields.length, "field")} below H_c2 = ${num(r.hc2T, 3)} T`;
  },
  typesetSummary: true,
};
