/**
 * BCS weak-coupling reference values (Bardeen, Cooper & Schrieffer, Phys. Rev. 108, 1175
 * (1957)), analytic and from the gap equation solved numerically.
 *
 * Reduced units k_B = T_c = 1. Gap equation with the cutoff taken to infinity (weak coupling),
 * written against its own value at T_c so that the coupling drops out:
 *   G(Δ, T) = ∫₀^∞ [tanh(E/2T)/E − tanh(ξ/2)/ξ] dξ = 0,  E = √(ξ² + Δ²).
 * Jump: ΔC = N(0)(−dΔ²/dT)|_{T_c} and γ = (2π²/3) N(0) k_B², so ΔC/(γT_c) = 3(−dΔ²/dT)/(2π²),
 * which near T_c (Δ² ≈ (8π²/7ζ(3))(1 − T)) gives 12/(7ζ(3)).
 */
import { invalid } from "../errors";

/** Apéry's constant ζ(3) by Euler–Maclaurin: Σ_{n≤N} n⁻³ + 1/(2N²) − 1/(2N³) + 1/(4N⁴), N = 200. */
export function zeta3(): number {
  const N = 200;
  let s = 0;
  for (let n = N; n >= 1; n--) s += 1 / (n * n * n);
  return s + 1 / (2 * N * N) - 1 / (2 * N ** 3) + 1 / (4 * N ** 4);
}

/** Analytic BCS jump ΔC/(γ_n T_c) = 12/(7ζ(3)) ≈ 1.426. */
export const BCS_JUMP_RATIO = 12 / (7 * zeta3());

/** Analytic BCS Δ(0)/(k_B T_c) = π e^{−γ_Euler} ≈ 1.764 (γ_Euler = 0.5772156649…). */
export const BCS_GAP_RATIO = Math.PI * Math.exp(-0.5772156649015329);

const XI_MAX = 80; // × max(1, T, Δ): tanh(ξ/2T) is 1 to ~1e-34 beyond; the −Δ²/(2ξ³) tail is added analytically
const INTERVALS = 8000;

/** G(Δ, T) as above; > 0 for Δ below the gap at T, < 0 above (decreasing in Δ). */
export function gapEquationResidual(delta: number, temperature: number): number {
  const upper = XI_MAX * Math.max(1, temperature, delta);
  const f = (xi: number) => {
    const e = Math.sqrt(xi * xi + delta * delta);
    const first = e === 0 ? 1 / (2 * temperature) : Math.tanh(e / (2 * temperature)) / e;
    const second = xi === 0 ? 0.5 : Math.tanh(xi / 2) / xi;
    return first - second;
  };
  const h = upper / INTERVALS;
  let sum = f(0) + f(upper);
  for (let i = 1; i < INTERVALS; i++) sum += (i % 2 ? 4 : 2) * f(i * h);
  return (sum * h) / 3 - (delta * delta) / (4 * upper * upper);
}

/**
 * The BCS gap Δ(T)/k_BT_c at reduced temperature t = T/T_c ∈ (0, 1), by bisection on
 * G(Δ, t) (60 halvings of [0, 3]). Throws InputError outside (0, 1).
 */
export function bcsGap(t: number): number {
  if (!(t > 0 && t < 1)) throw invalid("reduced temperature", t, "must be in (0, 1)");
  let lo = 0;
  let hi = 3;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (gapEquationResidual(mid, t) > 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * ΔC/(γT_c) from the numerical gap: −dΔ²/dt at t = 1 by Richardson extrapolation of
 * Δ²(1−ε)/ε and Δ²(1−2ε)/(2ε) (ε = 0.002), then 3(−dΔ²/dt)/(2π²). Agrees with 12/(7ζ(3))
 * to about 1e-4 (truncation in ε²).
 */
export function bcsJumpRatioFromGapEquation(epsilon = 0.002): number {
  const d1 = bcsGap(1 - epsilon) ** 2;
  const d2 = bcsGap(1 - 2 * epsilon) ** 2;
  const slope = (4 * d1 - d2) / (2 * epsilon);
  return (3 * slope) / (2 * Math.PI ** 2);
}
