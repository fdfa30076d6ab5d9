/**
 * `heatbook fit FILE`: fit a heat-capacity model to a delimited C(T) file.
 * Columns by header (T, C, optional σ; guessed by the importer, or named with --t-col,
 * --c-col, --sigma-col by name or 1-based number). Units: --c-unit (mathjs syntax, default
 * the header's unit or J/(mol*K)); T in the header's unit or K. Window bounds inclusive.
 * Output γ in mJ/(mol K²), β in mJ/(mol K⁴) (display units of each parameter); --fix and
 * --start take the same display units for registered models (SI for expressions).
 * Exit 0 success, 1 the fit failed (reason printed), 2 bad usage or input (what and where).
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getAssignments, getBoolean, getNumber, getString, parseArgs, type FlagSpec, type ParsedArgs, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { parseDelimited, guessColumnRoles, extractPoints, type ParsedTable } from "../../engine/importer";
import { toSI, heatCapacityBasis } from "../../engine/units";
import { fitHeatCapacity, type FitResult, type HeatCapacityFitResult } from "../../engine/fit";
import { MODELS, debyeTemperatureFromBeta } from "../../engine/models";
import type { Recommendation } from "../../engine/scan";
import { recommendationJson, recommendationText, recommendedModel, recommendedStart, runRecommendation } from "./fitScan";

const FLAGS: Record<string, FlagSpec> = {
  model: { kind: "string", meta: "NAME|EXPR", help: `model name (${Object.keys(MODELS).join(", ")}) or a mathjs expression in T; default sommerfeld` },
  "t-min": { kind: "number", meta: "K", help: "lower window edge, inclusive" },
  "t-max": { kind: "number", meta: "K", help: "upper window edge, inclusive" },
  scan: { kind: "boolean", help: "recommend a model and window (candidates Sommerfeld, +T⁵, +A/T², +Schottky and --model), with statistical and systematic σ; fit them" },
  "c-unit": { kind: "string", meta: "UNIT", help: 'heat-capacity unit, e.g. "mJ/(mol*K)" (default: header unit, else J/(mol*K))' },
  "t-col": { kind: "string", meta: "NAME|N", help: "temperature column (name or 1-based number)" },
  "c-col": { kind: "string", meta: "NAME|N", help: "heat-capacity column" },
  "sigma-col": { kind: "string", meta: "NAME|N", help: "column of standard uncertainties of C (same unit as C)" },
  r: { kind: "number", meta: "N", help: "atoms per formula unit for Θ_D and lattice models (default 1)" },
  fix: { kind: "assignments", meta: "p=v,...", help: "hold parameters fixed (display units, as printed: γ in mJ/(mol K²); SI for expressions)" },
  start: { kind: "assignments", meta: "p=v,...", help: "starting values (same units as --fix)" },
  "scale-errors": { kind: "boolean", help: "scale standard errors by χ²_red even with σ given" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};
const USAGE = `usage: heatbook fit FILE [options]\n\n${formatFlagHelp(FLAGS)}`;

export interface LoadedColumns {
  readonly table: ParsedTable;
  readonly x: number[];
  readonly y: number[];
  readonly sigma?: number[];
  readonly names: { x: string; y: string; sigma?: string };
}

/** Find a column by name (case-insensitive) or 1-based number; InputError naming the file otherwise. */
export function findColumn(table: ParsedTable, spec: string, flag: string): number {
  const n = Number(spec);
  if (Number.isInteger(n) && n >= 1 && n <= table.columns.length) return n - 1;
  const hit = table.columns.find((c) => c.name.toLowerCase() === spec.toLowerCase());
  if (!hit) throw new InputError(`--${flag} ${JSON.stringify(spec)}: no such column (columns: ${table.columns.map((c) => c.name).join(", ")})`, { file: table.fileName, field: flag });
  return hit.index;
}

/** Read and parse FILE through the shared importer. */
export function readTable(path: string, io: CliIo): ParsedTable {
  let bytes: Uint8Array;
  try {
    bytes = io.readFile(path);
  } catch (e) {
    throw new InputError(`cannot read ${path}: ${(e as Error).message}`, { file: path });
  }
  return parseDelimited(new TextDecoder().decode(bytes), { fileName: path });
}

function loadHeatCapacity(args: ParsedArgs, io: CliIo) {
  const path = args.positionals[0];
  const table = readTable(path, io);
  const roles = guessColumnRoles(table.columns);
  const pick = (flag: string, role: "temperature" | "heatCapacity" | "sigma") => {
    const given = getString(args, flag);
    if (given !== undefined) return findColumn(table, given, flag);
    return roles[role]?.index;
  };
  const t = pick("t-col", "temperature");
  const c = pick("c-col", "heatCapacity");
  const s = pick("sigma-col", "sigma");
  if (t === undefined || c === undefined) throw new InputError("cannot tell which columns hold T and C: name them with --t-col and --c-col", { file: path });
  const points = extractPoints(table, { temperature: t, heatCapacity: c, ...(s !== undefined && s !== t && s !== c ? { sigma: s } : {}) });
  const cUnit = getString(args, "c-unit") ?? table.columns[c].unitText ?? "J/(mol*K)";
  const where = { file: path, field: getString(args, "c-unit") ? "c-unit" : table.columns[c].name };
  if (heatCapacityBasis(cUnit, where) !== "molar") throw new InputError(`heat capacity in ${JSON.stringify(cUnit)} is not per mole: normalise to J/(mol*K) first`, where);
  const tUnit = table.columns[t].unitText ?? "K";
  return {
    temperatureK: toSI(points.temperature, tUnit, "temperature", { file: path, field: table.columns[t].name }),
    heatCapacity: toSI(points.heatCapacity, cUnit, "heatCapacity", where),
    sigma: points.sigma ? toSI(points.sigma, cUnit, "heatCapacity", where) : undefined,
    columns: { T: table.columns[t].name, C: table.columns[c].name, sigma: s !== undefined ? table.columns[s].name : null, cUnit },
  };
}

function displayParameters(fit: HeatCapacityFitResult) {
  const specs = MODELS[fit.modelName]?.parameters;
  return fit.parameters.map((p) => {
    const spec = specs?.find((q) => q.name === p.name);
    const f = spec?.displayFactor ?? 1;
    return { name: p.name, value: p.value * f, stdError: p.stdError === null ? null : p.stdError * f, unit: spec?.displayUnit ?? p.unit, fixed: p.fixed, atBound: p.atBound };
  });
}

/** Display-unit values (as printed) → SI for a registered model; unknown names pass through to be refused by the engine. */
function fromDisplay(modelName: string, values: Record<string, number>): Record<string, number> {
  const specs = MODELS[modelName].parameters;
  return Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v / (specs.find((p) => p.name === k)?.displayFactor ?? 1)]));
}

/** Θ_D ± σ [K] from β (σ_Θ = Θ σ_β / (3β)), when the model has β > 0. */
function thetaFromBeta(fit: HeatCapacityFitResult) {
  const b = fit.parameters.find((p) => p.name === "beta");
  if (!b || !(b.value > 0)) return null;
  const theta = debyeTemperatureFromBeta(b.value, fit.r);
  return { thetaDK: theta, thetaDStdErrorK: b.stdError === null ? null : (theta * b.stdError) / (3 * b.value), r: fit.r };
}

/** The statistics block of the JSON output. */
export function statistics(fit: FitResult) {
  const { nData, nFree, dof, chiSquare, reducedChiSquare, rSquared, aicc, bic, weighted, errorsScaledByReducedChiSquare, converged, uncertaintiesEstimated, message, evaluations } = fit;
  return { nData, nFree, dof, chiSquare, reducedChiSquare, rSquared, aicc, bic, weighted, errorsScaledByReducedChiSquare, converged, uncertaintiesEstimated, message, evaluations };
}

const num = (v: number | null, d = 6) => (v === null ? "—" : Number(v.toPrecision(d)).toString());

function fitText(fit: HeatCapacityFitResult, file: string): string {
  const lines = [`${file}: model ${fit.modelName}, ${fit.window.nPoints} points in [${fit.window.tMinK ?? "min"}, ${fit.window.tMaxK ?? "max"}] K, ${fit.weighted ? "weighted by σ" : "unweighted"}`];
  for (const p of displayParameters(fit)) lines.push(`  ${p.name.padEnd(8)} ${num(p.value, 8).padStart(14)} ± ${num(p.stdError, 3).padEnd(10)} ${p.unit}${p.fixed ? " (fixed)" : ""}${p.atBound ? " (at bound)" : ""}`);
  const th = thetaFromBeta(fit);
  if (th) lines.push(`  Θ_D      ${num(th.thetaDK, 6).padStart(14)} ± ${num(th.thetaDStdErrorK, 3).padEnd(10)} K (from β, r = ${th.r})`);
  lines.push(`  χ² = ${num(fit.chiSquare)}, χ²_red = ${num(fit.reducedChiSquare)}, dof = ${fit.dof}, R² = ${num(fit.rSquared, 8)}, AICc = ${num(fit.aicc)}, BIC = ${num(fit.bic)}`);
  lines.push(`  ${fit.converged ? "converged" : "NOT converged"}: ${fit.message}`);
  for (const w of fit.warnings) lines.push(`  warning: ${w}`);
  return lines.join("\n");
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
    const data = loadHeatCapacity(args, io);
    const modelArg = getString(args, "model") ?? "sommerfeld";
    const model = Object.hasOwn(MODELS, modelArg) ? modelArg : { expression: modelArg };
    let tMinK = getNumber(args, "t-min");
    let tMaxK = getNumber(args, "t-max");
    let scan: Recommendation | null = null;
    let fitModel = model;
    const toSi = (values: Record<string, number> | undefined) => (values && typeof model === "string" ? fromDisplay(model, values) : values);
    if (getBoolean(args, "scan")) {
      scan = runRecommendation(data, model, { tMinK, tMaxK }, getNumber(args, "r"), toSi(getAssignments(args, "start")));
      if (scan.recommended) [tMinK, tMaxK, fitModel] = [scan.window!.tMinK, scan.window!.tMaxK, recommendedModel(scan, model)];
    }
    // a recommended model other than --model gets no --fix/--start of --model: it starts where the recommendation ended
    const own = fitModel === model;
    const fit = fitHeatCapacity(data, { model: fitModel, tMinK, tMaxK, r: getNumber(args, "r"), fixed: own ? toSi(getAssignments(args, "fix")) : undefined, start: own ? toSi(getAssignments(args, "start")) : recommendedStart(scan!), scaleErrors: getBoolean(args, "scale-errors") });
    if (getBoolean(args, "json")) {
      io.out(JSON.stringify({ file: args.positionals[0], columns: data.columns, model: fit.modelName, window: { tMinK: fit.window.tMinK, tMaxK: fit.window.tMaxK, nPoints: fit.window.nPoints }, parameters: displayParameters(fit), derived: thetaFromBeta(fit), statistics: statistics(fit), correlation: fit.correlation, warnings: fit.warnings, ...(scan ? { scan: recommendationJson(scan, data.sigma !== undefined) } : {}) }));
    } else {
      if (scan) io.out(recommendationText(scan));
      io.out(fitText(fit, args.positionals[0]));
    }
    if (!fit.converged) {
      io.err(`heatbook fit: the fit failed: ${fit.message}`);
      return 1;
    }
    if (scan && !scan.recommended) {
      io.err(`heatbook fit: no recommendation: ${scan.reason}`);
      return 1;
    }
    return 0;
  } catch (e) {
    return reportFailure("fit", e, io.err);
  }
}
