"use client";
/** Results of the addenda, normalisation, derived-quantity, transition and entropy steps. */
import { useCallback, useState } from "react";
import { addendaPlot, addendaCsv, transitionPlot, transitionCsv, integralPlot, entropyCsv, type AddendaStepResult, type DeriveStepResult, type EntropyStepResult, type TransitionStepResult, type Quantity } from "@/lib/charts/notebook";
import { ChartBox } from "./ChartBox";
import { BASIS_LABEL, compact, num } from "./display";
import { prettyQuantityUnit } from "./summary";
import { Sym } from "../Sym";
import { cleanText, formatCount, formatRange, modelLabel, symbolOf, term } from "@/lib/display";

export function AddendaView({ r }: { r: AddendaStepResult }) {
  const [log, setLog] = useState(true);
  const build = useCallback((width: number) => addendaPlot(r, { width, log }), [r, log]);
  return (
    <div className="nb-result">
      <ChartBox title="Total, addenda and net heat capacity of the whole sample" name="addenda" label="Addenda subtraction" build={build} csv={() => addendaCsv(r)}
        controls={<label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic axes</label>} />
      <p className="small muted">Addenda reach at most {num(r.maxAddendaFraction * 100, 2)} % of the measured total. {r.excluded.length ? `${formatCount(r.excluded.length, "sample point")} outside the addenda range ${r.excluded.length === 1 ? "was" : "were"} left out.` : ""}</p>
    </div>
  );
}

function QuantityRows({ items }: { items: readonly Quantity[] }) {
  return (
    <>{items.map((x) => (
      <tr key={x.name}>
        <td><Sym m={symbolOf(x.name)} /> <span className="muted small">{term(x.name).label}</span></td>
        <td className="num" data-testid={`quantity-${x.name}`}>{compact(x.value, x.stdError)}</td>
        <td className="nb-unit">{prettyQuantityUnit(x.unit)}</td>
        <td className="small muted">{x.note ? <Sym m={cleanText(x.note)} /> : ""}</td>
      </tr>
    ))}</>
  );
}

export function DeriveView({ r }: { r: DeriveStepResult }) {
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

export function TransitionView({ r, basis }: { r: TransitionStepResult; basis?: "formula-unit" | "atom" }) {
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

export function EntropyView({ r }: { r: EntropyStepResult }) {
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

export function NormaliseView({ r }: { r: Record<string, unknown> }) {
  return (
    <dl className="facts nb-facts">
      <dt>From</dt><dd>{BASIS_LABEL[String(r.from)] ?? String(r.from)}</dd>
      <dt>To</dt><dd>{BASIS_LABEL[String(r.per)]}</dd>
      <dt>Formula, M</dt><dd>{String(r.formula)}, {num(r.molarMassGPerMol as number, 7)} g mol⁻¹, {formatCount(Number(num(r.atomsPerFormulaUnit as number, 4)), "atom")} per formula unit</dd>
      {typeof r.moles === "number" && <><dt>Amount</dt><dd>{num(r.massMg as number, 6)} mg → {num(r.moles * 1e3, 6)} mmol formula units</dd></>}
    </dl>
  );
}
