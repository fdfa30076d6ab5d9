/**
 * The Debye lattice heat capacity and its companions.
 *
 * C_D(T) = 9 r R (T/Θ_D)³ ∫₀^{Θ_D/T} x⁴eˣ/(eˣ−1)² dx  [J mol⁻¹ K⁻¹ per mole formula unit,
 * r atoms per formula unit]. Integrating by parts, with y = Θ_D/T,
 *   C_D/(3rR) = 4·D₃(y) − 3y/(e^y − 1),   D₃(y) = (3/y³) ∫₀^y x³/(eˣ−1) dx,
 * and ∫₀^y x³/(eˣ−1) dx is evaluated by 20-point Gauss–Legendre for y ≤ 2 (integrand
 * analytic, nearest singularity at 2πi: error far below 1 ulp) and for y > 2 as
 * π⁴/15 − Σ_k e^{−ky}(y³/k + 3y²/k² + 6y/k³ + 6/k⁴) (exponentially convergent).
 * Relative accuracy ≈ 1e-14 over all y. Low-T limit: C_D → (12π⁴/5) r R (T/Θ_D)³;
 * high-T limit: C_D → 3rR (Dulong–Petit). Reference: Debye, Ann. Phys. 39 (1912) 789;
 * Abramowitz & Stegun 27.1.
 */
import { GAS_CONSTANT_J_PER_MOL_K as R } from "../constants";
import { integrateGauss } from "./quadrature";

const PI4_15 = Math.PI ** 4 / 15;

/** ∫₀^y x³/(eˣ−1) dx for y ≥ 0. */
export function debyeIntegral3(y: number): number {
  if (!(y >= 0)) return NaN;
  if (y === Infinity) return PI4_15;
  if (y <= 2) return integrateGauss((x) => (x === 0 ? 0 : (x * x * x) / Math.expm1(x)), 0, y, 20);
  const kMax = y > 40 ? 1 : Math.ceil(40 / y) + 1;
  const e1 = Math.exp(-y);
  let ek = 1;
  let tail = 0;
  for (let k = 1; k <= kMax; k++) {
    ek *= e1;
    const ik = 1 / k;
    tail += ek * ik * (y * y * y + ik * (3 * y * y + ik * (6 * y + 6 * ik)));
  }
  return PI4_15 - tail;
}

/** The Debye function D₃(y) = (3/y³) ∫₀^y x³/(eˣ−1) dx (D₃(0) = 1). */
export function debyeD3(y: number): number {
  if (y === 0) return 1;
  if (y === Infinity) return 0;
  return (3 * debyeIntegral3(y)) / (y * y * y);
}

/** Normalised Debye heat capacity C_D/(3rR) as a function of y = Θ_D/T. */
export function debyeReducedHeatCapacity(y: number): number {
  if (y === 0) return 1;
  if (y === Infinity) return 0;
  if (y > 1e5) return (4 * Math.PI ** 4) / (5 * y * y * y);
  const tail = y > 745 ? 0 : (3 * y) / Math.expm1(y);
  return 4 * debyeD3(y) - tail;
}

/** C_D(T) in J mol⁻¹ K⁻¹ for Debye temperature Θ_D [K], r atoms per formula unit. */
export function debyeHeatCapacity(temperatureK: number, thetaDK: number, r = 1): number {
  if (temperatureK === 0) return 0;
  return 3 * r * R * debyeReducedHeatCapacity(thetaDK / temperatureK);
}

/**
 * ∂C_D/∂Θ_D [J mol⁻¹ K⁻²]: with y = Θ_D/T, dC/dy = −3C/y + 9rR y e^y/(e^y−1)², divided by T.
 */
export function debyeHeatCapacityDThetaD(temperatureK: number, thetaDK: number, r = 1): number {
  const y = thetaDK / temperatureK;
  if (!(y > 0) || y > 700) return y > 700 ? (-3 * debyeHeatCapacity(temperatureK, thetaDK, r)) / thetaDK : NaN;
  const c = debyeHeatCapacity(temperatureK, thetaDK, r);
  const em1 = Math.expm1(y);
  const dcdy = (-3 * c) / y + (9 * r * R * y * (em1 + 1)) / (em1 * em1);
  return dcdy / temperatureK;
}

/**
 * Relative deviation of the T³ law from the full Debye function at reduced temperature
 * t = T/Θ_D: (C_T³ − C_D)/C_D with C_T³ = (12π⁴/5) r R t³. Positive: the T³ law
 * overestimates. Used to warn when a pure Sommerfeld window reaches too high.
 */
export function t3LawDeviation(reducedTemperature: number): number {
  const y = 1 / reducedTemperature;
  const exact = debyeReducedHeatCapacity(y);
  const t3 = (4 * Math.PI ** 4) / (5 * y * y * y);
  return (t3 - exact) / exact;
}
