/**
 * Compile a user model y = f(variable; parameters) written in the mathjs language.
 *
 * Parameters are all symbols other than the variable and the constants pi, e. The
 * Jacobian comes from mathjs's symbolic `derivative` (our own trusted use on an already
 * whitelisted tree). Linearity in the parameters is decided symbolically: the model is
 * linear when every ∂f/∂p_k exists and contains no parameter, so that
 * f = f(x; 0) + Σ_k p_k ∂f/∂p_k(x) exactly; then the fit uses QR instead of LM.
 * Failure modes: InputError for refused or unparsable text (with the column), for a
 * missing variable name clash, or for no parameters.
 */
import { derivative, type MathNode } from "mathjs";
import { InputError } from "../errors";
import { collectSymbols, CONSTANT_SYMBOLS, parseUserExpression } from "./validate";
import { compileVector, type VectorFunction } from "./codegen";

export interface CompiledExpression {
  readonly text: string;
  readonly variable: string;
  readonly parameters: readonly string[];
  /** true when f is affine in every parameter (detected symbolically). */
  readonly linear: boolean;
  readonly evaluate: VectorFunction;
  /** ∂f/∂p_k per parameter, or null when a symbolic derivative is unavailable. */
  readonly jacobian: readonly VectorFunction[] | null;
  /** Linear models only: f(x; p = 0), the part of f free of parameters. */
  readonly offset: VectorFunction | null;
  /** The derivative expressions as text (for display), or null. */
  readonly derivativeText: readonly string[] | null;
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

function tryDerivatives(tree: MathNode, names: readonly string[]): MathNode[] | null {
  try {
    return names.map((name) => derivative(tree, name));
  } catch {
    return null;
  }
}

/** Parse, whitelist and compile `text`. */
export function compileExpression(text: string, options: CompileOptions = {}): CompiledExpression {
  const tree = parseUserExpression(text);
  const symbols = collectSymbols(tree);
  const variable = pickVariable(symbols, options.variable);
  const parameters = symbols.filter((s) => s !== variable && !CONSTANT_SYMBOLS.has(s));
  if (parameters.length === 0) throw new InputError(`invalid expression: ${JSON.stringify(text)} has no parameters to fit`, { field: "expression" });
  const evaluate = compileVector(tree, variable, parameters);
  const dTrees = tryDerivatives(tree, parameters);
  let jacobian: VectorFunction[] | null = null;
  if (dTrees) {
    try {
      jacobian = dTrees.map((d) => compileVector(d, variable, parameters));
    } catch {
      jacobian = null;
    }
  }
  const linear = jacobian !== null && dTrees !== null && dTrees.every((d) => collectSymbols(d).every((s) => !parameters.includes(s)));
  return Object.freeze({
    text,
    variable,
    parameters: Object.freeze(parameters),
    linear,
    evaluate,
    jacobian: jacobian ? Object.freeze(jacobian) : null,
    offset: linear ? evaluate : null,
    derivativeText: dTrees ? Object.freeze(dTrees.map((d) => d.toString())) : null,
  });
}
