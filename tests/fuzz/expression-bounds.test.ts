/**
 * Bounded work for user expressions (lib/engine/expression, lib/engine/fit/expressionFit.ts),
 * fuzzed with fast-check (seeded): expressions built only from allowed pieces — parameters,
 * T, numbers, + − * / ^, every whitelisted function — nested as deep as the generator goes.
 * Property: compileExpression either refuses with InputError (field "expression", a message
 * naming the limit) or compiles to a value-and-Jacobian pass whose derivative-term count stays
 * within MAX_DERIVATIVE_TERMS and within nodes × parameters (linear size, no exponential
 * growth), and one evaluation of values and Jacobian returns numbers. A sample is also fitted
 * without a start: every fit answers, and its count of model evaluations (search and local
 * fits) stays within the budget the engine sets. Work is asserted as counts, not time.
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { parse } from "mathjs";
import { compileExpression, compileValueAndJacobian, MAX_DERIVATIVE_TERMS, MAX_DEPTH, parseUserExpression } from "../../lib/engine/expression";
import { fitCurve } from "../../lib/engine/fit";
import { InputError } from "../../lib/engine/errors";

const SEED = 20261204;
const FUNCTIONS = ["exp", "log", "log10", "sqrt", "sin", "cos", "tan", "atan", "sinh", "cosh", "tanh", "abs"];

const expr: fc.Arbitrary<string> = fc.letrec((tie) => ({
  leaf: fc.oneof(fc.constantFrom("T", "a", "b", "c", "d", "T", "2", "0.5", "pi"), fc.integer({ min: 1, max: 9 }).map(String)),
  node: fc.oneof(
    { depthSize: "large", maxDepth: 40 },
    tie("leaf"),
    fc.tuple(tie("node"), fc.constantFrom("+", "-", "*", "/", "^"), tie("node")).map(([l, op, r]) => `(${l})${op}(${r})`),
    fc.tuple(fc.constantFrom(...FUNCTIONS), tie("node")).map(([f, a]) => `${f}(${a})`),
    fc.tuple(tie("node"), tie("node")).map(([a, b]) => `pow(${a}, ${b})`),
    fc.tuple(tie("leaf"), tie("node")).map(([a, b]) => `${a}*${b}`),
  ),
})).node as fc.Arbitrary<string>;

/** Chains that nest to a chosen depth: f(f(…(a*T)…)) and products of many factors. */
const deep: fc.Arbitrary<string> = fc.oneof(
  fc.tuple(fc.constantFrom(...FUNCTIONS), fc.integer({ min: 1, max: 70 })).map(([f, k]) => `a*${`${f}(`.repeat(k)}b*T${")".repeat(k)}`),
  fc.integer({ min: 2, max: 60 }).map((k) => Array.from({ length: k }, (_, i) => `(1+c${i}*T)`).join("*")),
  fc.integer({ min: 2, max: 40 }).map((k) => `a*exp(${Array.from({ length: k }, (_, i) => `b${i}*sin(c${i}*T)`).join("+")})`),
);

function nodeCount(text: string): number {
  let n = 0;
  parseUserExpression(text).traverse(() => n++);
  return n;
}

function check(text: string): void {
  let c;
  try {
    c = compileExpression(text);
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).field).toBe("expression");
    return;
  }
  expect(c.derivativeTerms).toBeLessThanOrEqual(MAX_DERIVATIVE_TERMS);
  expect(c.derivativeTerms).toBeLessThanOrEqual(nodeCount(text) * c.parameters.length);
  const x = Float64Array.from([0.5, 1, 2, 7]);
  const out = new Float64Array(4);
  const jac = new Float64Array(4 * c.parameters.length);
  c.valueAndJacobian(x, Float64Array.from(c.parameters, (_, k) => 0.3 + 0.1 * k), out, jac);
  for (const v of [...out, ...jac]) expect(typeof v).toBe("number");
}

describe("user expressions answer with bounded work", () => {
  it("compileExpression of grammar-built expressions refuses or compiles a Jacobian of linear size", () => {
    fc.assert(fc.property(expr, (text) => { check(text); }), { seed: SEED, numRuns: 600 });
  });
  it("compileExpression of deep nesting and long products refuses naming a limit or compiles with few derivative terms", () => {
    fc.assert(fc.property(deep, (text) => {
      try {
        const c = compileExpression(text);
        expect(c.derivativeTerms).toBeLessThanOrEqual(nodeCount(text) * c.parameters.length);
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        expect((err as Error).message).toMatch(/at most|limit|characters/);
      }
    }), { seed: SEED, numRuns: 200 });
  });
  it("compileExpression of 22 nested sin calls (once 33–46 s) compiles with 25 derivative terms", () => {
    const c = compileExpression(`a*${"sin(".repeat(22)}b*T${")".repeat(22)}`);
    expect(c.derivativeTerms).toBe(25);
  });
  it("compileExpression of a product of 40 factors (once past 90 s) compiles with at most nodes × parameters terms", () => {
    const text = Array.from({ length: 40 }, (_, i) => `(1+c${i}*T)`).join("*");
    const c = compileExpression(text);
    expect(c.parameters.length).toBe(40);
    expect(c.derivativeTerms).toBeLessThan(1000);
  });
  it(`compileExpression refuses nesting deeper than ${MAX_DEPTH} levels, naming the limit`, () => {
    const text = `a*${"sin(".repeat(MAX_DEPTH)}T${")".repeat(MAX_DEPTH)}`;
    expect(() => compileExpression(text)).toThrow(/nesting depth \d+, at most 64 allowed/);
  });
  it("compileValueAndJacobian refuses a tree (built past the input limits) whose derivative would exceed MAX_DERIVATIVE_TERMS, naming that limit", () => {
    // within 500 characters, 300 nodes and depth 64 the count stays far below the cap (a safety
    // net); a 260-term chain of sums, parsed directly, has Σ k ≈ 34 000 node × parameter pairs
    const names = Array.from({ length: 260 }, (_, i) => `p${i}`);
    const tree = parse(names.map((n) => `${n}*T`).join("+"));
    expect(() => compileValueAndJacobian(tree, "T", names)).toThrow(/more than 20000 terms \(limit on the size of the compiled derivative\)/);
    expect(compileValueAndJacobian(parse(names.slice(0, 100).map((n) => `${n}*T`).join("+")), "T", names.slice(0, 100)).terms).toBeLessThanOrEqual(MAX_DERIVATIVE_TERMS);
  });
  it("fitCurve without a start on fuzzed expressions always answers within its evaluation budget", () => {
    const x = Array.from({ length: 40 }, (_, i) => 0.5 + 0.25 * i);
    fc.assert(fc.property(fc.oneof(expr, deep), (text) => {
      let c;
      try {
        c = compileExpression(text);
      } catch {
        return;
      }
      const truth = Float64Array.from(c.parameters, (_, k) => 0.7 + 0.2 * k);
      const f = new Float64Array(x.length);
      c.evaluate(Float64Array.from(x), truth, f, 0);
      if (!f.every(Number.isFinite) || f.some((v) => Math.abs(v) > 1e100)) return;
      const y = Array.from(f, (v, i) => v + 1e-3 * Math.sin(5 * i) * (1 + Math.abs(v)));
      const r = fitCurve(x, y, undefined, text, {}, { variable: "T" });
      expect(typeof r.converged).toBe("boolean");
      // search budget (≤ 40 000) + up to 4 local fits of ≤ 2 000 evaluations each
      expect(r.evaluations).toBeLessThanOrEqual(40000 + 4 * 2000 + 10);
    }), { seed: SEED, numRuns: 60 });
  }, 120000);
});
