"use client";
/** Lattice views: effective Θ_D(T) and C/T³ against T (engine: lib/engine/notebook/steps/lattice.ts). */
import { useCallback, useState } from "react";
import { thetaPlot, ratioPlot, latticeCsv } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { NumField } from "../fields";
import { BASIS_LABEL, num } from "../display";
import { Sym } from "../../Sym";
import { formatCount } from "@/lib/display";
import { FitStepSelect, n, q, type FormProps, type StepUi, type ViewProps } from "./ui";

function LatticeForm(p: FormProps<"lattice">) {
  return (
    <>
      <FitStepSelect label="γ (subtracted as γT) from" field="fitStepId" step={p.step} ctx={p.ctx} value={p.draft.fitStepId} onChange={(v) => p.set({ fitStepId: v })} />
      <NumField name="tMinK" label="From temperature" unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} hint="empty: from the lowest point" />
    </>
  );
}

function LatticeView({ result: r }: ViewProps<"lattice">) {
  const [log, setLog] = useState(true);
  const [withTotal, setWithTotal] = useState(false);
  const buildTheta = useCallback((width: number) => thetaPlot(r, { width, log }), [r, log]);
  const buildRatio = useCallback((width: number) => ratioPlot(r, { width, log, withTotal }), [r, log, withTotal]);
  const toggle = <label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic T axis</label>;
  return (
    <div className="nb-result">
      <div className="nb-two">
        <ChartBox title={<>Effective Debye temperature <Sym m="Θ_D(T)" /></>} name="lattice-theta-d" label="Effective Debye temperature against temperature" build={buildTheta} csv={() => latticeCsv(r)} controls={toggle} testId="lattice-theta" />
        <ChartBox title={<><Sym m="C/T^3" /> against T</>} name="lattice-c-over-t3" label="C over T cubed against temperature" build={buildRatio} csv={() => latticeCsv(r)} testId="lattice-ratio"
          controls={<label className="checkbox"><input type="checkbox" checked={withTotal} onChange={(e) => setWithTotal(e.target.checked)} /> Also C/T³ with the electronic part</label>} />
      </div>
      <p className="small muted">
        Lattice part C − γT with γ = {q(r.gamma, 1e3)} mJ mol⁻¹ K⁻² from the fit above, inverted through the Debye function ({formatCount(r.r, "atom")} per formula unit counted) at each of {formatCount(r.points, "point")}, {BASIS_LABEL[r.basis]}.
        {r.lowTemperatureThetaDK !== null && <> Dashed line: <Sym m="Θ_D" /> = {num(r.lowTemperatureThetaDK, 4)} K from the fit’s β.</>}
        {" "}{r.note}
        {r.peak ? <> (C − γT)/T³ peaks at {num(r.peak.temperatureK, 3)} K inside the range: a lone Einstein mode would have <Sym m="Θ_E" /> ≈ 4.928·T_peak ≈ {num(4.928 * r.peak.temperatureK, 3)} K (where x⁵eˣ/(eˣ − 1)² is largest, x = Θ_E/T; the Debye background moves the peak).</> : <> (C − γT)/T³ has no maximum inside the range.</>}
      </p>
    </div>
  );
}

export const latticeUi: StepUi<"lattice"> = {
  hint: "effective Θ_D(T) and C/T³ over a wide range",
  Form: LatticeForm,
  View: LatticeView,
  summary: (r) => {
    const th = r.curve.thetaDK.filter((v): v is number => v !== null);
    const range = th.length ? `Θ_D(T) from ${num(Math.min(...th), 3)} to ${num(Math.max(...th), 3)} K` : "no effective Θ_D in range";
    return `${range}${r.peak ? ` · (C − γT)/T³ peaks at ${num(r.peak.temperatureK, 3)} K` : ""} · ${formatCount(r.points, "point")}`;
  },
  typesetSummary: true,
};
