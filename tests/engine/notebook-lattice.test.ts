/**
 * The lattice views step in a chain, on invented molar data (generated here): data → fit at low
 * T → lattice. A pure Debye solid gives a constant effective Θ_D to 6 digits; an added Einstein
 * mode shows as a peak of (C − γT)/T³ near Θ_E/4.928; a failure names the field at fault.
 */
import { describe, it, expect } from "vitest";
import { computeChain, type ChainContext, type StepSpec } from "../../lib/engine/notebook";
import { debyeHeatCapacity } from "../../lib/engine/models/debyeFunction";
import { einsteinHeatCapacity } from "../../lib/engine/models/einstein";
import type { StepResult } from "../../lib/engine/notebook/registry";

const GAMMA = 1.5e-3; // J mol⁻¹ K⁻² (invented)
const R_ATOMS = 2;

function context(c: (t: number) => number): ChainContext {
  const T = Array.from({ length: 200 }, (_, i) => 1 * 300 ** (i / 199));
  const C = T.map(c);
  return {
    sample: { id: "s", label: "test", formula: "AB", molarMassGPerMol: 100, atomsPerFormulaUnit: R_ATOMS, massMg: null, densityGPerCm3: null, valences: {} },
    measurements: { m: { id: "m", label: "wide range", kind: "sample", basis: "molar", fieldT: 0, sha256: "x", temperatureK: T, heatCapacity: C, sigma: C.map((x) => x * 1e-3) } },
  };
}

const chain = (lattice: Record<string, unknown> = {}): StepSpec[] => [
  { id: "d", kind: "data", config: { measurementIds: ["m"] } },
  { id: "f", kind: "fit", config: { model: "sommerfeld", tMaxK: 4 } },
  { id: "l", kind: "lattice", config: lattice },
];

describe("lattice views step", () => {
  it("lattice step with γ from a low-T fit gives Θ_D(T) within 0.1 % of a pure Debye solid's above 20 K", () => {
    for (const theta of [180, 320]) {
      const out = computeChain(chain(), context((t) => GAMMA * t + debyeHeatCapacity(t, theta, R_ATOMS)));
      const l = out[2]!;
      expect(l.ok, l.error ?? "").toBe(true);
      const r = l.result as StepResult<"lattice">;
      const high = r.curve.temperatureK.map((t, i) => [t, r.curve.thetaDK[i]] as const).filter(([t]) => t > 20);
      expect(high.length).toBeGreaterThan(50);
      for (const [, v] of high) expect(Math.abs(v! / theta - 1)).toBeLessThan(1e-3);
    }
  });

  it("lattice step with the exact γ reproduces Θ_D to 6 digits at every temperature", () => {
    const theta = 250;
    const ctx = context((t) => GAMMA * t + debyeHeatCapacity(t, theta, R_ATOMS));
    const out = computeChain([chain()[0]!, { id: "f", kind: "fit", config: { model: "sommerfeld", tMaxK: 4, fixed: { gamma: GAMMA } } }, chain()[2]!], ctx);
    const r = out[2]!.result as StepResult<"lattice">;
    for (const v of r.curve.thetaDK) expect(Math.abs(v! / theta - 1)).toBeLessThan(1e-6);
    expect(r.peak).toBeNull();
  });

  it("lattice step shows an Einstein mode as a peak of (C − γT)/T³ near Θ_E/4.928", () => {
    const thetaE = 60, thetaD = 300;
    const c = (t: number) => GAMMA * t + debyeHeatCapacity(t, thetaD, R_ATOMS) + 0.3 * einsteinHeatCapacity(t, thetaE, 1);
    const out = computeChain(chain({ tMinK: 2 }), context(c));
    const r = out[2]!.result as StepResult<"lattice">;
    expect(r.peak).not.toBeNull();
    // the Debye background moves the peak a little: within 15 % of the lone-mode position
    expect(Math.abs((4.928 * r.peak!.temperatureK) / thetaE - 1)).toBeLessThan(0.15);
    // and Θ_D(T) dips below the low-T value around the peak
    const lowest = Math.min(...r.curve.thetaDK.filter((v): v is number => v !== null));
    expect(lowest).toBeLessThan(0.9 * r.lowTemperatureThetaDK!);
  });

  it("lattice step without a fit above fails and names fitStepId", () => {
    const out = computeChain([chain()[0]!, chain()[2]!], context((t) => GAMMA * t + debyeHeatCapacity(t, 200, R_ATOMS)));
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.field).toBe("fitStepId");
  });

  it("a failing step's output carries the field named by its schema", () => {
    const out = computeChain([chain()[0]!, chain()[1]!, { id: "l", kind: "lattice", config: { tMinK: -3 } }], context((t) => GAMMA * t + debyeHeatCapacity(t, 200, R_ATOMS)));
    expect(out[2]!.ok).toBe(false);
    expect(out[2]!.field).toBe("tMinK");
  });

  it("a transition step without a fit names normalFitStepId, its own field", () => {
    const out = computeChain([chain()[0]!, { id: "t", kind: "transition", config: {} }], context((t) => GAMMA * t + debyeHeatCapacity(t, 200, R_ATOMS)));
    expect(out[1]!.ok).toBe(false);
    expect(out[1]!.field).toBe("normalFitStepId");
  });
});
