/**
 * Value and Jacobian of a whitelisted expression tree in one pass: forward-mode automatic
 * differentiation emitted as straight-line JavaScript. Every tree node becomes one temporary
 * for its value and one per parameter it depends on (dependencies are tracked, so a node that
 * involves only b gets no ∂/∂a line). The generated code therefore has
 *   Σ_nodes |parameters the node depends on|  ≤  nodes × parameters
 * derivative terms — linear in the size of the expression, where symbolic differentiation of
 * nested functions grows exponentially. Compilation refuses (InputError, field "expression")
 * when that count exceeds MAX_DERIVATIVE_TERMS.
 * Rules: the chain rule per node (sum, product, quotient, u^w with constant or variable
 * exponent, exp, log with optional base, log10, sqrt, sin, cos, tan, atan, sinh, cosh, tanh,
 * abs (derivative sign(u)·u′, 0 at u = 0)). Names become `X` (the variable) or `p[k]`, so no
 * user text reaches the source except numeric literals.
 */
import type { MathNode } from "mathjs";
import { InputError } from "../errors";
import { baseSymbols, type SymbolContext } from "./codegen";

/** Limit on derivative terms in the compiled Jacobian (node × parameter pairs). */
export const MAX_DERIVATIVE_TERMS = 20000;

/** out[i] = f(x_i; p), jac[k·m + i] = ∂f/∂p_k(x_i; p) (column-major, m = x.length). */
export type ValueAndJacobian = (x: Float64Array, p: Float64Array, out: Float64Array, jac: Float64Array) => void;

type AnyNode = MathNode & Record<string, unknown>;

interface Emitted {
  /** JS expression (a temporary or a literal) for the value. */
  readonly v: string;
  /** Parameter index → JS expression of the derivative (absent = identically 0). */
  readonly d: ReadonlyMap<number, string>;
}

class Emitter {
  readonly lines: string[] = [];
  terms = 0;
  private next = 0;
  constructor(private readonly symbols: ReadonlyMap<string, string>, private readonly params: ReadonlyMap<string, number>) {}

  temp(expr: string): string {
    const name = `t${this.next++}`;
    this.lines.push(`const ${name}=${expr};`);
    return name;
  }

  derivs(deps: Iterable<number>, rule: (k: number) => string): Map<number, string> {
    const out = new Map<number, string>();
    for (const k of deps) {
      this.terms++;
      if (this.terms > MAX_DERIVATIVE_TERMS) throw new InputError(`invalid expression: its derivatives need more than ${MAX_DERIVATIVE_TERMS} terms (limit on the size of the compiled derivative); simplify it or use fewer parameters`, { field: "expression" });
      out.set(k, this.temp(rule(k)));
    }
    return out;
  }

  node(node: MathNode): Emitted {
    const n = node as AnyNode;
    switch (n.type) {
      case "ConstantNode":
        if (typeof n.value === "number") return { v: `(${String(n.value)})`, d: new Map() };
        break;
      case "SymbolNode": {
        const name = String(n.name);
        const k = this.params.get(name);
        if (k !== undefined) return { v: `p[${k}]`, d: new Map([[k, "1"]]) };
        const s = this.symbols.get(name);
        if (s !== undefined) return { v: s, d: new Map() };
        throw new InputError(`invalid expression: unknown symbol ${name}`, { field: "expression" });
      }
      case "ParenthesisNode":
        return this.node(n.content as MathNode);
      case "OperatorNode":
        return this.operator(String(n.fn), (n.args as MathNode[]).map((a) => this.node(a)));
      case "FunctionNode":
        return this.call(String((n.fn as AnyNode).name), (n.args as MathNode[]).map((a) => this.node(a)));
    }
    throw new InputError(`invalid expression: cannot compile ${n.type}`, { field: "expression" });
  }

  private operator(fn: string, a: Emitted[]): Emitted {
    const [u, w] = a;
    switch (fn) {
      case "unaryPlus":
        return u;
      case "unaryMinus":
        return { v: this.temp(`-${u.v}`), d: this.derivs(u.d.keys(), (k) => `-${u.d.get(k)}`) };
      case "add":
      case "subtract": {
        const s = fn === "add" ? "+" : "-";
        const v = this.temp(`${u.v}${s}${w.v}`);
        return { v, d: this.derivs(union(u, w), (k) => (u.d.has(k) ? (w.d.has(k) ? `${u.d.get(k)}${s}${w.d.get(k)}` : u.d.get(k)!) : `${s === "-" ? "-" : ""}${w.d.get(k)}`)) };
      }
      case "multiply": {
        const v = this.temp(`${u.v}*${w.v}`);
        return { v, d: this.derivs(union(u, w), (k) => [u.d.has(k) ? `${u.d.get(k)}*${w.v}` : "", w.d.has(k) ? `${u.v}*${w.d.get(k)}` : ""].filter(Boolean).join("+")) };
      }
      case "divide": {
        const v = this.temp(`${u.v}/${w.v}`);
        return { v, d: this.derivs(union(u, w), (k) => `(${u.d.get(k) ?? "0"}-${v}*${w.d.get(k) ?? "0"})/${w.v}`) };
      }
      case "pow":
        return this.power(u, w);
    }
    throw new InputError(`invalid expression: cannot compile operator ${fn}`, { field: "expression" });
  }

  private power(u: Emitted, w: Emitted): Emitted {
    const v = this.temp(`Math.pow(${u.v},${w.v})`);
    if (w.d.size === 0) return { v, d: this.derivs(u.d.keys(), (k) => `${w.v}*Math.pow(${u.v},${w.v}-1)*${u.d.get(k)}`) };
    const lu = this.temp(`Math.log(${u.v})`);
    if (u.d.size === 0) return { v, d: this.derivs(w.d.keys(), (k) => `${v}*${lu}*${w.d.get(k)}`) };
    return { v, d: this.derivs(union(u, w), (k) => `${v}*(${w.d.get(k) ?? "0"}*${lu}+${w.v}*${u.d.get(k) ?? "0"}/${u.v})`) };
  }

  private call(name: string, a: Emitted[]): Emitted {
    const [u, b] = a;
    const chain = (value: string, slope: (v: string) => string): Emitted => {
      const v = this.temp(value);
      if (u.d.size === 0) return { v, d: new Map() };
      const s = this.temp(slope(v));
      return { v, d: this.derivs(u.d.keys(), (k) => `${s}*${u.d.get(k)}`) };
    };
    switch (name) {
      case "exp": return chain(`Math.exp(${u.v})`, (v) => v);
      case "log":
        if (a.length === 2) return this.logBase(u, b);
        return chain(`Math.log(${u.v})`, () => `1/${u.v}`);
      case "log10": return chain(`Math.log10(${u.v})`, () => `1/(${u.v}*Math.LN10)`);
      case "sqrt": return chain(`Math.sqrt(${u.v})`, (v) => `0.5/${v}`);
      case "sin": return chain(`Math.sin(${u.v})`, () => `Math.cos(${u.v})`);
      case "cos": return chain(`Math.cos(${u.v})`, () => `-Math.sin(${u.v})`);
      case "tan": return chain(`Math.tan(${u.v})`, (v) => `1+${v}*${v}`);
      case "atan": return chain(`Math.atan(${u.v})`, () => `1/(1+${u.v}*${u.v})`);
      case "sinh": return chain(`Math.sinh(${u.v})`, () => `Math.cosh(${u.v})`);
      case "cosh": return chain(`Math.cosh(${u.v})`, () => `Math.sinh(${u.v})`);
      case "tanh": return chain(`Math.tanh(${u.v})`, (v) => `1-${v}*${v}`);
      case "abs": return chain(`Math.abs(${u.v})`, () => `Math.sign(${u.v})`);
      case "pow": return this.power(u, b);
    }
    throw new InputError(`invalid expression: cannot compile function ${name}`, { field: "expression" });
  }

  private logBase(u: Emitted, b: Emitted): Emitted {
    const lu = this.temp(`Math.log(${u.v})`);
    const lb = this.temp(`Math.log(${b.v})`);
    const v = this.temp(`${lu}/${lb}`);
    return { v, d: this.derivs(union(u, b), (k) => `(${u.d.has(k) ? `${u.d.get(k)}/${u.v}` : "0"}-${v}*${b.d.has(k) ? `${b.d.get(k)}/${b.v}` : "0"})/${lb}`) };
  }
}

function union(a: Emitted, b: Emitted): number[] {
  return [...new Set([...a.d.keys(), ...b.d.keys()])].sort((x, y) => x - y);
}

/** Straight-line value + Jacobian code for `node`; `terms` is the derivative-term count. */
export function compileValueAndJacobian(node: MathNode, variable: string, names: readonly string[], context: SymbolContext = {}): { fn: ValueAndJacobian; terms: number; lines: number } {
  const symbols = baseSymbols(variable, names.length, context);
  const params = new Map(names.map((name, k) => [name, k] as const));
  const em = new Emitter(symbols, params);
  const root = em.node(node);
  const stores = names.map((_, k) => `jac[${k}*m+i]=${root.d.get(k) ?? "0"};`).join("");
  const body = `"use strict"; const m = x.length; for (let i = 0; i < m; i++) { const X = x[i]; ${em.lines.join("")} out[i]=${root.v}; ${stores} }`;
  // Safe: the body is built only from whitelisted node kinds, numeric literals and fixed identifiers.
  const fn = new Function("x", "p", "out", "jac", body) as ValueAndJacobian;
  return { fn, terms: em.terms, lines: em.lines.length };
}
