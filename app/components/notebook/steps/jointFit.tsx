"use client";
/** Joint fit across fields (engine: lib/engine/notebook/steps/jointFit.ts). */
import { useCallback, useState } from "react";
import { jointPlot, jointResidualPlot, jointCsv } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { CheckField, NumField, SelectField, TextField } from "../fields";
import { BASIS_LABEL, compact, num, unitText } from "../display";
import { Sym } from "../../Sym";
import { formatCount, formatRange, symbolOf } from "@/lib/display";
import type { ModelInfo, NotebookContext, StepView } from "../types";
import { n, useFault, type FormProps, type StepUi, type ViewProps } from "./ui";

type JointResult = ViewProps<"joint-fit">["result"];

/** "A=0, g#2=2.1" ⇄ {A: 0, "g#2": 2.1}: keys are parameter names, per measurement with #k. */
function pairsText(record: Record<string, number> | null | undefined): string {
  return Object.entries(record ?? {}).map(([k, v]) => `${k}=${v}`).join(", ");
}
function parseKeyed(text: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const part of text.split(/[,;]/)) {
    const m = /^\s*([A-Za-z_]\w*(?:#\d+)?)\s*[=:]\s*(-?[\d.eE+-]+)\s*$/.exec(part);
    if (m && Number.isFinite(Number(m[2]))) out[m[1]!] = Number(m[2]);
  }
  return out;
}

function modelOf(ctx: NotebookContext, name: string): ModelInfo | undefined {
  return ctx.jointModels.find((m) => m.name === name) ?? ctx.models.find((m) => m.name === name);
}

/** Display factor, unit and symbol of a parameter of the joint fit's model (SI and its own name for expressions). */
function display(ctx: NotebookContext, model: string, name: string, siUnit: string) {
  const spec = modelOf(ctx, model)?.parameters.find((p) => p.name === name);
  if (spec) return { factor: spec.displayFactor, unit: unitText(spec.displayUnit), symbol: spec.symbol ?? symbolOf(name) };
  return { factor: 1, unit: unitText(siUnit), symbol: name };
}

/** The measurements of the nearest data step above (those the joint fit will see). */
function measurementsAbove(ctx: NotebookContext, step: StepView) {
  const data = ctx.steps.filter((s) => s.kind === "data" && s.position < step.position).at(-1);
  const ids = ((data?.config as { measurementIds?: string[] } | undefined)?.measurementIds ?? []);
  return ids.map((id) => ctx.measurements.find((m) => m.id === id)).filter((m) => !!m);
}

function SharedChoice({ p, model }: { p: FormProps<"joint-fit">; model: ModelInfo | undefined }) {
  const fault = useFault("shared");
  if (!model) {
    return <TextField name="shared" label="Shared parameters (names, comma-separated)" value={(p.draft.shared ?? []).join(", ")} mono placeholder="g, b"
      onChange={(v) => p.set({ shared: v.split(/[,\s]+/).filter(Boolean) })} hint="every other letter of the expression is fitted per measurement" />;
  }
  const current = new Set(p.draft.shared ?? model.parameters.filter((q) => q.defaultShared ?? ["gamma", "beta", "delta", "epsilon"].includes(q.name)).map((q) => q.name));
  return (
    <fieldset className={`wide nb-fieldset${fault ? " nb-fault" : ""}`}>
      <legend>Shared by every measurement (the others are fitted per measurement)</legend>
      {model.parameters.map((q) => (
        <label key={q.name} className="checkbox nb-inline-check">
          <input type="checkbox" name={`shared-${q.name}`} checked={current.has(q.name)} onChange={(e) => {
            const next = new Set(current);
            if (e.target.checked) next.add(q.name); else next.delete(q.name);
            p.set({ shared: [...next] });
          }} /> <span><Sym m={q.symbol ?? symbolOf(q.name)} /></span>
        </label>
      ))}
      {fault && <p className="field-error">{fault}</p>}
    </fieldset>
  );
}

function JointFitForm(p: FormProps<"joint-fit">) {
  const model = String(p.draft.model ?? "normal-state");
  const info = model === "expression" ? undefined : modelOf(p.ctx, model);
  const windows = p.draft.windows ?? {};
  const ms = measurementsAbove(p.ctx, p.step);
  const setWindow = (id: string, patch: { tMinK?: number | null; tMaxK?: number | null }) => {
    const merged = { tMinK: windows[id]?.tMinK ?? null, tMaxK: windows[id]?.tMaxK ?? null, ...patch };
    const next = { ...windows };
    if (merged.tMinK === null && merged.tMaxK === null) delete next[id]; else next[id] = merged;
    p.set({ windows: next });
  };
  const options = [
    ...p.ctx.jointModels.map((m) => ({ value: m.name, label: m.title })),
    ...p.ctx.models.map((m) => ({ value: m.name, label: `${m.title} (one curve's model)` })),
    { value: "expression", label: "my own expression of T and H" },
  ];
  return (
    <>
      <SelectField wide name="model" label="Model" value={model} options={options} onChange={(v) => p.set({ model: v, shared: null })} testId="joint-model" />
      {model === "expression" ? (
        <TextField name="expression" wide mono label="C(T, H) in J mol⁻¹ K⁻¹" value={String(p.draft.expression ?? "")} onChange={(v) => p.set({ expression: v })} placeholder="g*T + b*T^3 + a*H^2/T^2" testId="joint-expression"
          hint="T in K, H in tesla; R, kB, muB, NA are the CODATA 2018 constants (SI). Other letters are fitted parameters, in SI." />
      ) : <p className="wide small muted nb-formula">{info?.formula}</p>}
      <SharedChoice p={p} model={info} />
      <NumField name="tMinK" label={<>Window from <Sym m="T_min" /></>} unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} hint="every measurement, unless set below" />
      <NumField name="tMaxK" label={<>Window to <Sym m="T_max" /></>} unit="K" value={n(p.draft.tMaxK)} onChange={(v) => p.set({ tMaxK: v })} />
      {ms.length > 0 && (
        <div className="wide">
          <div className="label">Windows of single measurements (K; empty: the window above)</div>
          <table className="nb-compact"><thead><tr><th>Measurement</th><th className="num">Field</th><th>From</th><th>To</th></tr></thead>
            <tbody>{ms.map((m, k) => (
              <tr key={m!.id}>
                <td>{k + 1}. {m!.label}</td>
                <td className="num">{num(m!.fieldT)} T</td>
                <td><input type="text" inputMode="decimal" aria-label={`Window from, ${m!.label}`} defaultValue={windows[m!.id]?.tMinK ?? ""} onChange={(e) => { const v = e.target.value.trim(); setWindow(m!.id, { tMinK: v === "" ? null : Number(v) }); }} /></td>
                <td><input type="text" inputMode="decimal" aria-label={`Window to, ${m!.label}`} defaultValue={windows[m!.id]?.tMaxK ?? ""} onChange={(e) => { const v = e.target.value.trim(); setWindow(m!.id, { tMaxK: v === "" ? null : Number(v) }); }} /></td>
              </tr>
            ))}</tbody></table>
        </div>
      )}
      <TextField name="fixed" label="Held fixed (name=value or name#k=value, SI)" value={pairsText(p.draft.fixed)} onChange={(v) => p.set({ fixed: parseKeyed(v) })} placeholder="g=2" mono />
      <TextField name="start" label="Starting values (optional, SI)" value={pairsText(p.draft.start)} onChange={(v) => p.set({ start: parseKeyed(v) })} placeholder="empty: found by a search" mono />
      <CheckField name="scaleErrors" label={<>Scale standard errors by √<Sym m="χ²_red" /></>} checked={Boolean(p.draft.scaleErrors)} onChange={(v) => p.set({ scaleErrors: v })} />
    </>
  );
}

function ParamCell({ v, f }: { v: { value: number; stdError: number | null } | undefined; f: { factor: number } }) {
  return <td className="num">{v ? compact(v.value * f.factor, v.stdError === null ? null : v.stdError * f.factor) : "—"}</td>;
}

function JointFitView({ result: r, ctx }: ViewProps<"joint-fit">) {
  const [log, setLog] = useState(false);
  const build = useCallback((width: number) => jointPlot(r, { width, log }), [r, log]);
  const buildRes = useCallback((width: number) => jointResidualPlot(r, { width, log }), [r, log]);
  const fit = r.fit;
  const shared = fit.parameters.filter((q) => q.measurement === null);
  const per = fit.perMeasurement;
  const d = (name: string, unit: string) => ({ ...display(ctx, fit.model, name, unit), symbol: r.symbols?.[name] ?? name });
  const unitOf = (name: string) => fit.parameters.find((q) => q.name === name)?.unit ?? "1";
  return (
    <div className="nb-result">
      <ChartBox title={<><Sym m="C/T" /> of every measurement with the joint fit</>} name="joint-fit" label="Joint fit across fields" build={build} csv={() => jointCsv(r)} testId="joint-chart"
        controls={<label className="checkbox"><input type="checkbox" checked={log} onChange={(e) => setLog(e.target.checked)} /> Logarithmic T axis</label>} />
      <ChartBox title="Residuals in the windows, per field" name="joint-residuals" label="Residuals of the joint fit" build={buildRes} csv={() => jointCsv(r)} />
      {shared.length > 0 && (
        <table className="nb-compact" data-testid="joint-shared">
          <caption>Shared by every measurement</caption>
          <thead><tr><th>Parameter</th><th className="num">Value(σ)</th><th>Unit</th><th>Note</th></tr></thead>
          <tbody>{shared.map((q) => {
            const f = d(q.name, q.unit);
            return <tr key={q.key}><td><Sym m={f.symbol} /></td><ParamCell v={q} f={f} /><td className="nb-unit">{f.unit}</td><td className="small muted">{q.fixed ? "held fixed" : q.atBound ? "at a bound" : ""}</td></tr>;
          })}</tbody>
        </table>
      )}
      <table className="nb-compact" data-testid="joint-per-field">
        <caption>Per measurement</caption>
        <thead><tr><th>#</th><th>Measurement</th><th className="num">H (T)</th><th>Window</th><th className="num">Points</th><th className="num">χ²</th>
          {per.map((name) => { const f = d(name, unitOf(name)); return <th key={name} className="num"><Sym m={f.symbol} />{f.unit ? <span className="muted small"> ({f.unit})</span> : null}</th>; })}</tr></thead>
        <tbody>{fit.measurements.map((m) => (
          <tr key={m.index}>
            <td>{m.index}</td><td>{m.label}</td><td className="num">{num(m.fieldT)}</td><td>{formatRange(m.window.tMinK, m.window.tMaxK, "K")}</td><td className="num">{m.window.nPoints}</td><td className="num">{num(m.chiSquare, 4)}</td>
            {per.map((name) => <ParamCell key={name} v={m.parameters[name]} f={d(name, unitOf(name))} />)}
          </tr>
        ))}</tbody>
      </table>
      <p className="small muted">
        {fit.title}: {formatCount(fit.measurements.length, "measurement")}, {formatCount(fit.nPoints, "point")} in the windows, {BASIS_LABEL[r.basis]}.
        {" "}χ² = {num(fit.chiSquare, 5)} on {fit.dof} degrees of freedom{fit.reducedChiSquare !== null ? <>, <Sym m="χ²_red" /> = {num(fit.reducedChiSquare, 4)}</> : null}{fit.aicc !== null ? `, AICc = ${num(fit.aicc, 6)}` : ""}.
        {" "}{fit.weighted ? "Weighted by the data’s σ." : "Unweighted: standard errors scaled by the residual variance."}{fit.errorsScaledByReducedChiSquare && fit.weighted ? <> Errors scaled by √<Sym m="χ²_red" />.</> : null}
        {" "}Standard errors and correlations from the joint covariance.{!fit.converged ? ` Not converged: ${fit.message}.` : ""}
        {r.handsDownFit ? " γ and β are shared: the steps below can use them as a fit." : ""}
      </p>
    </div>
  );
}

function summary(r: JointResult): string {
  const fit = r.fit;
  const parts: string[] = [];
  const p = (k: string) => fit.parameters.find((q) => q.key === k);
  const g = p("gamma"), b = p("beta");
  if (g) parts.push(`γ = ${compact(g.value * 1e3, g.stdError === null ? null : g.stdError * 1e3)} mJ mol⁻¹ K⁻²`);
  if (b) parts.push(`β = ${compact(b.value * 1e3, b.stdError === null ? null : b.stdError * 1e3)} mJ mol⁻¹ K⁻⁴`);
  if (fit.perMeasurement.length) parts.push(`per field: ${fit.perMeasurement.map((n) => r.symbols?.[n] ?? n).join(", ")}`);
  const fields = fit.measurements.map((m) => m.fieldT);
  parts.push(`${formatCount(fit.measurements.length, "measurement")} in ${num(Math.min(...fields))}–${num(Math.max(...fields))} T, ${formatCount(fit.nPoints, "point")}`);
  if (fit.weighted && fit.reducedChiSquare !== null) parts.push(`χ²_red = ${num(fit.reducedChiSquare, 3)}`);
  return `${parts.join(" · ")} (${BASIS_LABEL[r.basis]})`;
}

export const jointFitUi: StepUi<"joint-fit"> = {
  hint: "several fields at once, parameters shared or per field",
  Form: JointFitForm,
  View: JointFitView,
  summary,
  typesetSummary: true,
};
