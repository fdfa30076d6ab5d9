/**
 * One vocabulary for display: every key the engine and server define has an entry (found by
 * iterating the registries and the source, so a new key without an entry fails here), and no
 * entry reads as a key.
 */
import { describe, it, expect } from "vitest";
import { MODELS } from "@/lib/engine/models";
import { STEP_ORDER } from "@/lib/engine/notebook/registry";
import { TRANSITIONS } from "@/lib/server/review/states";
import {
  QUANTITIES, PARAMETERS, MODEL_LABELS, STEP_KINDS, REVISION_STATES, REVIEW_ACTIONS, ACTIVITY_ACTIONS,
  activityLabel, modelLabel, plainSymbolOf, stateLabel, stepKindLabel, symbolOf, term,
} from "@/lib/display";
import { auditActions, denyList, quantityKeys } from "../helpers/internalKeys";

const labels = (table: Readonly<Record<string, { label: string; symbol?: string }>>) => Object.values(table).flatMap((t) => [t.label, t.symbol ?? ""]);

describe("vocabulary coverage", () => {
  it("QUANTITIES has an entry for every quantity the engine builds", () => {
    const keys = quantityKeys();
    expect(keys.length).toBeGreaterThan(20);
    expect(keys.filter((k) => !Object.hasOwn(QUANTITIES, k))).toEqual([]);
  });

  it("every model parameter spec carries a symbol and a label, and PARAMETERS lists them", () => {
    for (const m of Object.values(MODELS))
      for (const p of m.parameters) {
        expect(p.symbol, `${m.name}.${p.name}`).toMatch(/\S/);
        expect(p.label, `${m.name}.${p.name}`).toMatch(/\S/);
        expect(p.symbol).not.toBe(p.name.length > 1 ? p.name : "");
        expect(PARAMETERS[p.name]).toBeDefined();
      }
  });

  it("MODEL_LABELS names every registered model and the user expression", () => {
    expect(Object.keys(MODELS).filter((k) => !Object.hasOwn(MODEL_LABELS, k))).toEqual([]);
    expect(modelLabel("sommerfeld")).toBe("Sommerfeld–Debye (γT + βT³)");
    expect(modelLabel("expression")).toBe("user-defined expression");
  });

  it("STEP_KINDS, REVISION_STATES and REVIEW_ACTIONS cover the engine's step kinds and the review table", () => {
    expect(STEP_ORDER.filter((k) => !Object.hasOwn(STEP_KINDS, k))).toEqual([]);
    const states = new Set(TRANSITIONS.flatMap((t) => [t.from, t.to]).concat(["replaced"]));
    expect([...states].filter((s) => !Object.hasOwn(REVISION_STATES, s))).toEqual([]);
    expect(TRANSITIONS.map((t) => t.action).filter((a) => !Object.hasOwn(REVIEW_ACTIONS, a))).toEqual([]);
  });

  it("ACTIVITY_ACTIONS has a phrase for every audit action the server records", () => {
    const actions = auditActions();
    expect(actions).toContain("revision.replace");
    expect(actions.filter((a) => !Object.hasOwn(ACTIVITY_ACTIONS, a))).toEqual([]);
  });

  it("no display entry contains an internal key or an underscore-free key form", () => {
    const all = [...labels(QUANTITIES), ...labels(PARAMETERS), ...Object.values(MODEL_LABELS), ...labels(STEP_KINDS), ...labels(REVISION_STATES), ...labels(REVIEW_ACTIONS), ...labels(ACTIVITY_ACTIONS)].join(" | ");
    const hits = denyList().filter((k) => new RegExp(`(^|[^\\p{L}])${k.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}(?![\\p{L}])`, "u").test(all));
    expect(hits).toEqual([]);
  });
});

describe("vocabulary look-ups", () => {
  it("symbolOf and plainSymbolOf give the trade's symbols", () => {
    expect(symbolOf("thetaD")).toBe("Θ_D");
    expect(plainSymbolOf("thetaD")).toBe("ΘD");
    expect(plainSymbolOf("rsOverA0")).toBe("rₛ/a₀");
    expect(term("gammaN").symbol).toBe("γ_n");
  });

  it("labels of unknown keys are words, never the key itself", () => {
    expect(stepKindLabel("derive")).toBe("Derived quantities");
    expect(stateLabel("in_review")).toBe("With reviewer");
    expect(activityLabel("revision.replace")).toBe("superseded a sealed revision");
    expect(activityLabel("widget.frobnicate")).toBe("widget frobnicate");
    expect(term("someNewKey").label).toBe("some new key");
  });
});
