/**
 * One typed unit per step kind: every kind of the engine's registry has its definition under its
 * own name, a place in the offered order, words in the display vocabulary, and a browser entry
 * (hint, view, summary). The compiler already refuses a missing entry; this test also refuses
 * an empty one, and a kind known to one registry only.
 */
import { describe, expect, it } from "vitest";
import { STEP_DEFINITIONS, STEP_ORDER } from "../../lib/engine/notebook";
import { STEP_KINDS } from "../../lib/display";
import { STEP_UI } from "../../app/components/notebook/registry";

const kinds = Object.keys(STEP_DEFINITIONS);

describe("step registries", () => {
  it("every engine kind is defined under its own name with a title, schema, dependencies and computation", () => {
    for (const k of kinds) {
      const def = STEP_DEFINITIONS[k as keyof typeof STEP_DEFINITIONS];
      expect(def.kind, k).toBe(k);
      expect(def.title.trim().length, k).toBeGreaterThan(0);
      expect(typeof def.schema.safeParse, k).toBe("function");
      expect(typeof def.dependencies, k).toBe("function");
      expect(typeof def.compute, k).toBe("function");
    }
  });
  it("STEP_ORDER offers every kind exactly once", () => {
    expect([...STEP_ORDER].sort()).toEqual([...kinds].sort());
  });
  it("the browser registry has exactly the engine's kinds, each with a hint, a view and a summary", () => {
    expect(Object.keys(STEP_UI).sort()).toEqual([...kinds].sort());
    for (const [k, ui] of Object.entries(STEP_UI)) {
      expect(ui.hint.trim().length, k).toBeGreaterThan(0);
      expect(typeof ui.View, k).toBe("function");
      expect(typeof ui.summary, k).toBe("function");
      expect(ui.Form === null || typeof ui.Form === "function", k).toBe(true);
    }
  });
  it("the display vocabulary names exactly the engine's kinds", () => {
    expect(Object.keys(STEP_KINDS).sort()).toEqual([...kinds].sort());
    for (const [k, t] of Object.entries(STEP_KINDS)) expect(t.label.trim().length, k).toBeGreaterThan(0);
  });
});
