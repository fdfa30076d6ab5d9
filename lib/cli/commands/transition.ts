/**
 * `heatbook transition FILE`: the superconducting transition in a zero-field C(T) file, by the
 * engine's entropy-conserving (equal-area) construction on C_el/T = C/T − βT² (lib/engine/
 * superconductor analyzeJump): T_c, ΔC, ΔC/(γ_n T_c) with σ, the residual γ_r and γ_r/γ_n.
 *
 * The normal state (γ_n, β) comes from exactly one of:
 *   --gamma-n V[±S] --beta V[±S] [--corr RHO]      given (mJ units), taken as measured above T_c;
 *   --normal-above K [--normal-below K]            C = γT + βT³ fitted to this file above K;
 *   --normal-file FILE2 [--normal-t-min/--normal-t-max K]  fitted to a measurement in a field above
 *                                                  H_c2 (read with the same column and unit flags).
 *
 * Entropy balance (a check of the whole analysis): for a second-order transition the electronic
 * entropy of both states agrees at T_c, so S_el(T_u) = ∫₀^{T_u} C_el/T dT must equal the normal
 * state's γ_n T_u at the top T_u of the construction window. ∫ from T_min to T_u: trapezoid on the
 * data. 0 → T_min: C_el/T falls from its value y₀ at T_min towards γ_r (gapped part), so the piece
 * lies between γ_r T_min and T_min (γ_r + y₀)/2; we take the middle and half the span/√3 as its σ
 * (uniform), with γ_r = 0 when it could not be estimated. The ratio S_el(T_u)/(γ_n T_u) is 1 when
 * γ_n, β, the addenda and the low-T data are consistent; its σ combines (γ_n, β) through their
 * covariance (numerical gradient), point errors through the trapezoid weights and the 0 → T_min
 * piece and the trapezoid's resolution of the step (h·ΔC/T_c/√12, h the spacing at T_c), in
 * quadrature.
 *
 * Output per mole formula unit, same JSON shape as `derive` (quantities with name, symbol, value,
 * stdError, unit, note), tables of the measured and idealised C_el/T. Exit 0 success, 1 the
 * normal-state fit failed, 2 bad usage or input (including data with no resolvable jump).
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getNumber, getString, parseArgs, type FlagSpec, type ParsedArgs, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { analyzeJump, areaBetween, type JumpResult } from "../../engine/superconductor";
import { covariance2, propagate, quantity, type Quantity } from "../../engine/uncertainty";
import { formatUncertainty } from "../../engine/units";
import { prettyUnit } from "../format";
import { DATA_FLAGS, describeWeighting, loadHeatCapacity, sortedByTemperature, type LoadedHeatCapacity } from "../data";
import { fittedFit, givenFit, type SommerfeldFit } from "../lowTemperatureFit";

const FLAGS: Record<string, FlagSpec> = {
  ...DATA_FLAGS,
  "gamma-n": { kind: "string", meta: "V[±S]", help: "normal-state γ_n [mJ mol^-1 K^-2] (with --beta)" },
  beta: { kind: "string", meta: "V[±S]", help: "normal-state β [mJ mol^-1 K^-4] (with --gamma-n)" },
  corr: { kind: "number", meta: "RHO", help: "correlation of the given γ_n and β (default 0)" },
  "normal-above": { kind: "number", meta: "K", help: "or fit C = γT + βT³ to this file's points above K (normal state above T_c)" },
  "normal-below": { kind: "number", meta: "K", help: "upper edge of that fit window (default: the highest T)" },
  "normal-file": { kind: "string", meta: "FILE2", help: "or fit the normal state to FILE2, measured in a field above H_c2" },
  "normal-t-min": { kind: "number", meta: "K", help: "window of the fit to FILE2 (default: all of it)" },
  "normal-t-max": { kind: "number", meta: "K", help: "window of the fit to FILE2" },
  lower: { kind: "number", meta: "K", help: "lower edge of the construction window (default: found from the data)" },
  upper: { kind: "number", meta: "K", help: "upper edge of the construction window" },
  "branch-from": { kind: "number", meta: "K", help: "start of the superconducting-branch fit below the window" },
  "branch-degree": { kind: "number", meta: "1|2", help: "degree of the branch polynomial (default 2)" },
  "residual-below": { kind: "number", meta: "F", help: "γ_r from T ≤ F·T_c (default 0.15)" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};
const USAGE = `usage: heatbook transition FILE (--gamma-n V[±S] --beta V[±S] | --normal-above K | --normal-file FILE2) [options]\n\n${formatFlagHelp(FLAGS)}`;

const has = (args: ParsedArgs, ...names: string[]) => names.filter((n) => args.flags[n] !== undefined);

function normalState(args: ParsedArgs, data: LoadedHeatCapacity, io: CliIo): { fit: SommerfeldFit; source: "above-tc" | "field-above-hc2" } {
  const given = has(args, "gamma-n", "beta", "corr");
  const above = has(args, "normal-above", "normal-below");
  const file = has(args, "normal-file", "normal-t-min", "normal-t-max");
  const chosen = [given, above, file].filter((g) => g.length > 0);
  if (chosen.length === 0) throw new InputError("the normal state is needed: --gamma-n and --beta, or --normal-above K (fit above T_c), or --normal-file FILE2 (a field above H_c2)", { field: "gamma-n" });
  if (chosen.length > 1) throw new InputError(`choose one normal-state source: --${chosen[0][0]} and --${chosen[1][0]} contradict each other`, { field: chosen[1][0] });
  if (given.length) {
    const g = getString(args, "gamma-n");
    const b = getString(args, "beta");
    if (g === undefined || b === undefined) throw new InputError(`missing --${g === undefined ? "gamma-n" : "beta"} (--gamma-n and --beta go together)`, { field: g === undefined ? "gamma-n" : "beta" });
    return { fit: givenFit(g, b, "gamma-n", "beta", getNumber(args, "corr")), source: "above-tc" };
  }
  if (above.length) {
    const from = getNumber(args, "normal-above");
    if (from === undefined) throw new InputError("--normal-below goes with --normal-above", { field: "normal-above" });
    return { fit: fittedFit(data, from, getNumber(args, "normal-below"), "normal-above"), source: "above-tc" };
  }
  const path = getString(args, "normal-file");
  if (path === undefined) throw new InputError("--normal-t-min/--normal-t-max go with --normal-file", { field: "normal-file" });
  const normal = loadHeatCapacity({ ...args, positionals: [path] }, io);
  return { fit: fittedFit(normal, getNumber(args, "normal-t-min"), getNumber(args, "normal-t-max"), "normal-file"), source: "field-above-hc2" };
}

/**
 * S_el(T_u)/(γ_n T_u) with its parts (see the module comment). SI in, quantities in mJ mol⁻¹ K⁻¹.
 */
export function entropyBalance(T: readonly number[], C: readonly number[], sigmaC: readonly number[] | undefined, fit: SommerfeldFit, upperK: number, gammaResidual: number | null, step: { tcK: number; jumpOverTc: number }): Quantity[] {
  const gammaR = gammaResidual ?? 0;
  const parts = (gammaN: number, beta: number) => {
    const y = C.map((c, i) => c / T[i] - beta * T[i] * T[i]);
    const { area, weights } = areaBetween(T, y, T[0], upperK);
    const lo = gammaR * T[0];
    const hi = (T[0] * (gammaR + y[0])) / 2;
    return { measured: area, below: (lo + hi) / 2, belowStdError: Math.abs(hi - lo) / 2 / Math.sqrt(3), weights, normal: gammaN * upperK };
  };
  const x = [fit.gamma.value, fit.beta.value];
  const cov = covariance2(fit.gamma.stdError ?? 0, fit.beta.stdError ?? 0, fit.covGammaBeta ?? 0);
  const p = parts(x[0], x[1]);
  const noise = sigmaC ? Math.sqrt(p.weights.reduce((s, w, i) => s + (w * (sigmaC[i] / T[i])) ** 2, 0)) : 0;
  const sEl = propagate(([g, b]) => { const q = parts(g, b); return q.measured + q.below; }, x, cov);
  const ratio = propagate(([g, b]) => { const q = parts(g, b); return (q.measured + q.below) / q.normal; }, x, cov);
  // The trapezoid across the jump places the step anywhere between the two points around T_c:
  // an area error up to h·ΔC/T_c/2, uniform, so σ = h·(ΔC/T_c)/√12 (h the local spacing).
  const i = Math.max(1, Math.min(T.length - 1, T.findIndex((t) => t >= step.tcK)));
  const resolution = ((T[i] - T[i - 1]) * Math.abs(step.jumpOverTc)) / Math.sqrt(12);
  const sElStd = Math.hypot(sEl.stdError, noise, p.belowStdError, resolution);
  const ratioStd = Math.hypot(ratio.stdError, noise / p.normal, p.belowStdError / p.normal, resolution / p.normal);
  const tu = String(Number(upperK.toPrecision(5)));
  const m = 1e3;
  return [
    quantity("entropyBelowTmin", "S_el(T_min)", p.below * m, p.belowStdError * m, "mJ mol^-1 K^-1", `0 → T_min = ${T[0]} K: between γ_r T_min and the trapezoid to C_el/T(T_min)`),
    quantity("entropyElectronic", `S_el(${tu} K)`, (p.measured + p.below) * m, sElStd * m, "mJ mol^-1 K^-1", "∫₀^{T_u} C_el/T dT on the data (superconducting, then normal)"),
    quantity("entropyNormal", `γ_n·${tu} K`, p.normal * m, (fit.gamma.stdError ?? 0) * upperK * m, "mJ mol^-1 K^-1", "normal-state electronic entropy at the top of the window"),
    quantity("entropyBalance", "S_el/(γ_n T_u)", ratio.value, ratioStd, "1", "1 when γ_n, β, addenda and the low-T data agree (entropy conservation)"),
  ];
}

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    if (args.positionals.length !== 1) throw new InputError(args.positionals.length ? `unexpected argument ${JSON.stringify(args.positionals[1])}` : "missing FILE");
    const degree = getNumber(args, "branch-degree");
    if (degree !== undefined && degree !== 1 && degree !== 2) throw new InputError(`invalid --branch-degree: ${degree} (1 or 2)`, { field: "branch-degree" });
    const frac = getNumber(args, "residual-below");
    if (frac !== undefined && !(frac > 0 && frac < 1)) throw new InputError(`invalid --residual-below: ${frac} (a fraction of T_c in (0, 1))`, { field: "residual-below" });
    for (const f of ["lower", "upper", "branch-from"]) {
      const v = getNumber(args, f);
      if (v !== undefined && !(v > 0)) throw new InputError(`invalid --${f}: ${v} (K, must be > 0)`, { field: f });
    }
    const data = loadHeatCapacity(args, io);
    const rows = sortedByTemperature(data);
    const { fit, source } = normalState(args, data, io);
    const window = Object.fromEntries(([["lowerK", "lower"], ["upperK", "upper"], ["branchFromK", "branch-from"]] as const).filter(([, f]) => getNumber(args, f) !== undefined).map(([k, f]) => [k, getNumber(args, f)!]));
    let r: JumpResult;
    try {
      r = analyzeJump({
        temperatureK: rows.temperatureK, heatCapacityJPerMolK: rows.heatCapacity, ...(rows.sigma ? { stdErrorJPerMolK: rows.sigma } : {}),
        gammaN: fit.gamma, beta: fit.beta, ...(fit.covGammaBeta !== null ? { covGammaBeta: fit.covGammaBeta } : {}),
        normalState: source, window, ...(degree !== undefined ? { branchDegree: degree as 1 | 2 } : {}), ...(frac !== undefined ? { residualBelowFraction: frac } : {}),
      });
    } catch (e) {
      if (e instanceof InputError) throw new InputError(e.baseMessage, { file: data.file, ...(e.where?.field ? { field: e.where.field } : {}) });
      throw e;
    }
    const gammaR = r.gammaResidual ? r.gammaResidual.value * 1e-3 : null;
    const balance = entropyBalance(rows.temperatureK, rows.heatCapacity, rows.sigma, fit, r.windows.upperK, gammaR, { tcK: r.tc.value, jumpOverTc: (r.deltaC.value * 1e-3) / r.tc.value });
    const mj = (name: string, symbol: string, m: { value: number; stdError: number | null }, unit: string) => quantity(name, symbol, m.value * 1e3, m.stdError === null ? null : m.stdError * 1e3, unit, fit.source);
    const quantities: Quantity[] = [
      mj("gammaN", "γ_n", fit.gamma, "mJ mol^-1 K^-2"),
      mj("beta", "β", fit.beta, "mJ mol^-1 K^-4"),
      r.tc, r.deltaC, r.jumpRatio,
      ...(r.jumpRatioSuperconductingPart ? [r.jumpRatioSuperconductingPart] : []),
      ...(r.gammaResidual ? [r.gammaResidual] : []),
      ...(r.nonSuperconductingFraction ? [r.nonSuperconductingFraction] : []),
      ...balance,
    ];
    const warnings = [...r.warnings, ...fit.warnings];
    const b = balance[balance.length - 1];
    if (b.stdError !== null && Math.abs(b.value - 1) > 3 * b.stdError && Math.abs(b.value - 1) > 0.02) warnings.push(`entropy balance S_el/(γ_n T_u) = ${b.value.toFixed(3)} differs from 1 by more than 3σ: check β, γ_n, the addenda or the lowest-T data`);
    const points = { columns: [{ name: "T", unit: "K" }, { name: "C_el/T", unit: "mJ mol^-1 K^-2" }], rows: rows.temperatureK.map((t, i) => [t, (rows.heatCapacity[i] / t - fit.beta.value * t * t) * 1e3]) };
    const idealised = { columns: points.columns, rows: r.idealised.temperatureK.map((t, i) => [t, r.idealised.cElOverT[i] * 1e3]) };
    if (getBoolean(args, "json")) {
      io.out(JSON.stringify({
        file: data.file, columns: data.columns, weighting: { ...data.weighting, text: describeWeighting(data.weighting) }, basis: { ...data.basis, per: "formula-unit" },
        normalState: { source, text: fit.source, fitted: fit.fitted }, windows: r.windows, bcsJumpRatio: r.bcsJumpRatio, uncertaintyMethod: r.uncertaintyMethod,
        quantities, table: points, idealised, warnings, notes: data.notes,
      }, null, 2));
    } else {
      const lines = [`${data.file}: ${rows.temperatureK.length} points, per mole formula unit; normal state: ${fit.source}`];
      lines.push(`  construction window ${r.windows.lowerK.toPrecision(4)}–${r.windows.upperK.toPrecision(4)} K, superconducting branch from ${r.windows.branchFromK.toPrecision(4)} K`);
      for (const q of quantities) lines.push(`  ${q.symbol.padEnd(22)} ${formatUncertainty(q.value, q.stdError, { plainDigits: 5 }).padStart(16)}  ${prettyUnit(q.unit)}`.trimEnd());
      lines.push(`  σ: ${r.uncertaintyMethod}`);
      // The engine's first "warning" names the normal-state source, shown in the first line already.
      for (const w of warnings) if (w !== r.warnings[0]) lines.push(`warning: ${w}`);
      for (const n of data.notes) lines.push(`note: ${n}`);
      io.out(lines.join("\n"));
    }
    return 0;
  } catch (e) {
    return reportFailure("transition", e, io.err);
  }
}
