/**
 * `heatbook regress FILE --model EXPR`: weighted least squares of y = f(x; parameters) for
 * any mathjs expression in x, on two columns of a delimited file (default: the first two;
 * --x/--y/--sigma by name or 1-based number). Linear-in-parameter expressions are solved by
 * QR; others by Levenberg–Marquardt from --start, or without one from a global search.
 * Units are the file's own; parameters are reported without units.
 * Exit 0 success, 1 the fit failed (reason printed), 2 bad usage or input.
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getAssignments, getBoolean, getString, parseArgs, type FlagSpec, reportFailure } from "../args";
import { InputError } from "../../engine/errors";
import { fitCurve } from "../../engine/fit";
import { findColumn, readTable, statistics } from "./fit";

const FLAGS: Record<string, FlagSpec> = {
  model: { kind: "string", meta: "EXPR", help: 'mathjs expression in x, e.g. "b1*(1-exp(-b2*x))" (required)' },
  x: { kind: "string", meta: "COL", help: "x column (name or 1-based number; default 1)" },
  y: { kind: "string", meta: "COL", help: "y column (default 2)" },
  sigma: { kind: "string", meta: "COL", help: "column of standard uncertainties of y" },
  start: { kind: "assignments", meta: "p=v,...", help: "starting values (optional: without them a global search finds the start)" },
  "scale-errors": { kind: "boolean", help: "scale standard errors by χ²_red even with σ given" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};
const USAGE = `usage: heatbook regress FILE --model EXPR [options]\n\n${formatFlagHelp(FLAGS)}`;

const column = (values: Float64Array, lines: Int32Array, name: string, file: string): number[] =>
  Array.from(values, (v, r) => {
    if (!Number.isFinite(v)) throw new InputError(`invalid ${name}: missing or not a number`, { file, line: lines[r], field: name });
    return v;
  });

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    if (args.positionals.length !== 1) throw new InputError(args.positionals.length ? `unexpected argument ${JSON.stringify(args.positionals[1])}` : "missing FILE");
    const expression = getString(args, "model");
    if (!expression) throw new InputError("missing --model EXPR", { field: "model" });
    const file = args.positionals[0];
    const table = readTable(file, io);
    const xi = findColumn(table, getString(args, "x") ?? "1", "x");
    const yi = findColumn(table, getString(args, "y") ?? "2", "y");
    const si = getString(args, "sigma") !== undefined ? findColumn(table, getString(args, "sigma")!, "sigma") : undefined;
    const name = (i: number) => table.columns[i].name;
    const x = column(table.rows[xi], table.lineNumbers, name(xi), file);
    const y = column(table.rows[yi], table.lineNumbers, name(yi), file);
    const sigma = si !== undefined ? column(table.rows[si], table.lineNumbers, name(si), file) : undefined;
    const fit = fitCurve(x, y, sigma, expression, getAssignments(args, "start") ?? {}, { scaleErrors: getBoolean(args, "scale-errors") });
    const parameters = fit.parameters.map((p) => ({ name: p.name, value: p.value, stdError: p.stdError, unit: p.unit }));
    if (getBoolean(args, "json")) io.out(JSON.stringify({ file, model: expression, method: fit.method, parameters, statistics: statistics(fit), correlation: fit.correlation, warnings: fit.warnings }));
    else {
      io.out(`${file}: y = ${expression} (${fit.method}), ${fit.nData} points`);
      for (const p of parameters) io.out(`  ${p.name.padEnd(8)} ${String(p.value).padStart(24)} ± ${p.stdError ?? "—"}`);
      io.out(`  RSS/χ² = ${fit.chiSquare}, χ²_red = ${fit.reducedChiSquare}, dof = ${fit.dof}, R² = ${fit.rSquared}`);
      io.out(`  ${fit.converged ? "converged" : "NOT converged"}: ${fit.message}`);
    }
    if (!fit.converged) {
      io.err(`heatbook regress: the fit failed: ${fit.message}`);
      return 1;
    }
    return 0;
  } catch (e) {
    return reportFailure("regress", e, io.err);
  }
}
