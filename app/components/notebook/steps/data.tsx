"use client";
/** Data step: which measurements, the temperature range, points left out by hand (engine: lib/engine/notebook/steps/data.ts). */
import { NumField } from "../fields";
import { BASIS_LABEL, num } from "../display";
import { DataView } from "../DataView";
import { formatCount, formatRange } from "@/lib/display";
import { n, useFault, type FormProps, type StepUi } from "./ui";

function DataForm(p: FormProps<"data">) {
  const chosen = new Set((p.draft.measurementIds as string[] | undefined) ?? []);
  const excluded = (p.draft.excluded as { measurementId: string; index: number; reason: string }[] | undefined) ?? [];
  const mine = p.ctx.measurements.filter((m) => m.kind === "sample");
  const label = new Map(p.ctx.measurements.map((m) => [m.id, m.label]));
  const fault = useFault("measurementIds");
  return (
    <>
      <fieldset className={`wide nb-fieldset${fault ? " nb-fault" : ""}`}>
        <legend>Measurements of this sample</legend>
        {fault && <p className="field-error" data-testid="field-fault">{fault}</p>}
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
      <NumField name="tMinK" label="Lowest temperature" unit="K" value={n(p.draft.tMinK)} onChange={(v) => p.set({ tMinK: v })} hint="empty: from the first point" />
      <NumField name="tMaxK" label="Highest temperature" unit="K" value={n(p.draft.tMaxK)} onChange={(v) => p.set({ tMaxK: v })} hint="empty: to the last point" />
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

export const dataUi: StepUi<"data"> = {
  hint: "choose measurements, range, points left out",
  Form: DataForm,
  View: ({ step, ctx, save }) => <DataView step={step} ctx={ctx} save={save} />,
  summary: (r) => `${formatCount(r.points, "point")}, ${formatRange(r.tMinK, r.tMaxK, "K")}, ${num(r.fieldT)} T · ${r.measurements.map((m) => m.label).join(", ")}${r.excluded.length ? ` · ${formatCount(r.excluded.length, "point")} left out by hand` : ""} · ${BASIS_LABEL[r.basis] ?? r.basis}`,
  typesetSummary: false,
};
