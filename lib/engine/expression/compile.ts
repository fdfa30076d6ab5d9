/**
 * Compile a user model y = f(variable; parameters) written in the mathjs language.
 *
 * Parameters are all symbols other than the variable and the constants pi, e (and, when the
 * caller opts in, extra variables such as the field H and the named CODATA constants R, kB,
 * muB, NA). Values come
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
import { NAMED_CONSTANTS } from "../constants";

export interface CompiledExpression {
  readonly text: string;
  readonly variable: string;
  readonly parameters: readonly string[];
  /**
   * Extra independent variables (opt-in, e.g. ["H"]), constant over one vector evaluation:
   * their values follow the parameters in the vector p = [parameters…, variables…] given to
   * evaluate/valueAndJacobian; the Jacobian has columns for the parameters only.
   */
  readonly variables: readonly string[];
  /** Named physical constants (opt-in) the expression uses, e.g. ["R", "muB"]. */
  readonly constants: readonly string[];
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
  /**
   * Extra independent variables (default none: every other letter is a parameter). Their
   * values are appended to the parameter vector at evaluation (see CompiledExpression).
   */
  readonly extraVariables?: readonly string[];
  /**
   * Read R, kB, muB, NA as the CODATA 2018 constants (SI, constants.ts: NAMED_CONSTANTS)
   * instead of parameters (default false, so existing expressions keep their meaning).
   */
  readonly namedConstants?: boolean;
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
  const extra = (options.extraVariables ?? []).filter((v) => v !== variable);
  const named = options.namedConstants ? NAMED_CONSTANTS : {};
  const isConstant = (s: string) => CONSTANT_SYMBOLS.has(s) || Object.hasOwn(named, s);
  const parameters = symbols.filter((s) => s !== variable && !isConstant(s) && !extra.includes(s));
  if (parameters.length === 0) throw new InputError(`invalid expression: ${JSON.stringify(text)} has no parameters to fit`, { field: "expression" });
  const context = { extraVariables: extra, constants: named };
  const evaluate = compileVector(tree, variable, parameters, context);
  const vj = compileValueAndJacobian(tree, variable, parameters, context);
  const lin = linearParameters(tree, parameters);
  const linear = lin.length === parameters.length;
  return Object.freeze({
    text,
    variable,
    parameters: Object.freeze(parameters),
    variables: Object.freeze([...extra]),
    constants: Object.freeze(symbols.filter((s) => Object.hasOwn(named, s))),
    linear,
    linearParameters: Object.freeze(lin),
    evaluate,
    valueAndJacobian: vj.fn,
    jacobian: Object.freeze(columnFunctions(vj.fn, parameters.length)),
    offset: linear ? evaluate : null,
    derivativeTerms: vj.terms,
  });
}
