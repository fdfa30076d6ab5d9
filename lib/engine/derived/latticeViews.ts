/**
 * Two views of the lattice heat capacity over a wide temperature range.
 *
 * Effective Debye temperature Θ_D(T): at each temperature, the Θ for which the Debye function
 * gives the measured lattice part C_lat = C − γT,
 *   9 r R (T/Θ)³ ∫₀^{Θ/T} x⁴eˣ/(eˣ−1)² dx = C_lat(T)            (Debye, Ann. Phys. 39 (1912) 789).
 * A pure Debye solid gives a constant; dispersion and soft modes make Θ_D(T) dip, typically
 * at T ≈ Θ_D/10–Θ_D/5. C_D is strictly decreasing in Θ from 3rR (Θ → 0) to 0, so a lattice part
 * in (0, 3rR) has exactly one Θ; outside it there is none (the point says why).
 * σ: first-order propagation, σ_Θ = √(σ_C² + T²σ_γ²) / |∂C_D/∂Θ|. The γ part is the same
 * error at every temperature (fully correlated between points): the result says so.
 *
 * C/T³ against T: the lattice part over T³ is flat (12π⁴rR/5Θ_D³) at low T for a Debye solid,
 * and an Einstein-like (localised) mode shows as a peak near T ≈ Θ_E/5.
 *
 * Units: temperature K, heat capacity J mol⁻¹ K⁻¹ per mole formula unit, γ J mol⁻¹ K⁻².
 */
import { invalid } from "../errors";
import { debyeHeatCapacity, debyeHeatCapacityDThetaD } from "../models/debyeFunction";
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";

export interface LatticeInput {
  temperatureK: readonly number[];
  /** Molar heat capacity, J mol⁻¹ K⁻¹ per mole formula unit. */
  heatCapacity: readonly number[];
  /** Standard error of each C (same unit), or null. */
  sigma: readonly number[] | null;
  /** Sommerfeld coefficient γ in J mol⁻¹ K⁻² with its standard error (null: taken as exact). */
  gamma: { value: number; stdError: number | null };
  /** Atoms per formula unit (default 1). */
  r?: number;
}

export interface ThetaPoint {
  temperatureK: number;
  /** Effective Debye temperature in K, or null where C − γT is outside (0, 3rR). */
  thetaDK: number | null;
  stdErrorK: number | null;
  /** Why thetaDK is null. */
  note?: string;
}

export interface RatioPoint {
  temperatureK: number;
  /** C/T³ in J mol⁻¹ K⁻⁴. */
  totalOverT3: number;
  /** (C − γT)/T³ in J mol⁻¹ K⁻⁴. */
  latticeOverT3: number;
  /** Standard error of latticeOverT3 (σ_C and T σ_γ combined), or null. */
  stdError: number | null;
}

function check(input: LatticeInput): number {
  const n = input.temperatureK.length;
  if (input.heatCapacity.length !== n) throw invalid("heatCapacity", `${input.heatCapacity.length} values`, `temperatureK has ${n}`);
  if (input.sigma && input.sigma.length !== n) throw invalid("sigma", `${input.sigma.length} values`, `temperatureK has ${n}`);
  const r = input.r ?? 1;
  if (!(r > 0) || !Number.isFinite(r)) throw invalid("r", r, "atoms per formula unit must be > 0");
  if (!Number.isFinite(input.gamma.value)) throw invalid("gamma", input.gamma.value, "must be finite");
  for (const t of input.temperatureK) if (!(t > 0) || !Number.isFinite(t)) throw invalid("temperatureK", t, "must be finite and > 0");
  return r;
}

/** Θ with debyeHeatCapacity(T, Θ, r) = cLat, for 0 < cLat < 3rR: bisection in ln Θ, then Newton. */
export function invertDebye(temperatureK: number, cLat: number, r = 1): number {
  const top = 3 * r * R;
  if (!(cLat > 0 && cLat < top)) throw invalid("lattice heat capacity", cLat, `a Debye temperature exists only for 0 < C < 3rR = ${top.toPrecision(6)} J mol⁻¹ K⁻¹`);
  let lo = Math.log(temperatureK * 1e-4), hi = Math.log(temperatureK * 1e5);
  for (let i = 0; i < 200 && hi - lo > 1e-13; i++) {
    const mid = 0.5 * (lo + hi);
    if (debyeHeatCapacity(temperatureK, Math.exp(mid), r) > cLat) lo = mid; else hi = mid;
  }
  let theta = Math.exp(0.5 * (lo + hi));
  for (let i = 0; i < 3; i++) {
    const d = debyeHeatCapacityDThetaD(temperatureK, theta, r);
    if (!(d < 0)) break;
    const step = (debyeHeatCapacity(temperatureK, theta, r) - cLat) / d;
    if (!Number.isFinite(step) || Math.abs(step) > 0.01 * theta) break;
    theta -= step;
  }
  return theta;
}

/** Θ_D(T) at every point (see the module comment). Throws InputError on bad input. */
export function effectiveDebyeTemperature(input: LatticeInput): { points: ThetaPoint[]; note: string } {
  const r = check(input);
  const sg = input.gamma.stdError ?? 0;
  const points = input.temperatureK.map((t, i): ThetaPoint => {
    const cLat = input.heatCapacity[i]! - input.gamma.value * t;
    if (!(cLat > 0)) return { temperatureK: t, thetaDK: null, stdErrorK: null, note: "C − γT ≤ 0: no lattice part left (γ too large, or noise at the lowest temperatures)" };
    if (!(cLat < 3 * r * R)) return { temperatureK: t, thetaDK: null, stdErrorK: null, note: "C − γT ≥ 3rR (above the Dulong–Petit limit): not a Debye lattice" };
    const theta = invertDebye(t, cLat, r);
    const sC = input.sigma ? input.sigma[i]! : 0;
    const sLat = Math.hypot(sC, t * sg);
    const d = Math.abs(debyeHeatCapacityDThetaD(t, theta, r));
    return { temperatureK: t, thetaDK: theta, stdErrorK: input.sigma || input.gamma.stdError ? sLat / d : null };
  });
  return { points, note: "σ(Θ_D) combines σ(C) and T·σ(γ); the γ part is common to all temperatures (fully correlated)." };
}

/** C/T³ and (C − γT)/T³ against T (see the module comment). Throws InputError on bad input. */
export function latticeOverT3(input: LatticeInput): RatioPoint[] {
  check(input);
  const sg = input.gamma.stdError ?? 0;
  return input.temperatureK.map((t, i) => {
    const c = input.heatCapacity[i]!;
    const t3 = t * t * t;
    const sC = input.sigma ? input.sigma[i]! : 0;
    return {
      temperatureK: t, totalOverT3: c / t3, latticeOverT3: (c - input.gamma.value * t) / t3,
      stdError: input.sigma || input.gamma.stdError ? Math.hypot(sC, t * sg) / t3 : null,
    };
  });
}
