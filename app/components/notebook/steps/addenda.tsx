"use client";
/** Addenda step: subtract the empty-platform curve (engine: lib/engine/notebook/steps/addenda.ts). */
import { useCallback, useState } from "react";
import { addendaPlot, addendaCsv } from "@/lib/charts/notebook";
import { ChartBox } from "../ChartBox";
import { NumField, SelectField } from "../fields";
import { num } from "../display";
import { formatCount } from "@/lib/display";
import { n, type FormProps, type StepUi, type ViewProps } from "./ui";

function AddendaForm(p: FormProps<"addenda">) {
  const options = p.ctx.measurements.filter((m) => m.kind === "addenda").map((m) => ({ value: m.id, label: `${m.label} (${num(m.tMinK, 3)}–${num(m.tMaxK, 3)} K)` }));
  const value = String(p.draft.addendaMeasurementId ?? "");
  return (
    <>
      <SelectField name="addendaMeasurementId" label="Addenda measurement" value={value} options={[...(options.some((o) => o.value === value) ? [] : [{ value, label: value ? "(not available)" : "— choose —" }]), ...options]} onChange={(v) => p.set({ addendaMeasurementId: v })} />
      <SelectField name="method" label="Onto the sample temperatures by" value={String(p.draft.method ?? "smooth") as "smooth" | "linear"} options={[{ value: "smooth", label: "smoothing polynomial in log T" }, { value: "linear", label: "linear interpolation" }]} onChange={(v) => p.set({ method: v })} />
      <NumField name="smoothingDegree" label="Polynomial degree" value={n(p.draft.smoothingDegree)} onChange={(v) => p.set({ smoothingDegree: v })} hint="empty: chosen by AICc" />
      <SelectField name="outsideRange" label="Sample points outside the addenda range" value={String(p.draft.outsideRange ?? "flag") as "flag" | "refuse"} options={[{ value: "flag", label: "leave out and list them" }, { value: "refuse", label: "refuse the step" }]} onChange={(v) => p.set({ outsideRange: v })} />
    </>
  );
}

function AddendaView({ result: r }: ViewProps<"addenda">) {
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

export const addendaUi: StepUi<"addenda"> = {
  hint: "subtract the empty-platform curve",
  Form: AddendaForm,
  View: AddendaView,
  summary: (a) => `${a.addendaLabel} · ${a.method === "smooth" ? "smoothed" : "interpolated"} · addenda at most ${num(a.maxAddendaFraction * 100, 2)} % of the total`,
  typesetSummary: false,
};
