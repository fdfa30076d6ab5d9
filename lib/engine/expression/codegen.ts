/**
 * Code generation from a whitelisted mathjs tree to a JavaScript loop
 * `(x, p, out) => { for i: out[i] = f(x[i]; p) }`. Only the node kinds that
 * validate.ts admits (plus sech/sign, which mathjs's `derivative` emits) can be emitted;
 * names become `X` (the variable) or `p[k]` (parameters), so no user text reaches the
 * generated source verbatim except numeric literals.
 */
import type { MathNode } from "mathjs";
import { InputError } from "../errors";

const FUNCTIONS: Record<string, (args: string[]) => string> = {
  exp: (a) => `Math.exp(${a[0]})`,
  log: (a) => (a.length === 2 ? `(Math.log(${a[0]})/Math.log(${a[1]}))` : `Math.log(${a[0]})`),
  log10: (a) => `Math.log10(${a[0]})`,
  sqrt: (a) => `Math.sqrt(${a[0]})`,
  sin: (a) => `Math.sin(${a[0]})`,
  cos: (a) => `Math.cos(${a[0]})`,
  tan: (a) => `Math.tan(${a[0]})`,
  atan: (a) => `Math.atan(${a[0]})`,
  sinh: (a) => `Math.sinh(${a[0]})`,
  cosh: (a) => `Math.cosh(${a[0]})`,
  tanh: (a) => `Math.tanh(${a[0]})`,
  sech: (a) => `(1/Math.cosh(${a[0]}))`,
  abs: (a) => `Math.abs(${a[0]})`,
  sign: (a) => `Math.sign(${a[0]})`,
  pow: (a) => `Math.pow(${a[0]},${a[1]})`,
};
const BINARY: Record<string, string> = { add: "+", subtract: "-", multiply: "*", divide: "/" };

type AnyNode = MathNode & Record<string, unknown>;

/** JS source for one node; `symbols` maps names to JS identifiers/expressions. */
export function emit(node: MathNode, symbols: ReadonlyMap<string, string>): string {
  const n = node as AnyNode;
  switch (n.type) {
    case "ConstantNode":
      if (typeof n.value !== "number") break;
      return `(${String(n.value)})`;
    case "SymbolNode": {
      const s = symbols.get(String(n.name));
      if (s === undefined) throw new InputError(`invalid expression: unknown symbol ${String(n.name)}`, { field: "expression" });
      return s;
    }
    case "ParenthesisNode":
      return emit(n.content as MathNode, symbols);
    case "OperatorNode": {
      const args = (n.args as MathNode[]).map((a) => emit(a, symbols));
      const fn = String(n.fn);
      if (fn === "unaryMinus") return `(-${args[0]})`;
      if (fn === "unaryPlus") return `(+${args[0]})`;
      if (fn === "pow") return `Math.pow(${args[0]},${args[1]})`;
      const op = BINARY[fn];
      if (op && args.length === 2) return `(${args[0]}${op}${args[1]})`;
      break;
    }
    case "FunctionNode": {
      const name = String((n.fn as AnyNode).name);
      const gen = FUNCTIONS[name];
      if (gen) return gen((n.args as MathNode[]).map((a) => emit(a, symbols)));
      break;
    }
  }
  throw new InputError(`invalid expression: cannot compile ${n.type}`, { field: "expression" });
}

/** Vectorised evaluator: out[i] = f(x[i]; p). */
export type VectorFunction = (x: Float64Array, p: Float64Array, out: Float64Array, offset?: number) => void;

/** Extra variables (read after the parameters in p) and named constants of a compilation. */
export interface SymbolContext {
  readonly extraVariables?: readonly string[];
  readonly constants?: Readonly<Record<string, number>>;
}

/** Symbol → JS: the variable X, pi, e, named constants as literals, extra variables p[n + j]. */
export function baseSymbols(variable: string, nParameters: number, context: SymbolContext = {}): Map<string, string> {
  const symbols = new Map<string, string>([[variable, "X"], ["pi", "Math.PI"], ["e", "Math.E"]]);
  for (const [name, value] of Object.entries(context.constants ?? {})) symbols.set(name, `(${String(value)})`);
  (context.extraVariables ?? []).forEach((name, j) => symbols.set(name, `p[${nParameters + j}]`));
  return symbols;
}

/** Build a VectorFunction for `node` over variable `variable` and parameters `names`. */
export function compileVector(node: MathNode, variable: string, names: readonly string[], context: SymbolContext = {}): VectorFunction {
  const symbols = baseSymbols(variable, names.length, context);
  names.forEach((name, k) => symbols.set(name, `p[${k}]`));
  const body = emit(node, symbols);
  // Safe: `body` is built only from whitelisted node kinds, numeric literals and fixed identifiers.
  return new Function("x", "p", "out", "offset", `"use strict"; const o = offset || 0; for (let i = 0; i < x.length; i++) { const X = x[i]; out[o + i] = ${body}; }`) as VectorFunction;
}
