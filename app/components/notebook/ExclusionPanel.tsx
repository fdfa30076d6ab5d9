"use client";
/**
 * Leaving points out, by keyboard as well as by clicking the chart: choose a point (the chart's
 * click pre-selects it), say why, "Leave out". Every point left out is listed with its reason and
 * a "Put back" button, so an exclusion is always visible and can be undone.
 */
import { useEffect, useState } from "react";
import type { DataRow } from "@/lib/charts/notebook";

export interface Exclusion { measurementId: string; index: number; reason: string }

const fmtT = (t: number) => String(Number(t.toPrecision(5)));

export function ExclusionPanel({ rows, excluded, editable, picked, onExclude, onRestore }: {
  rows: readonly DataRow[];
  excluded: readonly Exclusion[];
  editable: boolean;
  /** Key "measurementId:index" of the point clicked on the chart, if any. */
  picked: string | null;
  onExclude: (e: Exclusion) => Promise<void>;
  onRestore: (e: Exclusion) => Promise<void>;
}) {
  const [choice, setChoice] = useState("");
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  useEffect(() => { if (picked) setChoice(picked); }, [picked]);
  const byKey = new Map(rows.map((r) => [`${r.measurementId}:${r.index}`, r]));
  const candidates = rows.filter((r) => r.state !== "excluded");
  const chosen = byKey.get(choice);

  async function leaveOut() {
    if (!chosen || !reason.trim()) return;
    setBusy(true);
    await onExclude({ measurementId: chosen.measurementId, index: chosen.index, reason: reason.trim() });
    setBusy(false);
    setReason("");
    setChoice("");
  }

  return (
    <div className="nb-exclusions" data-testid="exclusions">
      {editable && (
        <form className="inline-form" onSubmit={(e) => { e.preventDefault(); void leaveOut(); }}>
          <div className="field">
            <label htmlFor="exclude-point">Leave out a point</label>
            <select id="exclude-point" value={choice} onChange={(e) => setChoice(e.target.value)}>
              <option value="">choose a point…</option>
              {candidates.map((r) => (
                <option key={`${r.measurementId}:${r.index}`} value={`${r.measurementId}:${r.index}`}>
                  {r.label}, point {r.index + 1}: T = {fmtT(r.t)} K
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="exclude-reason">Why</label>
            <input id="exclude-reason" type="text" value={reason} maxLength={300} onChange={(e) => setReason(e.target.value)} placeholder="e.g. heat pulse did not relax" />
          </div>
          <button type="submit" className="small" disabled={!chosen || !reason.trim() || busy}>Leave out</button>
        </form>
      )}
      {excluded.length > 0 && (
        <>
          <h4 className="subhead">Left out ({excluded.length})</h4>
          <ul className="plain" data-testid="excluded-list">
            {excluded.map((e) => {
              const r = byKey.get(`${e.measurementId}:${e.index}`);
              return (
                <li key={`${e.measurementId}:${e.index}`}>
                  {r ? `${r.label}, point ${r.index + 1}, T = ${fmtT(r.t)} K` : `point ${e.index + 1}`}: {e.reason}
                  {editable && <> <button type="button" className="quiet small" onClick={() => void onRestore(e)}>Put back</button></>}
                </li>
              );
            })}
          </ul>
        </>
      )}
    </div>
  );
}
