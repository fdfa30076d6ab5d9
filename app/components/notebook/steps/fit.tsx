"use client";
/** Fit step: a model over a temperature window (engine: lib/engine/notebook/steps/fit.ts). */
import { useState } from "react";
import { CheckField, NumField, SelectField, TextField, pairsText, parsePairs } from "../fields";
import { BASIS_LABEL, compact, num, unitText } from "../display";
import { FitView } from "../FitView";
import { JobsPanel } from "@/app/components/jobs/JobsPanel";
import { Sym } from "../../Sym";
import { formatCount, formatRange, symbolOf } from "@/lib/display";
import { formatStatSyst } from "@/lib/engine/scan/statSyst";
import type { FitStepResult } from "@/lib/charts/notebook";
import { n, type FormProps, type StepUi, type ViewProps } from "./ui";

function FitForm(p: FormProps<"fit">) {
  const model = String(p.draft.model ?? "sommerfeld");
  const weighting = String(p.draft.weighting ?? "sigma") as "sigma" | "none" | "relative" | "absolute";
  const absoluteSI = n(p.draft.absoluteSigmaSI);
  // shown in mJ mol⁻¹ K⁻¹, stored in SI; rounded so that 0.1 mJ does not read 0.00010000000000000002
  const absoluteMJ = absoluteSI === null ? null : Number((absoluteSI * 1e3).toPrecision(12));
  const compare = new Set((p.draft.compare as string[] | undefined) ?? []);
  const options = [...p.ctx.models.map((m) => ({ value: m.name, label: `${m.title}` })), { value: "expression", label: "my own expression of T" }];
  return (
    <>
      <SelectField name="model" label="Model" value={model} options={options} onChange={(v) => p.set({ model: v })} testId="fit-model" />
      {model === "expression" && (
        <TextField name="expression" wide mono label="C(T) in J mol⁻¹ K⁻¹" value={String(p.draft.expression ?? "")} onChange={(v) => p.set({ expression: v })} placeholder="g*T + b*T^3" testId="fit-expression"
          hint="Any letters other than T are fitted parameters, in SI (g in J mol⁻¹ K⁻², b in J mol⁻¹ K⁻⁴). Operators + − * / ^, exp, log, sqrt." />
      )}
      {model !== "expression" && <p className="wide small muted nb-formula">{p.ctx.models.find((m) => m.name === model)?.formula}</p>}
      <NumField name="tMinK" label={<>Window from <Sym m="T_min" /></>} unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} testId="fit-tmin" hint="or drag across the C/T vs T² chart" />
      <NumField name="tMaxK" label={<>Window to <Sym m="T_max" /></>} unit="K" value={n(p.draft.tMaxK)} onChange={(v) => p.set({ tMaxK: v })} testId="fit-tmax" />
      <SelectField name="weighting" label="Weights" value={weighting} testId="fit-weighting"
        options={[{ value: "sigma", label: "1/σ² from the data's σ" }, { value: "none", label: "equal (unweighted)" }, { value: "relative", label: "assumed σ = p % of C" }, { value: "absolute", label: "assumed σ, the same for every point" }]}
        onChange={(v) => p.set({ weighting: v })} hint={weighting === "none" ? "no χ²/dof: the residual standard deviation is shown" : undefined} />
      {weighting === "relative" && <NumField name="relativeSigmaPercent" label="σ as a share of C" unit="%" value={n(p.draft.relativeSigmaPercent)} onChange={(v) => p.set({ relativeSigmaPercent: v })} required testId="fit-relative-sigma" />}
      {weighting === "absolute" && <NumField name="absoluteSigmaSI" label="σ of every point" unit="mJ mol⁻¹ K⁻¹" value={absoluteMJ} onChange={(v) => p.set({ absoluteSigmaSI: v === null ? null : v * 1e-3 })} required testId="fit-absolute-sigma" />}
      <CheckField name="recommend" label="Recommend model and window" checked={Boolean(p.draft.recommend)} onChange={(v) => p.set({ recommend: v })}
        hint="γT + βT³, + δT⁵, + A/T², + two-level Schottky and the model above, on every window inside the window above; γ and β then carry a systematic σ" />
      <CheckField name="scaleErrors" label={<>Scale standard errors by √<Sym m="χ²_red" /></>} checked={Boolean(p.draft.scaleErrors)} onChange={(v) => p.set({ scaleErrors: v })} hint="for σ that are only relative" />
      <CheckField name="scan" label={<>Scan windows (γ against <Sym m="T_min" />, <Sym m="T_max" />)</>} checked={Boolean(p.draft.scan)} onChange={(v) => p.set({ scan: v })} hint="registry models only" />
      <TextField label="Held fixed (name=value, SI)" value={pairsText(p.draft.fixed as Record<string, number>)} onChange={(v) => p.set({ fixed: parsePairs(v) })} placeholder="A=0" mono />
      <fieldset className="wide nb-fieldset">
        <legend>Compare on the same window (AICc, BIC)</legend>
        {p.ctx.models.map((m) => (
          <label key={m.name} className="checkbox nb-inline-check">
            <input type="checkbox" checked={compare.has(m.name)} onChange={(e) => {
              const next = new Set(compare);
              if (e.target.checked) next.add(m.name); else next.delete(m.name);
              p.set({ compare: [...next].slice(0, 8) });
            }} /> {m.name}
          </label>
        ))}
      </fieldset>
    </>
  );
}

function FitStepView({ step, result, ctx, save }: ViewProps<"fit">) {
  const [jobsOpen, setJobsOpen] = useState(false);
  return (
    <>
      <FitView step={step} result={result} ctx={ctx} save={save} />
      {ctx.editable && (
        <details className="nb-jobs" onToggle={(e) => setJobsOpen(e.currentTarget.open)}>
          <summary>Large window scan in the background (a job with progress; the page stays usable)</summary>
          {jobsOpen && <JobsPanel slug={ctx.slug} analysisId={ctx.analysisId} fitStepId={step.id} />}
        </details>
      )}
    </>
  );
}

const q = (v: { value: number; stdError: number | null } | null | undefined, k = 1) => (v ? compact(v.value * k, v.stdError === null ? null : v.stdError * k) : "—");
/** value(stat)(syst) when a systematic σ is known (a recommended fit), else value(σ). */
const qs = (v: { value: number; stdError: number | null } | null | undefined, syst: number | null | undefined, k = 1) =>
  v && typeof syst === "number" ? `${formatStatSyst(v.value * k, v.stdError === null ? null : v.stdError * k, syst * k)}` : q(v, k);

/** `userModel`: parameters of a user expression are shown by the names the user gave them, not the registry's symbols. */
function fit(r: FitStepResult, userModel = false): string {
  const p = (name: string) => r.fit.parameters.find((x) => x.name === name);
  const g = p("gamma"), b = p("beta");
  const parts: string[] = [];
  const rec = r.recommendation?.recommended ? r.recommendation : null;
  if (g) parts.push(`γ = ${qs(g, rec?.gammaSystematicError, 1e3)} mJ mol⁻¹ K⁻²`);
  if (b) parts.push(`β = ${qs(b, rec?.betaSystematicError, 1e3)} mJ mol⁻¹ K⁻⁴`);
  if (rec) parts.push("(stat)(syst), recommended model and window");
  if (!g && !b) parts.push(r.fit.parameters.slice(0, 3).map((x) => `${userModel ? x.name : symbolOf(x.name)} = ${q(x)}${x.unit ? ` ${unitText(x.unit)}` : ""}`).join(" · "));
  parts.push(`${formatCount(r.window.nPoints, "point")} in ${formatRange(r.window.tMinK, r.window.tMaxK, "K")}`);
  const sigmaKnown = r.weighting?.sigmaKnown ?? r.fit.weighted;
  if (sigmaKnown && r.fit.reducedChiSquare !== null) parts.push(`χ²_red = ${num(r.fit.reducedChiSquare, 3)}`);
  if (!sigmaKnown && r.quality?.residualStdDev != null) parts.push(`residual s.d. ${num(r.quality.residualStdDev * 1e3, 3)} mJ mol⁻¹ K⁻¹`);
  return `${parts.join(" · ")} (${BASIS_LABEL[r.basis]})`;
}

export const fitUi: StepUi<"fit"> = {
  hint: "a model over a temperature window",
  Form: FitForm,
  View: FitStepView,
  summary: (r, step) => fit(r, (step.config as { model?: string }).model === "expression"),
  typesetSummary: true,
};
