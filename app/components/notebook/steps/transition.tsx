"use client";
/** Superconducting transition: T_c and the jump by equal areas (engine: lib/engine/notebook/steps/transition.ts). */
import { useCallback } from "react";
import { transitionPlot, transitionCsv, type Quantity } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { NumField, SelectField } from "../fields";
import { num } from "../display";
import { Sym } from "../../Sym";
import { FitStepSelect, QuantityRows, q, type FormProps, type StepUi, type ViewProps } from "./ui";

function TransitionForm(p: FormProps<"transition">) {
  const w = (p.draft.window as { tLowK?: number; tHighK?: number } | undefined) ?? {};
  const setW = (patch: { tLowK?: number | null; tHighK?: number | null }) => {
    const next: Record<string, number> = {};
    const merged = { ...w, ...patch };
    if (typeof merged.tLowK === "number") next.tLowK = merged.tLowK;
    if (typeof merged.tHighK === "number") next.tHighK = merged.tHighK;
    p.set({ window: next });
  };
  return (
    <>
      <FitStepSelect label={<>Normal-state <Sym m="γ_n" /> and β from</>} field="normalFitStepId" step={p.step} ctx={p.ctx} value={p.draft.normalFitStepId} onChange={(v) => p.set({ normalFitStepId: v })} />
      <SelectField name="normalState" label="That normal state was measured" value={String(p.draft.normalState ?? "above-tc") as "above-tc" | "field-above-hc2"} options={[{ value: "above-tc", label: "above Tc, in zero field" }, { value: "field-above-hc2", label: "in a field above Hc2" }]} onChange={(v) => p.set({ normalState: v })} />
      <NumField name="window" label="Construction from" unit="K" value={w.tLowK ?? null} onChange={(v) => setW({ tLowK: v })} hint="empty: found from the jump" />
      <NumField name="window" label="Construction to" unit="K" value={w.tHighK ?? null} onChange={(v) => setW({ tHighK: v })} />
    </>
  );
}

function TransitionView({ result: r, basisAbove: basis }: ViewProps<"transition">) {
  const build = useCallback((width: number) => transitionPlot(r, { width, ...(basis ? { basis } : {}) }), [r, basis]);
  const rows = [r.tc, r.deltaC, r.jumpRatio, r.jumpRatioSuperconductingPart, r.gammaResidual, r.nonSuperconductingFraction].filter((x): x is Quantity => !!x);
  return (
    <div className="nb-result">
      <ChartBox title={<>Entropy balance: <Sym m="C_el/T" /> with the idealised equal-area step</>} name="transition" label="Superconducting transition" build={build} csv={() => transitionCsv(r)} />
      <table className="nb-compact" data-testid="transition-quantities">
        <thead><tr><th>Quantity</th><th className="num">Value(σ)</th><th>Unit</th><th>Note</th></tr></thead>
        <tbody>
          <QuantityRows items={rows} />
          <tr><td>BCS weak coupling</td><td className="num">{num(r.bcsJumpRatio, 4)}</td><td /><td className="small muted"><Sym m="ΔC/(γ_n T_c)" /> for comparison</td></tr>
        </tbody>
      </table>
      <p className="small muted">Normal state: {r.normalState === "above-tc" ? <>fitted above <Sym m="T_c" /> in zero field</> : <>fitted in a field above <Sym m="H_c2" /></>}. Uncertainty: {r.uncertaintyMethod}.</p>
    </div>
  );
}

export const transitionUi: StepUi<"transition"> = {
  hint: "T_c and the jump by equal areas",
  Form: TransitionForm,
  View: TransitionView,
  summary: (t) => `T_c = ${q(t.tc)} K · ΔC/(γ_n T_c) = ${q(t.jumpRatio)} (BCS weak coupling ${num(t.bcsJumpRatio, 4)})${t.nonSuperconductingFraction ? ` · non-superconducting fraction ${q(t.nonSuperconductingFraction)}` : ""}`,
  typesetSummary: true,
};
