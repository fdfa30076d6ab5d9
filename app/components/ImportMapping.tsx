"use client";
/** Column roles, units and the measurement's own facts, pre-filled from the server's guesses. */
import { FIELD_UNITS, matchUnit, TEMPERATURE_UNITS } from "@/app/_lib/importChoices";
import type { Preview } from "./ImportPanel";

export interface MappingState {
  temperature: string;
  heatCapacity: string;
  sigma: string;
  field: string;
  tUnit: string;
  cUnit: string;
  fUnit: string;
  kind: "sample" | "addenda";
  label: string;
  fieldT: string;
  notes: string;
  /** σ of each point as a percentage of C when no σ column is chosen; "" = unweighted (no σ stored). */
  sigmaPercent: string;
}

const idx = (g: { index: number } | null) => (g ? String(g.index) : "");

export function initialMapping(p: Preview, heatCapacityUnits: string[]): MappingState {
  const unitOf = (g: { index: number } | null) => (g ? p.columns[g.index]?.unitText ?? null : null);
  return {
    temperature: idx(p.guesses.temperature),
    heatCapacity: idx(p.guesses.heatCapacity),
    sigma: idx(p.guesses.sigma),
    field: idx(p.guesses.field),
    tUnit: matchUnit(unitOf(p.guesses.temperature), TEMPERATURE_UNITS) ?? "K",
    cUnit: matchUnit(unitOf(p.guesses.heatCapacity), heatCapacityUnits) ?? "",
    fUnit: matchUnit(unitOf(p.guesses.field), FIELD_UNITS) ?? "T",
    kind: /addend|empty|background/i.test(p.fileName) ? "addenda" : "sample",
    label: p.fileName.replace(/\.[A-Za-z0-9]{1,5}$/, ""),
    fieldT: "0",
    notes: "",
    sigmaPercent: "",
  };
}

/** The `options` JSON of the store request, or a message saying what is missing. */
export function mappingPayload(m: MappingState): Record<string, unknown> | string {
  if (m.temperature === "") return "choose the temperature column";
  if (m.heatCapacity === "") return "choose the heat-capacity column";
  const used = [m.temperature, m.heatCapacity, m.sigma, m.field].filter((x) => x !== "");
  if (new Set(used).size !== used.length) return "each column can have only one role";
  if (!m.cUnit) return "choose the heat-capacity unit";
  const fieldT = m.fieldT.trim() === "" ? 0 : Number(m.fieldT.trim().replace(",", "."));
  if (!Number.isFinite(fieldT)) return `field in tesla is not a number: "${m.fieldT}"`;
  const sigmaPercent = m.sigma === "" && m.sigmaPercent.trim() !== "" ? Number(m.sigmaPercent.trim().replace(",", ".")) : undefined;
  if (sigmaPercent !== undefined && !(sigmaPercent > 0 && sigmaPercent <= 100)) return `relative σ must be a percentage above 0 and at most 100: "${m.sigmaPercent}"`;
  return {
    kind: m.kind,
    ...(sigmaPercent !== undefined ? { sigmaPercent } : {}),
    label: m.label,
    fieldT,
    notes: m.notes,
    mapping: {
      temperature: Number(m.temperature),
      heatCapacity: Number(m.heatCapacity),
      ...(m.sigma !== "" ? { sigma: Number(m.sigma) } : {}),
      ...(m.field !== "" ? { field: Number(m.field) } : {}),
    },
    units: { temperature: m.tUnit, heatCapacity: m.cUnit, ...(m.field !== "" ? { field: m.fUnit } : {}) },
  };
}

export function ImportMapping({ preview, state, onChange, heatCapacityUnits, batch = false }: {
  preview: Preview;
  state: MappingState;
  onChange: (s: MappingState) => void;
  heatCapacityUnits: string[];
  /** Several files share this mapping: labels are set per file in the file list, not here. */
  batch?: boolean;
}) {
  const set = (patch: Partial<MappingState>) => onChange({ ...state, ...patch });
  const columnSelect = (id: string, label: string, key: "temperature" | "heatCapacity" | "sigma" | "field", optional: boolean) => {
    const guess = preview.guesses[key];
    return (
      <div className="field">
        <label htmlFor={id}>{label}</label>
        <select id={id} value={state[key]} onChange={(e) => set({ [key]: e.target.value })}>
          <option value="">{optional ? "none" : "choose…"}</option>
          {preview.columns.map((c) => (
            <option key={c.index} value={String(c.index)}>
              {c.index + 1}: {c.name || "(no name)"}{c.unitText ? ` [${c.unitText}]` : ""}
            </option>
          ))}
        </select>
        {guess && <span className="hint">guessed from {guess.reason}</span>}
      </div>
    );
  };
  return (
    <div className="grid-form" data-testid="import-mapping">
      {columnSelect("map-temperature", "Temperature column", "temperature", false)}
      <div className="field">
        <label htmlFor="unit-temperature">Temperature unit</label>
        <select id="unit-temperature" value={state.tUnit} onChange={(e) => set({ tUnit: e.target.value })}>
          {TEMPERATURE_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
        </select>
      </div>
      {columnSelect("map-heat-capacity", "Heat capacity column", "heatCapacity", false)}
      <div className="field">
        <label htmlFor="unit-heat-capacity">Heat capacity unit</label>
        <select id="unit-heat-capacity" value={state.cUnit} onChange={(e) => set({ cUnit: e.target.value })} aria-invalid={state.cUnit ? undefined : true}>
          {!state.cUnit && <option value="">choose…</option>}
          {heatCapacityUnits.map((u) => <option key={u} value={u}>{u}</option>)}
        </select>
        <span className="hint">σ, if given, is read in the same unit.</span>
      </div>
      {columnSelect("map-sigma", "σ column (optional)", "sigma", true)}
      <div className="field">
        <label htmlFor="sigma-percent">σ when there is no σ column (% of C)</label>
        <input id="sigma-percent" type="text" inputMode="decimal" placeholder="none: unweighted" value={state.sigmaPercent}
          disabled={state.sigma !== ""} onChange={(e) => set({ sigmaPercent: e.target.value })} />
        <span className="hint">{state.sigma !== "" ? "σ is read from its column." : "Empty: no σ is stored and fits are unweighted; e.g. 0.5 stores σ = 0.5 % of C."}</span>
      </div>
      {columnSelect("map-field", "Field column (optional)", "field", true)}
      <div className="field">
        <label htmlFor="unit-field">Field column unit</label>
        <select id="unit-field" value={state.fUnit} onChange={(e) => set({ fUnit: e.target.value })} disabled={state.field === ""}>
          {FIELD_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
        </select>
      </div>
      <div className="field">
        <label htmlFor="import-kind">Kind</label>
        <select id="import-kind" value={state.kind} onChange={(e) => set({ kind: e.target.value as "sample" | "addenda" })}>
          <option value="sample">sample</option>
          <option value="addenda">addenda (empty platform + grease)</option>
        </select>
      </div>
      {!batch && (
        <div className="field">
          <label htmlFor="import-label">Measurement label</label>
          <input id="import-label" type="text" value={state.label} onChange={(e) => set({ label: e.target.value })} />
        </div>
      )}
      <div className="field">
        <label htmlFor="import-field-t">Applied field (T)</label>
        <input id="import-field-t" type="text" inputMode="decimal" value={state.fieldT} onChange={(e) => set({ fieldT: e.target.value })} />
      </div>
      <div className="field wide">
        <label htmlFor="import-notes">Measurement notes</label>
        <textarea id="import-notes" value={state.notes} onChange={(e) => set({ notes: e.target.value })} />
      </div>
    </div>
  );
}
