/**
 * analyzeJump: T_c, ΔC and ΔC/(γ_n T_c) of a superconducting transition from the
 * entropy-conserving (equal-area) construction on C_el/T vs T, with the idealised step for
 * plotting, the residual γ_r and γ_r/γ_n, and the normal-state source echoed.
 *
 * Uncertainty (approximate, first order, combined in quadrature):
 *  - normal state: the whole construction re-run under a numerical gradient in (γ_n, β),
 *    propagated through their covariance (windows held fixed);
 *  - noise: point errors (given σ_C, else the branch-fit residual rms for every point) through
 *    the trapezoid weights of the measured area and the branch-fit covariance,
 *    σ_Tc² = (σ_area² + (σ_branch (T_c − lower))²)/(ΔC/T_c)²;
 *  - resolution: the trapezoid across a step between two points misplaces T_c by up to half
 *    the local spacing h; h/√12 (uniform) is added to σ_Tc.
 * Not included: the choice of windows (re-run with other `window` values to see it).
 */
import { invalid } from "../errors";
import { covariance2, propagate, quantity, type Quantity } from "../uncertainty";
import { checkMeasured, varianceOf, type Measured } from "../derived/measured";
import { checkTable } from "../thermo";
import { construct, electronicOverT, type Windows } from "./construction";
import { findTransition } from "./transition";
import { residualGamma } from "./residual";
import { BCS_JUMP_RATIO } from "./bcs";

export type NormalStateSource = "above-tc" | "field-above-hc2";

export interface JumpInput {
  readonly temperatureK: readonly number[];
  /** Total C [J mol⁻¹ K⁻¹] in zero field (superconducting state). */
  readonly heatCapacityJPerMolK: readonly number[];
  readonly stdErrorJPerMolK?: readonly number[];
  /** Normal-state γ_n [J mol⁻¹ K⁻²] and β [J mol⁻¹ K⁻⁴] from the normal-state fit. */
  readonly gammaN: Measured;
  readonly beta: Measured;
  readonly covGammaBeta?: number;
  /** Where the normal-state fit came from: data above T_c, or a field above H_c2. */
  readonly normalState: NormalStateSource;
  readonly window?: Partial<Windows>;
  /** Degree of the superconducting-branch polynomial; default 2. */
  readonly branchDegree?: 1 | 2;
  /** γ_r from the fits of residual.ts (gapped form or line in T², by AICc) at T ≤ fraction × T_c; default 0.4. */
  readonly residualBelowFraction?: number;
}

export interface JumpResult {
  readonly normalState: NormalStateSource;
  readonly tc: Quantity;
  readonly deltaC: Quantity;
  readonly jumpRatio: Quantity;
  /** ΔC/((γ_n − γ_r) T_c): the jump of the superconducting fraction alone; null without γ_r. */
  readonly jumpRatioSuperconductingPart: Quantity | null;
  readonly gammaResidual: Quantity | null;
  readonly nonSuperconductingFraction: Quantity | null;
  readonly bcsJumpRatio: number;
  readonly windows: Windows;
  /** The idealised C_el/T curve [J mol⁻¹ K⁻²] vs T [K], with the vertical step at T_c. */
  readonly idealised: { readonly temperatureK: readonly number[]; readonly cElOverT: readonly number[] };
  readonly uncertaintyMethod: string;
  readonly warnings: readonly string[];
}

const SOURCE_TEXT: Record<NormalStateSource, string> = {
  "above-tc": "normal state from the fit above T_c",
  "field-above-hc2": "normal state from the fit in a field above H_c2",
};

/**
 * Run the construction. Throws InputError on bad arrays, an unknown normal-state source,
 * γ_n ≤ 0, or data with no resolvable jump (see findTransition and construct).
 */
export function analyzeJump(input: JumpInput): JumpResult {
  const { T, C, sigmaC, gammaN, beta } = checkInput(input);
  const degree = input.branchDegree ?? 2;
  const y = electronicOverT(T, C, beta);
  const found = findTransition(T, y, gammaN, input.window);
  const w: Windows = { lowerK: found.lowerK, upperK: found.upperK, branchFromK: found.branchFromK };
  const sigmaY = sigmaC?.map((s, i) => s / T[i]);
  const c = construct(T, y, sigmaY, gammaN, w, degree);
  const sys = systematic(input, T, C, sigmaY, w, degree);
  const noise = noiseErrors(c, T, sigmaY, gammaN, w);
  const sTc = Math.hypot(sys.tc, noise.tc);
  const sJ = Math.hypot(sys.jump, noise.jump);
  const ratio = c.jumpOverTc / gammaN;
  const res = residualPart(input, T, y, sigmaY, c.tcK, gammaN, ratio);
  const warnings = [SOURCE_TEXT[input.normalState], ...jumpWarnings(ratio, res.warnings)];
  return Object.freeze({
    normalState: input.normalState,
    tc: quantity("tc", "T_c", c.tcK, sTc, "K", "equal-area construction"),
    deltaC: quantity("deltaC", "ΔC", c.tcK * c.jumpOverTc * 1e3, Math.hypot(sys.deltaC, c.tcK * noise.jump * gammaN, c.jumpOverTc * noise.tc) * 1e3, "mJ mol^-1 K^-1"),
    jumpRatio: quantity("jumpRatio", "ΔC/(γ_n T_c)", ratio, sJ, "1", `BCS weak coupling ${BCS_JUMP_RATIO.toFixed(3)}`),
    jumpRatioSuperconductingPart: res.corrected,
    gammaResidual: res.gammaR,
    nonSuperconductingFraction: res.fraction,
    bcsJumpRatio: BCS_JUMP_RATIO,
    windows: Object.freeze(w),
    idealised: idealisedCurve(c, gammaN, w),
    uncertaintyMethod: "first order: (γ_n, β) covariance by numerical gradient of the construction, plus point noise through the area weights and branch fit; window choice not included",
    warnings: Object.freeze(warnings),
  });
}

function checkInput(input: JumpInput) {
  checkTable(input.temperatureK, input.heatCapacityJPerMolK, "temperatureK", "heatCapacity");
  if (input.temperatureK[0] <= 0) throw invalid("temperatureK[0]", input.temperatureK[0], "must be > 0 K");
  if (input.stdErrorJPerMolK && input.stdErrorJPerMolK.length !== input.temperatureK.length) throw invalid("stdError", `${input.stdErrorJPerMolK.length} values`, `expected ${input.temperatureK.length}`);
  if (!(input.normalState in SOURCE_TEXT)) throw invalid("normalState", input.normalState, "expected above-tc or field-above-hc2");
  checkMeasured(input.gammaN, "gammaN");
  checkMeasured(input.beta, "beta");
  if (!(input.gammaN.value > 0)) throw invalid("gammaN", input.gammaN.value, "normal-state γ must be > 0");
  return { T: input.temperatureK, C: input.heatCapacityJPerMolK, sigmaC: input.stdErrorJPerMolK, gammaN: input.gammaN.value, beta: input.beta.value };
}

function systematic(input: JumpInput, T: readonly number[], C: readonly number[], sigmaY: number[] | undefined, w: Windows, degree: 1 | 2) {
  const cov = covariance2(Math.sqrt(varianceOf(input.gammaN)), Math.sqrt(varianceOf(input.beta)), input.covGammaBeta ?? 0);
  const x = [input.gammaN.value, input.beta.value];
  const run = ([g, b]: readonly number[]) => construct(T, electronicOverT(T, C, b), sigmaY, g, w, degree);
  return {
    tc: propagate((v) => run(v).tcK, x, cov).stdError,
    jump: propagate((v) => run(v).jumpOverTc / v[0], x, cov).stdError,
    deltaC: propagate((v) => { const r = run(v); return r.tcK * r.jumpOverTc; }, x, cov).stdError,
  };
}

function noiseErrors(c: ReturnType<typeof construct>, T: readonly number[], sigmaY: number[] | undefined, gammaN: number, w: Windows) {
  const s = sigmaY ?? T.map(() => c.branch.residualRms);
  const sArea = Math.sqrt(c.weights.reduce((acc, wi, i) => acc + (wi * s[i]) ** 2, 0));
  const sBranchArea = c.branch.stdErrorAt((w.lowerK + c.tcK) / 2) * (c.tcK - w.lowerK);
  const i = Math.max(1, T.findIndex((t) => t >= c.tcK));
  const resolution = (T[Math.min(i, T.length - 1)] - T[i - 1]) / Math.sqrt(12);
  const tc = Math.hypot(Math.hypot(sArea, sBranchArea) / c.jumpOverTc, resolution);
  const h = 1e-6 * c.tcK;
  const slope = (c.branch.at(c.tcK + h) - c.branch.at(c.tcK - h)) / (2 * h);
  return { tc, jump: Math.hypot(c.branch.stdErrorAt(c.tcK), slope * tc) / gammaN };
}

function residualPart(input: JumpInput, T: readonly number[], y: readonly number[], sigmaY: number[] | undefined, tcK: number, gammaN: number, ratio: number) {
  const upTo = (input.residualBelowFraction ?? 0.4) * tcK;
  const r = residualGamma(T, y, upTo, sigmaY, tcK);
  if (!r) return { gammaR: null, fraction: null, corrected: null, warnings: [`γ_r not estimated: the gapped fit below ${upTo.toPrecision(3)} K needs at least 6 points and must converge`] };
  const cov = covariance2(r.stdError, Math.sqrt(varianceOf(input.gammaN)));
  const frac = propagate(([a, b]) => a / b, [r.gammaR, gammaN], cov);
  const corr = propagate(([a, b]) => (ratio * gammaN) / (b - a), [r.gammaR, gammaN], cov);
  const warnings = r.gammaR < -2 * r.stdError ? [`negative residual γ_r = ${(r.gammaR * 1e3).toPrecision(3)} mJ mol^-1 K^-2: check β, the addenda, or a nuclear tail at the lowest T`] : [];
  return {
    gammaR: quantity("gammaResidual", "γ_r", r.gammaR * 1e3, r.stdError * 1e3, "mJ mol^-1 K^-2", r.method),
    fraction: quantity("nonSuperconductingFraction", "γ_r/γ_n", frac.value, frac.stdError, "1", "non-superconducting fraction"),
    corrected: quantity("jumpRatioSuperconductingPart", "ΔC/((γ_n − γ_r) T_c)", corr.value, corr.stdError, "1", "jump of the superconducting part alone"),
    warnings,
  };
}

function jumpWarnings(ratio: number, extra: string[]): string[] {
  const w = [...extra];
  if (ratio > 1.2 * BCS_JUMP_RATIO) w.push(`ΔC/(γ_n T_c) = ${ratio.toFixed(2)} above the BCS weak-coupling ${BCS_JUMP_RATIO.toFixed(2)}: strong coupling?`);
  if (ratio < 0.8 * BCS_JUMP_RATIO) w.push(`ΔC/(γ_n T_c) = ${ratio.toFixed(2)} below the BCS ${BCS_JUMP_RATIO.toFixed(2)}: a non-superconducting fraction, gap anisotropy or multiple gaps?`);
  return w;
}

function idealisedCurve(c: ReturnType<typeof construct>, gammaN: number, w: Windows) {
  const n = 24;
  const temperatureK: number[] = [];
  const cElOverT: number[] = [];
  for (let i = 0; i <= n; i++) {
    const t = w.branchFromK + ((c.tcK - w.branchFromK) * i) / n;
    temperatureK.push(t);
    cElOverT.push(c.branch.at(t));
  }
  temperatureK.push(c.tcK, w.upperK);
  cElOverT.push(gammaN, gammaN);
  return Object.freeze({ temperatureK, cElOverT });
}
