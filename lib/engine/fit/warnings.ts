/**
 * Physicist's warnings on a heat-capacity fit (DESIGN.md "What the engine should warn
 * about"). Each returns a sentence or nothing; thresholds:
 * - fewer than 8 points in the window (common practice);
 * - negative γ (or γ_n) or β;
 * - |corr(γ, β)| > 0.98;
 * - with absolute σ: χ²_red outside 1 ± 3√(2/dof) (≈ 3σ of the χ² distribution);
 * - runs test z < −2.33 (one-sided p < 0.01): residual structure;
 * - pure T³ lattice (sommerfeld, nuclear, magnon) with T_max > Θ_D/15, Θ_D from β:
 *   states the computed T³-law deviation at T_max;
 * - C/T turning up at the low end of C/T vs T² (nuclear-tail sign), for models without A/T²;
 * - magnitudes outside common practice: γ outside 0.05–2000 mJ mol⁻¹ K⁻², Θ_D outside 30–2500 K.
 */
import { debyeTemperatureFromBeta } from "../models/debye";
import { t3LawDeviation } from "../models/debyeFunction";
import { runsTest } from "./runsTest";
import type { FitResult } from "./result";

export interface WarningContext {
  readonly modelName: string;
  readonly temperatureK: Float64Array;
  readonly heatCapacity: Float64Array;
  readonly r: number;
  readonly scaleErrors: boolean;
}

const PURE_T3 = new Set(["sommerfeld", "nuclear", "magnon"]);
const fmt = (v: number, d = 3) => Number(v.toPrecision(d)).toString();

function value(fit: FitResult, name: string): number | undefined {
  return fit.parameters.find((p) => p.name === name)?.value;
}

function correlationWarning(fit: FitResult): string | null {
  const c = fit.correlation;
  if (!c) return null;
  const i = c.names.indexOf("gamma");
  const j = c.names.indexOf("beta");
  const rho = i >= 0 && j >= 0 ? c.matrix[i][j] : null;
  return rho !== null && Math.abs(rho) > 0.98 ? `γ and β are strongly correlated (r = ${fmt(rho, 4)}): widen the window or fix one of them` : null;
}

function chiWarning(fit: FitResult, ctx: WarningContext): string | null {
  if (!fit.weighted || ctx.scaleErrors || fit.reducedChiSquare === null || fit.dof <= 0) return null;
  const spread = 3 * Math.sqrt(2 / fit.dof);
  const x = fit.reducedChiSquare;
  if (Math.abs(x - 1) <= spread) return null;
  return `χ²_red = ${fmt(x)} is far from 1 for ${fit.dof} degrees of freedom (expected 1 ± ${fmt(spread, 2)}): the σ column ${x > 1 ? "underestimates the scatter or the model misses something" : "overestimates the scatter"}`;
}

function t3Warning(fit: FitResult, ctx: WarningContext, tMax: number): string | null {
  const beta = value(fit, "beta");
  if (!PURE_T3.has(ctx.modelName) || !beta || beta <= 0) return null;
  const thetaD = debyeTemperatureFromBeta(beta, ctx.r);
  if (tMax <= thetaD / 15) return null;
  const dev = t3LawDeviation(tMax / thetaD);
  return `the window reaches T = ${fmt(tMax)} K = Θ_D/${fmt(thetaD / tMax, 3)} (Θ_D ≈ ${fmt(thetaD)} K from β): there the T³ law is off the Debye function by ${fmt(dev * 100, 2)} %; consider sommerfeld-t5 or debye`;
}

function upturnWarning(fit: FitResult, ctx: WarningContext, order: number[]): string | null {
  if (ctx.modelName === "nuclear" || fit.parameters.some((p) => p.name === "A")) return null;
  const n = order.length;
  if (n < 10) return null;
  const k = Math.max(3, Math.floor(n / 10));
  const rOverT = order.map((i) => (fit.residuals[i] ?? 0) / ctx.temperatureK[i]);
  const low = rOverT.slice(0, k);
  const rest = rOverT.slice(k);
  const rms = Math.sqrt(rest.reduce((s, v) => s + v * v, 0) / rest.length);
  const rising = low.every((v, i) => v > 0 && (i === 0 || v <= low[i - 1]));
  return rising && low[0] > 2 * rms ? `C/T turns up at the lowest ${k} temperatures (a nuclear A/T² tail, or a magnetic impurity contribution?): try the nuclear model` : null;
}

function magnitudeWarnings(fit: FitResult, ctx: WarningContext): string[] {
  const out: string[] = [];
  const gamma = value(fit, "gamma") ?? value(fit, "gammaN");
  if (gamma !== undefined && gamma > 0 && (gamma < 5e-5 || gamma > 2)) out.push(`γ = ${fmt(gamma * 1e3)} mJ mol⁻¹ K⁻² is outside the usual 0.05–2000 range (common practice): check units and normalisation`);
  const beta = value(fit, "beta");
  const thetaD = value(fit, "thetaD") ?? (beta && beta > 0 ? debyeTemperatureFromBeta(beta, ctx.r) : undefined);
  if (thetaD !== undefined && (thetaD < 30 || thetaD > 2500)) out.push(`Θ_D ≈ ${fmt(thetaD)} K is outside the usual 30–2500 K (common practice): check units, r and normalisation`);
  return out;
}

/** All warnings for a converged heat-capacity fit over the window's points. */
export function heatCapacityWarnings(fit: FitResult, ctx: WarningContext): string[] {
  const out: string[] = [];
  const n = ctx.temperatureK.length;
  if (n < 8) out.push(`only ${n} points in the window (fewer than 8): the result hinges on few points`);
  if (!fit.converged) return out;
  for (const name of ["gamma", "gammaN", "beta"]) {
    const v = value(fit, name);
    if (v !== undefined && v < 0) out.push(`${name === "beta" ? "β" : "γ"} is negative (${fmt(v * 1e3)} m${name === "beta" ? "J mol⁻¹ K⁻⁴" : "J mol⁻¹ K⁻²"}): unphysical, check the window and the addenda`);
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => ctx.temperatureK[a] - ctx.temperatureK[b]);
  const runs = runsTest(order.map((i) => fit.residuals[i] ?? 0));
  if (runs && runs.z < -2.33) out.push(`residuals have structure: ${runs.runs} runs of sign where ${fmt(runs.expected)} are expected (runs test z = ${fmt(runs.z)})`);
  const tMax = order.length ? ctx.temperatureK[order[n - 1]] : 0;
  for (const w of [correlationWarning(fit), chiWarning(fit, ctx), t3Warning(fit, ctx, tMax), upturnWarning(fit, ctx, order)]) if (w) out.push(w);
  out.push(...magnitudeWarnings(fit, ctx));
  return out;
}
