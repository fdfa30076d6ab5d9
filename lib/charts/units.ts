/**
 * Display units of heat capacity for charts. Measurements store C in SI per their `basis`
 * (lib/engine/units/convert.ts): "sample" J/K, "molar" J/(mol K), "specific" J/(kg K).
 * Charts show C and C/T in the units a low-temperature calorimetrist reads (γ in
 * mJ mol⁻¹ K⁻², per the product brief); these are display factors only.
 */

export type Basis = "sample" | "molar" | "specific";

export interface DisplayUnit {
  /** Multiply the stored SI value by this to get the displayed number. */
  factor: number;
  /** Unit text for axis labels, e.g. "J mol⁻¹ K⁻¹". */
  label: string;
}

/** Extensive heat capacity: the largest prefix step that keeps the biggest |C| at or above 1. */
const SAMPLE_STEPS: { factor: number; prefix: string }[] = [
  { factor: 1, prefix: "" },
  { factor: 1e3, prefix: "m" },
  { factor: 1e6, prefix: "µ" },
  { factor: 1e9, prefix: "n" },
];

function samplePrefix(maxAbsSI: number): { factor: number; prefix: string } {
  for (const step of SAMPLE_STEPS) if (maxAbsSI * step.factor >= 1) return step;
  return SAMPLE_STEPS[SAMPLE_STEPS.length - 1]!;
}

/**
 * Unit of C on charts. molar → J mol⁻¹ K⁻¹; specific → J g⁻¹ K⁻¹ (factor 1e-3 from J kg⁻¹ K⁻¹);
 * sample → J K⁻¹ with a prefix (m, µ, n) chosen from `maxAbsSI`, the largest |C| in J/K.
 */
export function heatCapacityUnit(basis: Basis, maxAbsSI = 1): DisplayUnit {
  if (basis === "molar") return { factor: 1, label: "J mol⁻¹ K⁻¹" };
  if (basis === "specific") return { factor: 1e-3, label: "J g⁻¹ K⁻¹" };
  const { factor, prefix } = samplePrefix(maxAbsSI);
  return { factor, label: `${prefix}J K⁻¹` };
}

/**
 * Unit of C/T on charts: molar → mJ mol⁻¹ K⁻² (the unit of γ); specific → mJ g⁻¹ K⁻²;
 * sample → J K⁻² with a prefix chosen from `maxAbsSI`, the largest |C/T| in J/K².
 */
export function heatCapacityOverTUnit(basis: Basis, maxAbsSI = 1): DisplayUnit {
  if (basis === "molar") return { factor: 1e3, label: "mJ mol⁻¹ K⁻²" };
  if (basis === "specific") return { factor: 1, label: "mJ g⁻¹ K⁻²" };
  const { factor, prefix } = samplePrefix(maxAbsSI);
  return { factor, label: `${prefix}J K⁻²` };
}

/** Largest absolute finite value, 0 for none. */
export function maxAbs(values: readonly number[]): number {
  let m = 0;
  for (const v of values) if (Number.isFinite(v) && Math.abs(v) > m) m = Math.abs(v);
  return m;
}
