/**
 * Compile a user model y = f(variable; parameters) written in the mathjs language.
 *
 * Parameters are all symbols other than the variable and the constants pi, e. Values come
 * from generated JS (codegen.ts); value and Jacobian together from forward-mode automatic
 * differentiation (forward.ts), whose size is linear in the expression and capped. The
 * parameters that enter linearly are found on the tree (linearity.ts): `linearParameters` is a
 * set in which f is jointly affine, and the model is `linear` when that set holds every
 * parameter (then the fit uses QR; otherwise the linear ones are solved exactly inside the
 * search over the others).
 * Failure modes: InputError (field "expression") for refused or unparsable text (with the
 * column), for no parameters, or for a limit exceeded (length, nodes, nesting depth,
 * derivative size), each naming the limit.
 */
import type { MathNode } from "mathjs";
import { InputError } from "../errors";
import { collectSymbols, CONSTANT_SYMBOLS, parseUserExpression } from "./validate";
import { compileVector, type VectorFunction } from "./codegen";
import { compileValueAndJacobian, type ValueAndJacobian } from "./forward";
import { linearParameters } from "./linearity";

export interface CompiledExpression {
  readonly text: string;
  readonly variable: string;
  readonly parameters: readonly string[];
  /** true when f is affine in every parameter (decided on the tree). */
  readonly linear: boolean;
  /** Parameters in which f is jointly affine (all of them when `linear`). */
  readonly linearParameters: readonly string[];
  readonly evaluate: VectorFunction;
  /** Value and column-major Jacobian in one pass (forward-mode differentiation). */
  readonly valueAndJacobian: ValueAndJacobian;
  /** ∂f/∂p_k per parameter (each call runs the combined pass; prefer valueAndJacobian). */
  readonly jacobian: readonly VectorFunction[];
  /** Linear models only: f(x; p = 0), the part of f free of parameters. */
  readonly offset: VectorFunction | null;
  /** Number of derivative terms in the compiled Jacobian (bounded by MAX_DERIVATIVE_TERMS). */
  readonly derivativeTerms: number;
}

export interface CompileOptions {
  /** Name of the independent variable; default "T" when used, else "x". */
  readonly variable?: string;
}

function pickVariable(symbols: string[], requested?: string): string {
  if (requested) return requested;
  if (symbols.includes("T")) return "T";
  return "x";
}

function columnFunctions(vj: ValueAndJacobian, n: number): VectorFunction[] {
  return Array.from({ length: n }, (_, k) => (x: Float64Array, p: Float64Array, out: Float64Array, offset = 0) => {
    const m = x.length;
    const jac = new Float64Array(m * n);
    vj(x, p, new Float64Array(m), jac);
    out.set(jac.subarray(k * m, (k + 1) * m), offset);
  });
}

/** Parse, whitelist and compile `text`. */
export function compileExpression(text: string, options: CompileOptions = {}): CompiledExpression {
  const tree: MathNode = parseUserExpression(text);
  const symbols = collectSymbols(tree);
  const variable = pickVariable(symbols, options.variable);
  const parameters = symbols.filter((s) => s !== variable && !CONSTANT_SYMBOLS.has(s));
  if (parameters.length === 0) throw new InputError(`invalid expression: ${JSON.stringify(text)} has no parameters to fit`, { field: "expression" });
  const evaluate = compileVector(tree, variable, parameters);
  const vj = compileValueAndJacobian(tree, variable, parameters);
  const lin = linearParameters(tree, parameters);
  const linear = lin.length === parameters.length;
  return Object.freeze({
    text,
    variable,
    parameters: Object.freeze(parameters),
    linear,
    linearParameters: Object.freeze(lin),
    evaluate,
    valueAndJacobian: vj.fn,
    jacobian: Object.freeze(columnFunctions(vj.fn, parameters.length)),
    offset: linear ? evaluate : null,
    derivativeTerms: vj.terms,
  });
}
