/**
 * `heatbook entropy FILE`: entropy S(T) = ∫₀ᵀ C/T' dT' and enthalpy H(T) − H(0) = ∫₀ᵀ C dT' of a
 * C(T) file, by the cumulative trapezoid on the data (lib/engine/thermo) plus the part from 0 to the
 * lowest measured temperature T_min from a low-temperature fit C = γT + βT³: S(T_min) = γT_min +
 * βT_min³/3, H(T_min) − H(0) = γT_min²/2 + βT_min⁴/4. The fit is given (--gamma, --beta, mJ units,
 * V or V±S, --corr) or fitted here to the file's points up to --fit-t-max (from --fit-t-min).
 * σ: point errors (when the data carry σ) through the trapezoid weights, independent; the
 * extrapolation's σ through cov(γ, β), fully correlated along the curve; combined in quadrature.
 * Output per mole formula unit: S in J mol⁻¹ K⁻¹, H in J mol⁻¹; --at T,T,… adds values at chosen
 * temperatures (the trapezoid cut at T by linear interpolation of the integrand).
 * Exit 0 success, 1 the low-T fit failed, 2 bad usage or input (what and where).
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getList, getNumber, getString, parseArgs, type FlagSpec, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { entropyFromData, enthalpyFromData, type IntegratedCurve } from "../../engine/thermo";
import { quantity, type Quantity } from "../../engine/uncertainty";
import { formatUncertainty } from "../../engine/units";
import { prettyUnit } from "../format";
import { DATA_FLAGS, describeWeighting, loadHeatCapacity, sortedByTemperature } from "../data";
import { fittedFit, givenFit, type SommerfeldFit } from "../lowTemperatureFit";

const FLAGS: Record<string, FlagSpec> = {
  ...DATA_FLAGS,
  "fit-t-max": { kind: "number", meta: "K", help: "fit C = γT + βT³ to the points up to K for the 0 → T_min part" },
  "fit-t-min": { kind: "number", meta: "K", help: "lower edge of that fit window (default: the lowest T)" },
  gamma: { kind: "string", meta: "V[±S]", help: "or give γ [mJ mol^-1 K^-2] of the low-T fit" },
  beta: { kind: "string", meta: "V[±S]", help: "and β [mJ mol^-1 K^-4] of the low-T fit" },
  corr: { kind: "number", meta: "RHO", help: "correlation of the given γ and β (default 0)" },
  at: { kind: "list", meta: "K,K,...", help: "also report S and H at these temperatures (within the data)" },
  csv: { kind: "boolean", help: "print the whole table as CSV (T, S, σ_S, H − H(0), σ_H)" },
  json: { kind: "boolean", help: "print one JSON object (quantities and the table)" },
  help: { kind: "boolean", help: "show this help" },
};
const USAGE = `usage: heatbook entropy FILE (--fit-t-max K | --gamma V[±S] --beta V[±S]) [options]\n\n${formatFlagHelp(FLAGS)}`;

const S_UNIT = "J mol^-1 K^-1";
const H_UNIT = "J mol^-1";

function lowTemperatureFit(args: ReturnType<typeof parseArgs>, data: ReturnType<typeof loadHeatCapacity>): SommerfeldFit {
  const gamma = getString(args, "gamma");
  const beta = getString(args, "beta");
  const tMax = getNumber(args, "fit-t-max");
  const tMin = getNumber(args, "fit-t-min");
  if ((gamma !== undefined || beta !== undefined) && (tMax !== undefined || tMin !== undefined)) throw new InputError("give either --gamma/--beta or a fit window (--fit-t-max), not both", { field: "fit-t-max" });
  if (gamma !== undefined || beta !== undefined) {
    if (gamma === undefined || beta === undefined) throw new InputError(`missing --${gamma === undefined ? "gamma" : "beta"} (--gamma and --beta go together)`, { field: gamma === undefined ? "gamma" : "beta" });
    return givenFit(gamma, beta, "gamma", "beta", getNumber(args, "corr"));
  }
  if (args.flags.corr !== undefined) throw new InputError("--corr goes with --gamma and --beta", { field: "corr" });
  if (tMax === undefined) throw new InputError("the 0 → T_min part needs a low-temperature fit: --fit-t-max K (fit C = γT + βT³ up to K) or --gamma and --beta", { field: "fit-t-max" });
  return fittedFit(data, tMin, tMax, "fit-t-max");
}

/**
 * The integral of a curve at temperature t inside [T_0, T_n−1]: the cumulative value at the point
 * below plus the trapezoid to t with the integrand interpolated linearly; σ interpolated linearly
 * between the neighbouring points' σ (an approximation, stated in the note).
 */
export function integralAt(curve: IntegratedCurve, integrand: readonly number[], t: number): { value: number; stdError: number | null } {
  const T = curve.temperatureK;
  let k = 0;
  while (k < T.length - 2 && T[k + 1] <= t) k++;
  const f = (t - T[k]) / (T[k + 1] - T[k]);
  const yAt = integrand[k] + f * (integrand[k + 1] - integrand[k]);
  const value = curve.values[k] + ((t - T[k]) * (integrand[k] + yAt)) / 2;
  const s = curve.stdErrors;
  return { value, stdError: s ? s[k] + f * (s[k + 1] - s[k]) : null };
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
    if (getBoolean(args, "json") && getBoolean(args, "csv")) throw new InputError("choose one of --json and --csv", { field: "csv" });
    const data = loadHeatCapacity(args, io);
    const rows = sortedByTemperature(data);
    if (rows.temperatureK.length < 2) throw new InputError("need at least 2 points to integrate", { file: data.file });
    const at = getList(args, "at") ?? [];
    const [tLo, tHi] = [rows.temperatureK[0], rows.temperatureK[rows.temperatureK.length - 1]];
    for (const t of at) if (!(t >= tLo && t <= tHi)) throw new InputError(`--at ${t}: outside the data (${tLo}–${tHi} K); below T_min only the fit's extrapolation is known`, { field: "at" });
    const fit = lowTemperatureFit(args, data);
    const low = {
      gamma: fit.gamma.value, beta: fit.beta.value,
      ...(fit.gamma.stdError !== null ? { gammaStdError: fit.gamma.stdError } : {}),
      ...(fit.beta.stdError !== null ? { betaStdError: fit.beta.stdError } : {}),
      ...(fit.covGammaBeta !== null ? { covGammaBeta: fit.covGammaBeta } : {}),
    };
    const S = entropyFromData(rows.temperatureK, rows.heatCapacity, low, rows.sigma);
    const H = enthalpyFromData(rows.temperatureK, rows.heatCapacity, low, rows.sigma);
    const last = rows.temperatureK.length - 1;
    const tMax = rows.temperatureK[last];
    const fmtT = (t: number) => String(Number(t.toPrecision(6)));
    const q = (name: string, symbol: string, v: { value: number; stdError: number | null }, unit: string, note?: string) => quantity(name, symbol, v.value, v.stdError, unit, note);
    const quantities: Quantity[] = [
      quantity("gammaLowT", "γ (low-T fit)", fit.gamma.value * 1e3, fit.gamma.stdError === null ? null : fit.gamma.stdError * 1e3, "mJ mol^-1 K^-2", fit.source),
      quantity("betaLowT", "β (low-T fit)", fit.beta.value * 1e3, fit.beta.stdError === null ? null : fit.beta.stdError * 1e3, "mJ mol^-1 K^-4", fit.source),
      { ...S.extrapolation, unit: S_UNIT },
      { ...H.extrapolation, unit: H_UNIT },
      q("entropyAtTmax", `S(${fmtT(tMax)} K)`, { value: S.values[last], stdError: S.stdErrors?.[last] ?? null }, S_UNIT, "at the highest measured temperature"),
      q("enthalpyAtTmax", `H(${fmtT(tMax)} K) − H(0)`, { value: H.values[last], stdError: H.stdErrors?.[last] ?? null }, H_UNIT, "at the highest measured temperature"),
    ];
    const yS = rows.heatCapacity.map((c, i) => c / rows.temperatureK[i]);
    at.forEach((t, i) => {
      quantities.push(q(`entropyAt${i + 1}`, `S(${fmtT(t)} K)`, integralAt(S, yS, t), S_UNIT, "--at: trapezoid cut at T, σ interpolated"));
      quantities.push(q(`enthalpyAt${i + 1}`, `H(${fmtT(t)} K) − H(0)`, integralAt(H, rows.heatCapacity, t), H_UNIT, "--at: trapezoid cut at T, σ interpolated"));
    });
    const warnings: string[] = [...fit.warnings];
    if (S.extrapolation.value > 0.1 * S.values[last]) warnings.push(`the 0 → T_min extrapolation is ${((100 * S.extrapolation.value) / S.values[last]).toFixed(0)} % of S(${fmtT(tMax)} K): the result leans on the low-T fit`);
    if (fit.fitted && fit.fitted.tMaxK !== null && fit.fitted.tMaxK > 0.5 * tMax) warnings.push(`the low-T fit reaches ${fit.fitted.tMaxK} K, over half the data range: C = γT + βT³ may not hold there`);
    const table = {
      columns: [{ name: "T", unit: "K" }, { name: "S", unit: S_UNIT }, { name: "sigmaS", unit: S_UNIT }, { name: "H - H(0)", unit: H_UNIT }, { name: "sigmaH", unit: H_UNIT }],
      rows: rows.temperatureK.map((t, i) => [t, S.values[i], S.stdErrors?.[i] ?? null, H.values[i], H.stdErrors?.[i] ?? null]),
    };
    const method = `cumulative trapezoid on the data (${rows.temperatureK.length} points) plus the 0 → T_min part from the low-T fit; σ: point errors through the trapezoid weights and the fit's covariance, in quadrature`;
    if (getBoolean(args, "json")) {
      io.out(JSON.stringify({ file: data.file, columns: data.columns, weighting: { ...data.weighting, text: describeWeighting(data.weighting) }, basis: { ...data.basis, per: "formula-unit" }, lowTemperatureFit: { source: fit.source, fitted: fit.fitted }, method, quantities, table, warnings, notes: data.notes }, null, 2));
    } else if (getBoolean(args, "csv")) {
      io.out([`# ${data.file}: entropy and enthalpy per mole formula unit; ${method}`, `T (K),S (${S_UNIT}),sigma S (${S_UNIT}),H - H(0) (${H_UNIT}),sigma H (${H_UNIT})`, ...table.rows.map((r) => r.map((v) => (v === null ? "" : String(v))).join(","))].join("\n"));
    } else {
      io.out(text(data.file, rows.temperatureK.length, fit, quantities, table.rows, warnings, data.notes, data.sigma !== undefined));
    }
    return 0;
  } catch (e) {
    return reportFailure("entropy", e, io.err);
  }
}

function text(file: string, n: number, fit: SommerfeldFit, quantities: Quantity[], rows: (number | null)[][], warnings: string[], notes: string[], hasSigma: boolean): string {
  const lines = [`${file}: ${n} points, per mole formula unit; 0 → T_min from ${fit.source}`];
  for (const q of quantities) lines.push(`  ${q.symbol.padEnd(24)} ${formatUncertainty(q.value, q.stdError, { plainDigits: 5 }).padStart(18)}  ${prettyUnit(q.unit)}`.trimEnd());
  const step = Math.max(1, Math.ceil(rows.length / 20));
  lines.push("", `  ${"T (K)".padStart(10)} ${`S (${prettyUnit(S_UNIT)})`.padStart(22)} ${`H − H(0) (${prettyUnit(H_UNIT)})`.padStart(24)}`);
  for (let i = 0; i < rows.length; i += step) {
    const r = rows[i];
    lines.push(`  ${String(Number((r[0] as number).toPrecision(6))).padStart(10)} ${formatUncertainty(r[1] as number, r[2], { plainDigits: 5 }).padStart(22)} ${formatUncertainty(r[3] as number, r[4], { plainDigits: 5 }).padStart(24)}`);
  }
  if (step > 1) lines.push(`  (every ${step}th of ${rows.length} rows; --csv or --json for all)`);
  if (!hasSigma) lines.push("  σ of the integrals: the low-T fit's only (the data carry no σ)");
  for (const w of warnings) lines.push(`warning: ${w}`);
  for (const note of notes) lines.push(`note: ${note}`);
  return lines.join("\n");
}
