"use client";
/** Entropy and enthalpy: S(T) and H(T) − H(0) (engine: lib/engine/notebook/steps/entropy.ts). */
import { useCallback, useState } from "react";
import { integralPlot, entropyCsv } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { BASIS_LABEL, compact, num } from "../display";
import { Sym } from "../../Sym";
import { FitStepSelect, type FormProps, type StepUi, type ViewProps } from "./ui";

function EntropyForm(p: FormProps<"entropy">) {
  return <FitStepSelect label={<>Low-temperature part (0 → <Sym m="T_min" />) from</>} field="fitStepId" step={p.step} ctx={p.ctx} value={p.draft.fitStepId} onChange={(v) => p.set({ fitStepId: v })} />;
}

function EntropyView({ result: r }: ViewProps<"entropy">) {
  const [log, setLog] = useState(false);
  const buildS = useCallback((width: number) => integralPlot(r, "entropy", { width, log }), [r, log]);
  const buildH = useCallback((width: number) => integralPlot(r, "enthalpy", { width, log }), [r, log]);
  const toggle = <label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic axes</label>;
  return (
    <div className="nb-result">
      <div className="nb-two">
        <ChartBox title="Entropy S(T)" name="entropy" label="Entropy against temperature" build={buildS} csv={() => entropyCsv(r)} controls={toggle} />
        <ChartBox title="Enthalpy H(T) − H(0)" name="enthalpy" label="Enthalpy against temperature" build={buildH} csv={() => entropyCsv(r)} />
      </div>
      <p className="small muted">
        Below the lowest measured point: {r.entropy.extrapolation.symbol} = {compact(r.entropy.extrapolation.value * 1e3, r.entropy.extrapolation.stdError === null ? null : r.entropy.extrapolation.stdError * 1e3)} mJ mol⁻¹ K⁻¹ and {r.enthalpy.extrapolation.symbol} = {compact(r.enthalpy.extrapolation.value * 1e3, r.enthalpy.extrapolation.stdError === null ? null : r.enthalpy.extrapolation.stdError * 1e3)} mJ mol⁻¹, {r.entropy.extrapolation.note}. Integration: {r.entropy.method}.
      </p>
    </div>
  );
}

export const entropyUi: StepUi<"entropy"> = {
  hint: "S(T) and H(T) − H(0)",
  Form: EntropyForm,
  View: EntropyView,
  summary: (e) => {
    const k = e.entropy.temperatureK.length - 1;
    if (k < 0) return null;
    return `S(${num(e.entropy.temperatureK[k], 3)} K) = ${compact(e.entropy.values[k]! * 1e3, e.entropy.stdErrors ? e.entropy.stdErrors[k]! * 1e3 : null)} mJ mol⁻¹ K⁻¹ · H − H(0) = ${compact(e.enthalpy.values[k]! * 1e3, e.enthalpy.stdErrors ? e.enthalpy.stdErrors[k]! * 1e3 : null)} mJ mol⁻¹ (${BASIS_LABEL[e.basis]})`;
  },
  typesetSummary: true,
};
