"use client";
/**
 * The configuration form of each step kind. It edits a draft of the step's stored configuration
 * (the server's zod schema fills defaults and says what is wrong); nothing here validates physics.
 */
import { CheckField, NumField, SelectField, TextField, pairsText, parsePairs } from "./fields";
import { KIND_LABEL, num } from "./display";
import type { NotebookContext, StepView } from "./types";
import { Sym } from "../Sym";
import { modelLabel, plainSymbol } from "@/lib/display";
import type { ReactNode } from "react";

export type Draft = Record<string, unknown>;

interface Props {
  step: StepView;
  draft: Draft;
  set: (patch: Draft) => void;
  ctx: NotebookContext;
}

const n = (v: unknown) => (typeof v === "number" ? v : null);

function fitStepsAbove(ctx: NotebookContext, step: StepView) {
  return ctx.steps.filter((s) => s.kind === "fit" && s.position < step.position).map((s, i) => ({ value: s.id, label: s.title || `Fit ${i + 1}: ${plainSymbol(modelLabel(String((s.config as { model?: string }).model ?? "sommerfeld")))}` }));
}

function FitStepSelect({ label, field, props }: { label: ReactNode; field: string; props: Props }) {
  const options = [{ value: "", label: "the nearest fit above" }, ...fitStepsAbove(props.ctx, props.step)];
  return <SelectField label={label} value={String(props.draft[field] ?? "")} options={options} onChange={(v) => props.set({ [field]: v || null })} />;
}

function DataForm(p: Props) {
  const chosen = new Set((p.draft.measurementIds as string[] | undefined) ?? []);
  const excluded = (p.draft.excluded as { measurementId: string; index: number; reason: string }[] | undefined) ?? [];
  const mine = p.ctx.measurements.filter((m) => m.kind === "sample");
  const label = new Map(p.ctx.measurements.map((m) => [m.id, m.label]));
  return (
    <>
      <fieldset className="wide nb-fieldset">
        <legend>Measurements of this sample</legend>
        {mine.length === 0 && <p className="muted">This sample has no measurements yet.</p>}
        {mine.map((m) => (
          <label key={m.id} className="checkbox">
            <input type="checkbox" checked={chosen.has(m.id)} onChange={(e) => {
              const next = new Set(chosen);
              if (e.target.checked) next.add(m.id); else next.delete(m.id);
              p.set({ measurementIds: [...next] });
            }} />
            {m.label} <span className="muted small">({num(m.fieldT)} T, {m.pointCount} points, {num(m.tMinK, 3)}–{num(m.tMaxK, 3)} K)</span>
          </label>
        ))}
      </fieldset>
      <NumField label="Lowest temperature" unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} hint="empty: from the first point" />
      <NumField label="Highest temperature" unit="K" value={n(p.draft.tMaxK)} onChange={(v) => p.set({ tMaxK: v })} hint="empty: to the last point" />
      <div className="wide">
        <div className="label">Points left out by hand</div>
        {excluded.length === 0 ? <p className="muted small">None. Click a point on the data chart to leave it out.</p> : (
          <table className="nb-compact"><thead><tr><th>Measurement</th><th className="num">Point</th><th>Reason</th><th /></tr></thead>
            <tbody>{excluded.map((e, k) => (
              <tr key={`${e.measurementId}:${e.index}`}>
                <td>{label.get(e.measurementId) ?? e.measurementId}</td>
                <td className="num">{e.index + 1}</td>
                <td><input type="text" aria-label={`Reason for point ${e.index + 1}`} value={e.reason} onChange={(ev) => p.set({ excluded: excluded.map((x, j) => (j === k ? { ...x, reason: ev.target.value } : x)) })} /></td>
                <td><button type="button" className="quiet small" onClick={() => p.set({ excluded: excluded.filter((_, j) => j !== k) })}>Put back</button></td>
              </tr>
            ))}</tbody></table>
        )}
      </div>
    </>
  );
}

function AddendaForm(p: Props) {
  const options = p.ctx.measurements.filter((m) => m.kind === "addenda").map((m) => ({ value: m.id, label: `${m.label} (${num(m.tMinK, 3)}–${num(m.tMaxK, 3)} K)` }));
  const value = String(p.draft.addendaMeasurementId ?? "");
  return (
    <>
      <SelectField label="Addenda measurement" value={value} options={[...(options.some((o) => o.value === value) ? [] : [{ value, label: value ? "(not available)" : "— choose —" }]), ...options]} onChange={(v) => p.set({ addendaMeasurementId: v })} />
      <SelectField label="Onto the sample temperatures by" value={String(p.draft.method ?? "smooth") as "smooth" | "linear"} options={[{ value: "smooth", label: "smoothing polynomial in log T" }, { value: "linear", label: "linear interpolation" }]} onChange={(v) => p.set({ method: v })} />
      <NumField label="Polynomial degree" value={n(p.draft.smoothingDegree)} onChange={(v) => p.set({ smoothingDegree: v })} hint="empty: chosen by AICc" />
      <SelectField label="Sample points outside the addenda range" value={String(p.draft.outsideRange ?? "flag") as "flag" | "refuse"} options={[{ value: "flag", label: "leave out and list them" }, { value: "refuse", label: "refuse the step" }]} onChange={(v) => p.set({ outsideRange: v })} />
    </>
  );
}

function NormaliseForm(p: Props) {
  return (
    <>
      <SelectField label="Per" value={String(p.draft.per ?? "formula-unit") as "formula-unit" | "atom"} options={[{ value: "formula-unit", label: "mole formula unit" }, { value: "atom", label: "mole of atoms" }]} onChange={(v) => p.set({ per: v })} />
      <NumField label="Sample mass for this analysis" unit="mg" value={n(p.draft.massMg)} onChange={(v) => p.set({ massMg: v })} hint="empty: the mass on the sample record" />
    </>
  );
}

function FitForm(p: Props) {
  const model = String(p.draft.model ?? "sommerfeld");
  const weighting = String(p.draft.weighting ?? "sigma") as "sigma" | "none" | "relative" | "absolute";
  const absoluteSI = n(p.draft.absoluteSigmaSI);
  // shown in mJ mol⁻¹ K⁻¹, stored in SI; rounded so that 0.1 mJ does not read 0.00010000000000000002
  const absoluteMJ = absoluteSI === null ? null : Number((absoluteSI * 1e3).toPrecision(12));
  const compare = new Set((p.draft.compare as string[] | undefined) ?? []);
  const options = [...p.ctx.models.map((m) => ({ value: m.name, label: `${m.title}` })), { value: "expression", label: "my own expression of T" }];
  return (
    <>
      <SelectField label="Model" value={model} options={options} onChange={(v) => p.set({ model: v })} testId="fit-model" />
      {model === "expression" && (
        <TextField wide mono label="C(T) in J mol⁻¹ K⁻¹" value={String(p.draft.expression ?? "")} onChange={(v) => p.set({ expression: v })} placeholder="g*T + b*T^3" testId="fit-expression"
          hint="Any letters other than T are fitted parameters, in SI (g in J mol⁻¹ K⁻², b in J mol⁻¹ K⁻⁴). Operators + − * / ^, exp, log, sqrt." />
      )}
      {model !== "expression" && <p className="wide small muted nb-formula">{p.ctx.models.find((m) => m.name === model)?.formula}</p>}
      <NumField label={<>Window from <Sym m="T_min" /></>} unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} testId="fit-tmin" hint="or drag across the C/T vs T² chart" />
      <NumField label={<>Window to <Sym m="T_max" /></>} unit="K" value={n(p.draft.tMaxK)} onChange={(v) => p.set({ tMaxK: v })} testId="fit-tmax" />
      <SelectField label="Weights" value={weighting} testId="fit-weighting"
        options={[{ value: "sigma", label: "1/σ² from the data's σ" }, { value: "none", label: "equal (unweighted)" }, { value: "relative", label: "assumed σ = p % of C" }, { value: "absolute", label: "assumed σ, the same for every point" }]}
        onChange={(v) => p.set({ weighting: v })} hint={weighting === "none" ? "no χ²/dof: the residual standard deviation is shown" : undefined} />
      {weighting === "relative" && <NumField label="σ as a share of C" unit="%" value={n(p.draft.relativeSigmaPercent)} onChange={(v) => p.set({ relativeSigmaPercent: v })} required testId="fit-relative-sigma" />}
      {weighting === "absolute" && <NumField label="σ of every point" unit="mJ mol⁻¹ K⁻¹" value={absoluteMJ} onChange={(v) => p.set({ absoluteSigmaSI: v === null ? null : v * 1e-3 })} required testId="fit-absolute-sigma" />}
      <CheckField label="Recommend model and window" checked={Boolean(p.draft.recommend)} onChange={(v) => p.set({ recommend: v })}
        hint="γT + βT³, + δT⁵, + A/T², + two-level Schottky and the model above, on every window inside the window above; γ and β then carry a systematic σ" />
      <CheckField label={<>Scale standard errors by √<Sym m="χ²_red" /></>} checked={Boolean(p.draft.scaleErrors)} onChange={(v) => p.set({ scaleErrors: v })} hint="for σ that are only relative" />
      <CheckField label={<>Scan windows (γ against <Sym m="T_min" />, <Sym m="T_max" />)</>} checked={Boolean(p.draft.scan)} onChange={(v) => p.set({ scan: v })} hint="registry models only" />
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

function measuredField(p: Props, field: string, label: string, unit: string) {
  const v = p.draft[field] as { value: number; stdError: number | null } | null | undefined;
  return (
    <>
      <NumField label={label} unit={unit} value={v?.value ?? null} onChange={(x) => p.set({ [field]: x === null ? null : { ...(v ?? { stdError: null }), value: x } })} />
      <NumField label={`σ of ${label.split(" ")[0]}`} unit={unit} value={v?.stdError ?? null} onChange={(x) => p.set({ [field]: v ? { ...v, stdError: x } : null })} />
    </>
  );
}

function DeriveForm(p: Props) {
  const chi = p.draft.chi as { value: number; stdError: number | null; unit: "m3/mol" | "emu/mol" } | null | undefined;
  return (
    <>
      <FitStepSelect label="γ and β from" field="fitStepId" props={p} />
      <SelectField label="Show per" value={String(p.draft.basis ?? "formula-unit") as "formula-unit" | "atom"} options={[{ value: "formula-unit", label: "mole formula unit" }, { value: "atom", label: "mole of atoms" }]} onChange={(v) => p.set({ basis: v })} />
      <NumField label="Density override" unit="g cm⁻³" value={n(p.draft.densityGPerCm3)} onChange={(v) => p.set({ densityGPerCm3: v })} hint="empty: the sample's density" />
      <TextField label="Valence overrides (El=z)" value={pairsText(p.draft.valences as Record<string, number>)} onChange={(v) => p.set({ valences: parsePairs(v) })} placeholder="Nb=5, Mo=6" mono />
      {measuredField(p, "gammaBandMJ", "γ_band (band structure)", "mJ mol⁻¹ K⁻² per f.u.")}
      <NumField label="μ* (Coulomb pseudopotential)" value={n(p.draft.muStar)} onChange={(v) => p.set({ muStar: v })} hint="for McMillan’s Tc, e.g. 0.13" />
      <NumField label={<>Measured <Sym m="T_c" /></>} unit="K" value={n(p.draft.tcK)} onChange={(v) => p.set({ tcK: v })} />
      <NumField label="χ (Pauli susceptibility)" value={chi?.value ?? null} onChange={(x) => p.set({ chi: x === null ? null : { stdError: null, unit: "m3/mol", ...(chi ?? {}), value: x } })} />
      <NumField label="σ of χ" value={chi?.stdError ?? null} onChange={(x) => p.set({ chi: chi ? { ...chi, stdError: x } : null })} />
      <SelectField label="Unit of χ" value={chi?.unit ?? "m3/mol"} options={[{ value: "m3/mol", label: "m³ mol⁻¹ (SI)" }, { value: "emu/mol", label: "emu mol⁻¹ (cgs)" }]} onChange={(u) => p.set({ chi: chi ? { ...chi, unit: u } : null })} />
      {measuredField(p, "kwA", "A (resistivity T² coefficient)", "μΩ cm K⁻²")}
    </>
  );
}

function TransitionForm(p: Props) {
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
      <FitStepSelect label={<>Normal-state <Sym m="γ_n" /> and β from</>} field="normalFitStepId" props={p} />
      <SelectField label="That normal state was measured" value={String(p.draft.normalState ?? "above-tc") as "above-tc" | "field-above-hc2"} options={[{ value: "above-tc", label: "above Tc, in zero field" }, { value: "field-above-hc2", label: "in a field above Hc2" }]} onChange={(v) => p.set({ normalState: v })} />
      <NumField label="Construction from" unit="K" value={w.tLowK ?? null} onChange={(v) => setW({ tLowK: v })} hint="empty: found from the jump" />
      <NumField label="Construction to" unit="K" value={w.tHighK ?? null} onChange={(v) => setW({ tHighK: v })} />
    </>
  );
}

function NoteForm(p: Props) {
  return (
    <div className="field wide">
      <label htmlFor={`note-${p.step.id}`}>Text (Markdown: **bold**, *italic*, lists, tables, links)</label>
      <textarea id={`note-${p.step.id}`} rows={6} value={String(p.draft.markdown ?? "")} onChange={(e) => p.set({ markdown: e.target.value })} />
    </div>
  );
}

/** The form body for a step's kind. */
export function StepForm(props: Props) {
  switch (props.step.kind) {
    case "data": return <DataForm {...props} />;
    case "addenda": return <AddendaForm {...props} />;
    case "normalise": return <NormaliseForm {...props} />;
    case "fit": return <FitForm {...props} />;
    case "derive": return <DeriveForm {...props} />;
    case "transition": return <TransitionForm {...props} />;
    case "entropy": return <FitStepSelect label={<>Low-temperature part (0 → <Sym m="T_min" />) from</>} field="fitStepId" props={props} />;
    case "note": return <NoteForm {...props} />;
    default: return <p className="muted">No settings for {KIND_LABEL[props.step.kind] ?? props.step.kind}.</p>;
  }
}
