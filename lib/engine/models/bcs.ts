/**
 * Exponential (BCS-like) superconducting electronic term plus the lattice:
 * C = γ_n T_c · a · exp(−b T_c/T) + βT³ (T < T_c), with γ_n [J mol⁻¹ K⁻²] and T_c [K]
 * held fixed (γ_n from normal-state data above T_c or above H_c2, T_c from the jump: both
 * must be given), a and b dimensionless (weak-coupling BCS at T ≪ T_c: a ≈ 8.5, b ≈ 1.44;
 * b·k_BT_c estimates the gap Δ(0)). Reference: Bardeen, Cooper & Schrieffer, Phys. Rev.
 * 108 (1957) 1175; Tinkham, Introduction to Superconductivity (2nd ed.) §3.
 */
import { BETA, param, temperatureSpan, type HeatCapacityModel, type Params } from "./types";

export const GAMMA_N = param("gammaN", "J/(mol*K^2)", "mJ/(mol*K^2)", 1e3, "normal-state Sommerfeld coefficient γ_n", [-Infinity, Infinity], "required");
export const TC = param("tc", "K", "K", 1, "superconducting transition temperature T_c", [1e-6, 1e3], "required");

export const bcs: HeatCapacityModel = Object.freeze<HeatCapacityModel>({
  name: "bcs",
  title: "γ_n T_c a·exp(−bT_c/T) + βT³",
  formula: "C = γ_n T_c a exp(−b T_c/T) + βT³",
  parameters: [GAMMA_N, TC, param("a", "1", "1", 1, "prefactor a", [0, Infinity]), param("b", "1", "1", 1, "exponent b = Δ(0)/(k_B T_c)", [0, Infinity]), BETA],
  linear: false,
  evaluate: (T: number, p: Params) => p.gammaN * p.tc * p.a * Math.exp((-p.b * p.tc) / T) + p.beta * T ** 3,
  gradient: (T: number, p: Params) => {
    const e = Math.exp((-p.b * p.tc) / T);
    return { gammaN: p.tc * p.a * e, tc: p.gammaN * p.a * e * (1 - (p.b * p.tc) / T), a: p.gammaN * p.tc * e, b: (-p.gammaN * p.tc * p.a * e * p.tc) / T, beta: T ** 3 };
  },
  guess: () => ({ a: 8.5, b: 1.44, beta: 1e-5 }),
  // b = Δ(0)/(k_B T_c) over 0.05–20 (weak coupling 1.76, strong coupling up to ~2.5, anisotropic
  // gaps lower); T_c, when freed, from the lowest to twice the highest temperature
  separable: { linear: ["a", "beta"], ranges: (data) => { const { tMin, tMax } = temperatureSpan(data); return { b: [0.05, 20], tc: [tMin, 2 * tMax] }; } },
});
