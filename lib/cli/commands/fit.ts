/**
 * `heatbook fit FILE`: fit a heat-capacity model to a delimited C(T) file.
 * Columns, units, per-gram data and the weighting (--sigma-col N|none, --unweighted,
 * --relative-sigma, --sigma): see lib/cli/data.ts. T in the header's unit or K. Window bounds
 * inclusive. An unweighted fit reports the residual standard deviation instead of χ²_red.
 * Output γ in mJ/(mol K²), β in mJ/(mol K⁴) (display units of each parameter); --fix and
 * --start take the same display units for registered models (SI for expressions) and are
 * checked against the model's parameter bounds.
 * Several files (or --field): a joint fit, see fitJoint.ts.
 * Exit 0 success, 1 the fit failed (reason printed), 2 bad usage or input (what and where).
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getAssignments, getBoolean, getList, getNumber, getString, parseArgs, type FlagSpec, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { DATA_FLAGS, describeWeighting, findColumn, loadHeatCapacity, readTable, type LoadedHeatCapacity } from "../data";
import { checkParameterValues } from "../modelParams";
import { fitHeatCapacity, JOINT_MODELS, type FitResult, type HeatCapacityFitResult } from "../../engine/fit";
import { perFile, runJoint } from "./fitJoint";
import { MODELS, debyeTemperatureFromBeta } from "../../engine/models";
import type { Recommendation } from "../../engine/scan";
import { recommendationJson, recommendationText, recommendedModel, recommendedStart, runRecommendation } from "./fitScan";

const FLAGS: Record<string, FlagSpec> = {
  model: { kind: "string", meta: "NAME|EXPR", help: `model name (${Object.keys(MODELS).join(", ")}; with --field also ${Object.keys(JOINT_MODELS).join(", ")}) or a mathjs expression in T (and H, R, kB, muB, NA with --field); default sommerfeld` },
  "t-min": { kind: "list", meta: "K[,K…]", help: "lower window edge, inclusive (several files: one for all, or one per file)" },
  "t-max": { kind: "list", meta: "K[,K…]", help: "upper window edge, inclusive (several files: one for all, or one per file)" },
  field: { kind: "list", meta: "T,…", help: "applied field of each file in tesla, in file order: fits the files jointly (required with several files)" },
  shared: { kind: "string", meta: "p,q,…", help: "joint fit: parameters shared by all files (default: the model's; γ, β for most); the others are fitted per file as name#k" },
  scan: { kind: "boolean", help: "recommend a model and window (candidates Sommerfeld, +T⁵, +A/T², +Schottky and --model), with statistical and systematic σ; fit them" },
  ...DATA_FLAGS,
  r: { kind: "number", meta: "N", help: "atoms per formula unit for Θ_D and lattice models (default: from --formula, else 1)" },
  fix: { kind: "assignments", meta: "p=v,...", help: "hold parameters fixed (display units, as printed: γ in mJ/(mol K²); SI for expressions)" },
  start: { kind: "assignments", meta: "p=v,...", help: "starting values (same units as --fix)" },
  "scale-errors": { kind: "boolean", help: "scale standard errors by χ²_red even with σ given" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};
const USAGE = `usage: heatbook fit FILE [options]\n       heatbook fit FILE1 FILE2 … --field H1,H2,… --model NAME|EXPR [--shared p,q] [options]\n\nSeveral files (or --field) fit one model to all of them jointly: shared parameters once, the\nothers per file (JSON keys name#k, k = the file's position from 1), SI in --json.\n\n${formatFlagHelp(FLAGS)}`;

/** Re-exported for the commands that read tables the same way (regress). */
export { findColumn, readTable };

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

/**
 * Residual standard deviation √(Σr²/dof) in mJ/(mol K), the spread of an unweighted fit in the
 * data's unit (χ²_red means something only when σ is known); null for a weighted fit or dof = 0.
 */
function residualStdDev(fit: FitResult): { value: number; unit: string } | null {
  if (fit.weighted || !(fit.dof > 0) || fit.chiSquare === null || !Number.isFinite(fit.chiSquare)) return null;
  return { value: Math.sqrt(fit.chiSquare / fit.dof) * 1e3, unit: "mJ/(mol*K)" };
}

function fitText(fit: HeatCapacityFitResult, data: LoadedHeatCapacity): string {
  // The window as the points used span it (the requested edges may lie outside the data).
  const used = fit.window.indices.map((i) => data.temperatureK[i]!);
  const span = used.length ? `${Number(Math.min(...used).toPrecision(6))}–${Number(Math.max(...used).toPrecision(6))} K` : "no points";
  const lines = [`${data.file}: model ${fit.modelName}, ${fit.window.nPoints} points from ${span}, fit variable C, ${describeWeighting(data.weighting)}`];
  if (data.basis.given === "specific") lines.push(`  C converted from ${data.columns.cUnit} with M = ${data.basis.molarMassGPerMol} g/mol${data.basis.formula ? ` (${data.basis.formula})` : ""}: per mole formula unit`);
  for (const p of displayParameters(fit)) lines.push(`  ${p.name.padEnd(8)} ${num(p.value, 8).padStart(14)} ± ${num(p.stdError, 3).padEnd(10)} ${p.unit}${p.fixed ? " (fixed)" : ""}${p.atBound ? " (at bound)" : ""}`);
  const th = thetaFromBeta(fit);
  if (th) lines.push(`  Θ_D      ${num(th.thetaDK, 6).padStart(14)} ± ${num(th.thetaDStdErrorK, 3).padEnd(10)} K (from β, r = ${th.r})`);
  const sd = residualStdDev(fit);
  if (sd) lines.push(`  residual s.d. = ${num(sd.value, 4)} mJ/(mol K) (unweighted: no χ²_red), dof = ${fit.dof}, R² = ${num(fit.rSquared, 8)}, AICc = ${num(fit.aicc)}, BIC = ${num(fit.bic)}`);
  else lines.push(`  χ² = ${num(fit.chiSquare)}, χ²_red = ${num(fit.reducedChiSquare)}, dof = ${fit.dof}, R² = ${num(fit.rSquared, 8)}, AICc = ${num(fit.aicc)}, BIC = ${num(fit.bic)}`);
  lines.push(`  ${fit.converged ? "converged" : "NOT converged"}: ${fit.message}`);
  for (const w of fit.warnings) lines.push(`  warning: ${w}`);
  for (const n of data.notes) lines.push(`  note: ${n}`);
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
    if (args.positionals.length === 0) throw new InputError("missing FILE");
    if (args.positionals.length > 1 || getList(args, "field") !== undefined) return runJoint(args, args.positionals, io);
    if (getString(args, "shared") !== undefined) throw new InputError("--shared applies to a joint fit: give --field (one value per file)", { field: "shared" });
    if (Object.hasOwn(JOINT_MODELS, getString(args, "model") ?? "")) throw new InputError(`model ${getString(args, "model")} needs the field: give --field in tesla`, { field: "--field" });
    const data = loadHeatCapacity(args, io);
    const modelArg = getString(args, "model") ?? "sommerfeld";
    const model = Object.hasOwn(MODELS, modelArg) ? modelArg : { expression: modelArg };
    const r = getNumber(args, "r") ?? data.atomsPerFormulaUnit ?? undefined;
    if (r !== undefined && !(r > 0)) throw new InputError(`invalid --r: ${r} (atoms per formula unit, must be > 0)`, { field: "r" });
    let tMinK = perFile(args, "t-min", 1)[0];
    let tMaxK = perFile(args, "t-max", 1)[0];
    let scan: Recommendation | null = null;
    let fitModel = model;
    const toSi = (values: Record<string, number> | undefined, flag: string) => {
      if (!values || typeof model !== "string") return values;
      const si = fromDisplay(model, values);
      checkParameterValues(MODELS[model], si, flag);
      return si;
    };
    if (getBoolean(args, "scan")) {
      scan = runRecommendation(data, model, { tMinK, tMaxK }, r, toSi(getAssignments(args, "start"), "start"));
      if (scan.recommended) [tMinK, tMaxK, fitModel] = [scan.window!.tMinK, scan.window!.tMaxK, recommendedModel(scan, model)];
    }
    // a recommended model other than --model gets no --fix/--start of --model: it starts where the recommendation ended
    const own = fitModel === model;
    const fit = fitHeatCapacity(data, { model: fitModel, tMinK, tMaxK, r, fixed: own ? toSi(getAssignments(args, "fix"), "fix") : undefined, start: own ? toSi(getAssignments(args, "start"), "start") : recommendedStart(scan!), scaleErrors: getBoolean(args, "scale-errors") });
    if (getBoolean(args, "json")) {
      io.out(JSON.stringify({ file: args.positionals[0], columns: data.columns, weighting: { ...data.weighting, text: describeWeighting(data.weighting) }, basis: data.basis, model: fit.modelName, window: { tMinK: fit.window.tMinK, tMaxK: fit.window.tMaxK, nPoints: fit.window.nPoints }, parameters: displayParameters(fit), derived: thetaFromBeta(fit), statistics: { ...statistics(fit), residualStdDev: residualStdDev(fit) }, correlation: fit.correlation, warnings: fit.warnings, notes: data.notes, ...(scan ? { scan: recommendationJson(scan, data.sigma !== undefined) } : {}) }));
    } else {
      if (scan) io.out(recommendationText(scan));
      io.out(fitText(fit, data));
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
