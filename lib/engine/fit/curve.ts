/**
 * General regression y = f(x; p) for a user expression (CLI `regress`, NIST checks).
 * The variable is x (or T when only T is used). Linear-in-parameter expressions are solved by QR
 * (no start needed); others by LM from `start`, or without a start (or when LM from it does
 * not converge) by the global search of expressionFit.ts. Units of x, y, σ are the caller's; parameter
 * units are reported as "" (unknown).
 * Failure modes: InputError for unequal lengths, non-finite values, σ ≤ 0, values so large
 * that χ² would overflow, or a start/fixed name that the expression does not use.
 */
import { compileExpression } from "../expression/compile";
import { collectSymbols, parseUserExpression } from "../expression/validate";
import { InputError } from "../errors";
import { fitExpression } from "./expressionFit";
import type { FitResult } from "./result";
import type { LevenbergMarquardtOptions } from "./problem";

export interface FitCurveOptions {
  readonly fixed?: Readonly<Record<string, number>>;
  readonly bounds?: Readonly<Record<string, readonly [number | null, number | null]>>;
  readonly scaleErrors?: boolean;
  readonly variable?: string;
  readonly lm?: LevenbergMarquardtOptions;
}

export { expressionCore } from "./expressionFit";

const MAX_SCALED = 1e150;

/** Check lengths, finiteness and magnitude of x, y, σ; returns Float64Arrays. */
export function checkSeries(x: ArrayLike<number>, y: ArrayLike<number>, sigma: ArrayLike<number> | undefined, names: [string, string, string]) {
  if (x.length !== y.length) throw new InputError(`${names[0]} has ${x.length} values but ${names[1]} has ${y.length}`, { field: names[1] });
  if (sigma && sigma.length !== x.length) throw new InputError(`${names[2]} has ${sigma.length} values but ${names[0]} has ${x.length}`, { field: names[2] });
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i])) throw new InputError(`invalid ${names[0]}: ${x[i]} at point ${i + 1} (not finite)`, { field: names[0], line: i + 1 });
    if (!Number.isFinite(y[i])) throw new InputError(`invalid ${names[1]}: ${y[i]} at point ${i + 1} (not finite)`, { field: names[1], line: i + 1 });
    if (sigma && !(sigma[i] > 0 && Number.isFinite(sigma[i]))) throw new InputError(`invalid ${names[2]}: ${sigma[i]} at point ${i + 1} (must be > 0)`, { field: names[2], line: i + 1 });
  }
  for (let i = 0; i < x.length; i++) {
    // χ² sums squares of y/σ: beyond 1e150 a single term overflows double precision
    const scaled = Math.abs(y[i]) / (sigma ? sigma[i] : 1);
    if (!(scaled < MAX_SCALED)) throw new InputError(`invalid ${names[1]}: ${y[i]} at point ${i + 1} (|${names[1]}|${sigma ? `/${names[2]}` : ""} must stay below 1e150 or χ² overflows: check the unit)`, { field: names[1], line: i + 1 });
  }
  return { x: Float64Array.from(x), y: Float64Array.from(y), sigma: sigma ? Float64Array.from(sigma) : null };
}

/** Fit expression `expression` to (x, y, σ). */
export function fitCurve(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  sigma: ArrayLike<number> | undefined,
  expression: string,
  start: Readonly<Record<string, number>> = {},
  options: FitCurveOptions = {},
): FitResult {
  const data = checkSeries(x, y, sigma, ["x", "y", "sigma"]);
  // the variable is x, or T when the expression uses T and not x
  const symbols = collectSymbols(parseUserExpression(expression));
  const variable = options.variable ?? (!symbols.includes("x") && symbols.includes("T") ? "T" : "x");
  const compiled = compileExpression(expression, { variable });
  const names = compiled.parameters;
  for (const key of [...Object.keys(start), ...Object.keys(options.fixed ?? {}), ...Object.keys(options.bounds ?? {})]) {
    if (!names.includes(key)) throw new InputError(`unknown parameter ${JSON.stringify(key)} (the expression has ${names.join(", ")})`, { field: key });
  }
  const fixed = names.map((n) => options.fixed?.[n] !== undefined);
  const startValues = Float64Array.from(names, (n) => options.fixed?.[n] ?? start[n] ?? NaN);
  const lower = Float64Array.from(names, (n) => options.bounds?.[n]?.[0] ?? -Infinity);
  const upper = Float64Array.from(names, (n) => options.bounds?.[n]?.[1] ?? Infinity);
  return fitExpression(compiled, data.x, data.y, data.sigma, { start: startValues, fixed, lower, upper, scaleErrors: options.scaleErrors ?? false, lm: options.lm });
}
