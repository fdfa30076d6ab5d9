/**
 * `heatbook model NAME --set p=v,... --T v,v,...`: evaluate a registered heat-capacity
 * model, C in J/(mol K) per mole formula unit. Parameter values are in each parameter's
 * display unit (γ in mJ/(mol K²), β in mJ/(mol K⁴), temperatures in K: see --help);
 * `r` (atoms per formula unit, default 1) may be set with --set r=N. Unset additive
 * coefficients (gamma, beta, delta, epsilon, A, B) are 0; any other parameter must be set.
 * Parameter values outside the model's bounds (e.g. Θ_D ≤ 0) are refused naming the parameter.
 * The engine (evaluateHeatCapacity) refuses a C that is not finite. Exit 0 success, 2 bad usage or input.
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getAssignments, getBoolean, getList, parseArgs, type FlagSpec, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { evaluateHeatCapacity, getModel, MODELS, type HeatCapacityModel } from "../../engine/models";
import { checkParameterValues } from "../modelParams";

const FLAGS: Record<string, FlagSpec> = {
  set: { kind: "assignments", meta: "p=v,...", help: "parameter values in display units (and r=N)" },
  T: { kind: "list", meta: "K,K,...", help: "temperatures [K] (required)" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};
const ADDITIVE = new Set(["gamma", "beta", "delta", "epsilon", "A", "B"]);

function usage(): string {
  const models = Object.values(MODELS).map((m) => `  ${m.name.padEnd(14)} ${m.formula}\n${" ".repeat(17)}parameters: ${m.parameters.map((p) => `${p.name} [${p.displayUnit}]`).join(", ")}`);
  return `usage: heatbook model NAME --set p=v,... --T v,v,... [--json]\n\n${formatFlagHelp(FLAGS)}\n\nmodels:\n${models.join("\n")}`;
}

function siParameters(model: HeatCapacityModel, set: Record<string, number>): Record<string, number> {
  const known = new Set([...model.parameters.map((p) => p.name), "r"]);
  for (const k of Object.keys(set)) if (!known.has(k)) throw new InputError(`--set ${k}: ${model.name} has no parameter ${k} (it has ${[...known].join(", ")})`, { field: "set" });
  const out: Record<string, number> = {};
  for (const p of model.parameters) {
    const v = set[p.name] !== undefined ? set[p.name] / p.displayFactor : typeof p.fixedByDefault === "number" ? p.fixedByDefault : ADDITIVE.has(p.name) ? 0 : undefined;
    if (v === undefined) throw new InputError(`--set needs ${p.name} (${p.description}, in ${p.displayUnit}) for model ${model.name}`, { field: "set" });
    out[p.name] = v;
  }
  checkParameterValues(model, out, "set");
  return out;
}

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(usage());
      return 0;
    }
    if (args.positionals.length !== 1) throw new InputError(args.positionals.length ? `unexpected argument ${JSON.stringify(args.positionals[1])}` : "missing model NAME");
    const model = getModel(args.positionals[0]);
    const T = getList(args, "T");
    if (!T) throw new InputError("missing --T v,v,...", { field: "T" });
    T.forEach((t) => {
      if (!(t > 0)) throw new InputError(`invalid --T: ${t} (temperatures must be > 0 K)`, { field: "T" });
    });
    const set = getAssignments(args, "set") ?? {};
    const r = set.r ?? 1;
    if (!(r > 0)) throw new InputError(`invalid r: ${r} (must be > 0)`, { field: "set" });
    const params = siParameters(model, set);
    const values = evaluateHeatCapacity(model, T, params, { r });
    if (getBoolean(args, "json")) io.out(JSON.stringify({ model: model.name, formula: model.formula, parameters: params, r, temperatureK: T, unit: "J/(mol*K)", values }));
    else {
      io.out(`${model.name}: ${model.formula}   (C in J/(mol K) per mole formula unit, r = ${r})`);
      T.forEach((t, i) => io.out(`  T = ${String(t).padStart(10)} K   C = ${values[i].toPrecision(10)}`));
    }
    return 0;
  } catch (e) {
    return reportFailure("model", e, io.err);
  }
}
