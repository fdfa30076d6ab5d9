/**
 * A synthetic notebook chain for the chart tests (INVENTED DATA): C = γT + βT³ with
 * γ = 4.1 mJ mol⁻¹ K⁻² and β = 0.055 mJ mol⁻¹ K⁻⁴ (a transition-metal-like magnitude, common
 * practice), 1.8–12 K, 1 % σ and seeded Gaussian noise, computed by the real engine chain
 * (data → normalise → fit with scan).
 */
import { computeChain, type ChainContext, type StepSpec } from "@/lib/engine/notebook";
import type { FitStepResult } from "@/lib/charts/notebook";

export const GAMMA = 4.1e-3; // J mol⁻¹ K⁻²
export const BETA = 0.055e-3; // J mol⁻¹ K⁻⁴

/** Park–Miller generator with Box–Muller: deterministic normal deviates. */
export function normals(seed: number): () => number {
  let s = seed;
  const u = () => (s = (s * 48271) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

export function syntheticContext(n = 70): ChainContext {
  const next = normals(12345);
  const T = Array.from({ length: n }, (_, i) => 1.8 + (i * (12 - 1.8)) / (n - 1));
  const C = T.map((t) => GAMMA * t + BETA * t ** 3);
  const sigma = C.map((c) => 0.01 * c);
  return {
    sample: { id: "s1", label: "synthetic", formula: "Nb", molarMassGPerMol: 92.906, atomsPerFormulaUnit: 1, massMg: null, densityGPerCm3: null, valences: {} },
    measurements: { m1: { id: "m1", label: "synthetic 0 T", kind: "sample", basis: "molar", fieldT: 0, sha256: "x", temperatureK: T, heatCapacity: C.map((c, i) => c + sigma[i]! * next()), sigma } },
  };
}

export function syntheticFit(config: Record<string, unknown> = {}): FitStepResult {
  const steps: StepSpec[] = [
    { id: "d", kind: "data", config: { measurementIds: ["m1"] } },
    { id: "n", kind: "normalise", config: {} },
    { id: "f", kind: "fit", config: { model: "sommerfeld", tMinK: 1.8, tMaxK: 6, scan: true, ...config } },
  ];
  const out = computeChain(steps, syntheticContext());
  const fit = out[2]!;
  if (!fit.ok) throw new Error(`fixture fit failed: ${fit.error}`);
  return fit.result as FitStepResult;
}
