/**
 * `heatbook fit A.csv B.csv … --field 0,2,4 --model NAME|EXPR [--shared p,q]`: one model fitted
 * jointly to several files of one sample, each measured in its field (tesla, one value per file,
 * in file order). Parameters named in --shared appear once; the others once per file (JSON keys
 * "name#k", k = the file's position from 1). Models: the joint models (zeeman-schottky, …), the
 * single-curve registry (no field dependence), or an expression in T and H with R, kB, muB, NA
 * (SI). Every file is read with the same column and weighting flags; --t-min/--t-max take one
 * value for all files or one per file. --fix/--start take display units for named models (as
 * printed) and SI for expressions, with keys name or name#k.
 * Exit 0 success, 1 the fit did not converge, 2 bad usage or input (the flag, or file and field).
 */
import type { CliIo } from "../io";
import { getAssignments, getBoolean, getList, getNumber, getString, type ParsedArgs } from "../args";
import { InputError } from "../../engine/errors";
import { describeWeighting, loadHeatCapacity, type LoadedHeatCapacity } from "../data";
import { fitJoint, JOINT_MODELS, type JointFitResult, type JointParameter } from "../../engine/fit";
import { MODELS } from "../../engine/models";
import { formatCount, formatNumber, formatUnit, formatValue } from "../../display/numbers";
import { plainSymbol } from "../../display/typeset";

/** Display facts of a parameter: symbol (plain text), unit and factor (display = SI × factor). */
interface Display {
  readonly symbol: string;
  readonly unit: string;
  readonly factor: number;
}

function displayOf(model: string, name: string): Display {
  const spec = JOINT_MODELS[model]?.parameters.find((p) => p.name === name) ?? MODELS[model]?.parameters.find((p) => p.name === name);
  return spec ? { symbol: plainSymbol(spec.symbol), unit: spec.displayUnit, factor: spec.displayFactor } : { symbol: name, unit: "", factor: 1 };
}

const isNamed = (model: string) => Object.hasOwn(JOINT_MODELS, model) || Object.hasOwn(MODELS, model);

/** Per-file values of a list flag: one value for all, or exactly one per file. */
export function perFile(args: ParsedArgs, flag: string, count: number): (number | undefined)[] {
  const list = getList(args, flag);
  if (list === undefined) return new Array<undefined>(count).fill(undefined);
  if (list.length === 1) return new Array<number>(count).fill(list[0]);
  if (list.length !== count) throw new InputError(`--${flag} has ${list.length} values for ${count} files (give one for all or one per file)`, { field: flag });
  return list;
}

/** The files' fields from --field: required, one finite value per file. */
function fields(args: ParsedArgs, files: readonly string[]): number[] {
  const list = getList(args, "field");
  if (list === undefined) throw new InputError(`--field is required with ${files.length} files: one field in tesla per file, e.g. --field ${files.map((_, k) => 2 * k).join(",")}`, { field: "--field" });
  if (list.length !== files.length) throw new InputError(`--field has ${list.length} value${list.length === 1 ? "" : "s"} for ${files.length} file${files.length === 1 ? "" : "s"} (one field in tesla per file)`, { field: "--field" });
  return list;
}

/** --fix/--start in display units → SI (named models; expressions are SI already). */
function toSi(model: string, values: Record<string, number> | undefined): Record<string, number> | undefined {
  if (!values || !isNamed(model)) return values;
  return Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v / displayOf(model, k.split("#")[0]).factor]));
}

/** An engine error naming measurements[k] → the same error naming file k. */
function relocate(e: unknown, files: readonly string[], loaded: readonly LoadedHeatCapacity[]): unknown {
  if (!(e instanceof InputError)) return e;
  const m = /^measurements\[(\d+)\](?:\.(.*))?$/.exec(e.field ?? "");
  if (!m) {
    const flag = /^(start|fixed)\.(.+)$/.exec(e.field ?? "");
    return flag ? new InputError(e.baseMessage.replace(/\bfixed\./, "--fix ").replace(/\bstart\./, "--start "), { field: flag[1] === "fixed" ? "fix" : "start" }) : e;
  }
  const k = Number(m[1]);
  const message = e.baseMessage.replace(/measurements\[(\d+)\]/g, (_, i: string) => files[Number(i)] ?? `file ${Number(i) + 1}`);
  // the engine counts points from 1; the file's own line numbers are what the user can find
  const line = e.where?.line !== undefined ? (loaded[k]?.lineNumbers[e.where.line - 1] ?? e.where.line) : undefined;
  return new InputError(message.replace(/ at point \d+/, ""), { file: files[k], line, field: m[2] || undefined });
}

/** Run the joint fit of `files`; returns the exit code (errors thrown are reported by the caller). */
export function runJoint(args: ParsedArgs, files: readonly string[], io: CliIo): number {
  if (getBoolean(args, "scan")) throw new InputError("--scan works on one file; fit several files without it", { field: "scan" });
  const fieldT = fields(args, files);
  const modelArg = getString(args, "model");
  if (modelArg === undefined) throw new InputError(`--model is required with several files (e.g. ${Object.keys(JOINT_MODELS).join(", ")}, or an expression in T and H)`, { field: "model" });
  const model = isNamed(modelArg) ? modelArg : { expression: modelArg };
  const sharedText = getString(args, "shared");
  const shared = sharedText === undefined ? undefined : sharedText.split(",").map((s) => s.trim()).filter(Boolean);
  const [tMin, tMax] = [perFile(args, "t-min", files.length), perFile(args, "t-max", files.length)];
  const loaded: LoadedHeatCapacity[] = files.map((file) => loadHeatCapacity({ ...args, positionals: [file] }, io));
  const r = getNumber(args, "r") ?? loaded.find((d) => d.atomsPerFormulaUnit)?.atomsPerFormulaUnit ?? undefined;
  let fit: JointFitResult;
  try {
    fit = fitJoint(
      loaded.map((d, k) => ({ label: files[k], fieldT: fieldT[k], temperatureK: d.temperatureK, heatCapacity: d.heatCapacity, sigma: d.sigma ?? null, tMinK: tMin[k] ?? null, tMaxK: tMax[k] ?? null })),
      { model, shared, r, fixed: toSi(modelArg, getAssignments(args, "fix")), start: toSi(modelArg, getAssignments(args, "start")), scaleErrors: getBoolean(args, "scale-errors") },
    );
  } catch (e) {
    throw relocate(e, files, loaded);
  }
  io.out(getBoolean(args, "json") ? JSON.stringify(jointJson(fit, files)) : jointText(fit, loaded));
  if (!fit.converged) {
    io.err(`heatbook fit: the joint fit failed: ${fit.message}`);
    return 1;
  }
  return 0;
}

/** The --json object: parameters in SI by key (shared by name, the others name#k). */
export function jointJson(fit: JointFitResult, files: readonly string[]) {
  return {
    model: fit.model,
    formula: fit.formula,
    parameters: Object.fromEntries(fit.parameters.map((p) => [p.key, { value: p.value, stdError: p.stdError, unit: p.unit, fixed: p.fixed }])),
    shared: fit.shared,
    perMeasurement: fit.perMeasurement,
    chiSquare: fit.chiSquare,
    dof: fit.dof,
    reducedChiSquare: fit.reducedChiSquare,
    aicc: fit.aicc,
    nPoints: fit.nPoints,
    weighted: fit.weighted,
    converged: fit.converged,
    message: fit.message,
    files: fit.measurements.map((m, k) => ({ file: files[k], fieldT: m.fieldT, nPoints: m.window.nPoints, chiSquare: m.chiSquare })),
    correlation: fit.correlation,
    warnings: fit.warnings,
  };
}

function cell(fit: JointFitResult, p: JointParameter): string {
  const d = displayOf(fit.model, p.name);
  return formatValue(p.value * d.factor, p.stdError === null ? null : p.stdError * d.factor) + (p.fixed ? " (fixed)" : p.atBound ? " (at bound)" : "");
}

function heading(fit: JointFitResult, name: string): string {
  const d = displayOf(fit.model, name);
  const unit = formatUnit(d.unit);
  return unit ? `${d.symbol} (${unit})` : d.symbol;
}

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => [...r[c]].length)));
  return rows.map((r) => "  " + r.map((v, c) => v + " ".repeat(widths[c] - [...v].length)).join("   ").trimEnd());
}

/** The text report: shared parameters, then one row per file, then the statistics. */
export function jointText(fit: JointFitResult, loaded: readonly LoadedHeatCapacity[]): string {
  const how = loaded.map((d) => describeWeighting(d.weighting));
  const weighting = how.every((h) => h === how[0]) ? `${how[0]} (every file)` : loaded.map((d, k) => `${d.file}: ${how[k]}`).join("; ");
  const lines = [`joint fit of ${formatCount(loaded.length, "file")}, model ${fit.model}: ${fit.formula}`, `  ${fit.nPoints} points in the windows, ${weighting}`];
  const shared = fit.parameters.filter((p) => p.measurement === null);
  if (shared.length) {
    lines.push("shared parameters");
    lines.push(...table(shared.map((p) => [heading(fit, p.name), cell(fit, p)])));
  }
  const header = ["file", "H (T)", "points", "window", "χ²", ...fit.perMeasurement.map((n) => heading(fit, n))];
  const rows = fit.measurements.map((m, k) => {
    const own = fit.parameters.filter((p) => p.measurement === k + 1);
    const used = m.temperatureK.filter((_, i) => m.inWindow[i]);
    return [loaded[k].file, formatNumber(m.fieldT, 6), String(m.window.nPoints), `${formatNumber(Math.min(...used))}–${formatNumber(Math.max(...used))} K`, formatNumber(m.chiSquare), ...fit.perMeasurement.map((n) => cell(fit, own.find((p) => p.name === n)!))];
  });
  lines.push(fit.perMeasurement.length ? "per file" : "files");
  lines.push(...table([header, ...rows]));
  const red = fit.weighted ? `χ²_red = ${formatNumber(fit.reducedChiSquare)}` : `residual s.d. = ${formatNumber(Math.sqrt(fit.chiSquare / fit.dof) * 1e3)} mJ mol⁻¹ K⁻¹ (unweighted: no χ²_red)`;
  lines.push(`  χ² = ${formatNumber(fit.chiSquare)}, dof = ${fit.dof}, ${red}, AICc = ${formatNumber(fit.aicc)}`);
  // the engine's sentences name per-file parameters by key (g#2): say which file instead
  const named = (text: string) => text.replace(/\b([A-Za-z_]\w*)#(\d+)\b/g, (key, name: string, k: string) => (loaded[Number(k) - 1] ? `${displayOf(fit.model, name).symbol} of ${loaded[Number(k) - 1].file}` : key));
  lines.push(`  ${fit.converged ? "converged" : "NOT converged"}: ${named(fit.message)}`);
  for (const w of fit.warnings) lines.push(`  warning: ${named(w)}`);
  for (const d of loaded) for (const n of d.notes) lines.push(`  note (${d.file}): ${n}`);
  return lines.join("\n");
}
