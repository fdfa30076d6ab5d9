/**
 * Fuzzing the model-expression parser (lib/engine/expression) with fast-check, seeded and
 * bounded: expressions built from a grammar that mixes allowed pieces with the dangerous ones
 * (mathjs's import, evaluate, parse, compile, createUnit, simplify, derivative, config, chain,
 * typed, reviver; JS's constructor, __proto__, prototype, globalThis, process, require;
 * assignments, function definitions, accessors, indexes, objects, strings, blocks, ranges).
 * Property: compileExpression either throws InputError naming the field "expression" or
 * returns a model that evaluates to numbers; every call of a function outside the whitelist,
 * every accessor, index, assignment, string or block is refused. A bare name such as
 * "import" or "constructor" is only a fit parameter (compiled to p[k], never looked up in
 * mathjs or in an object); nothing leaks into the global scope. Arbitrary unicode strings: InputError or a model, never another throw.
 */
import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { compileExpression, MAX_EXPRESSION_LENGTH } from "../../lib/engine/expression";
import { InputError } from "../../lib/engine/errors";

const SEED = 20261202;
const DANGEROUS = ["import", "evaluate", "parse", "compile", "createUnit", "simplify", "derivative", "config", "chain", "typed", "reviver", "constructor", "__proto__", "prototype", "toString", "valueOf", "hasOwnProperty", "globalThis", "process", "require", "eval", "Function", "unit", "help", "matrix"];
const SAFE_SYMBOLS = ["T", "g", "b", "a", "c", "pi", "e", "theta"];
const SAFE_FUNCTIONS = ["exp", "log", "sqrt", "sin", "cos", "abs", "tanh"];

const expr: fc.Arbitrary<string> = fc.letrec((tie) => ({
  leaf: fc.oneof(
    fc.constantFrom(...SAFE_SYMBOLS, ...DANGEROUS),
    fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((v) => String(v)),
    fc.constantFrom('"x"', "'y'", "1 kg", "5 cm", "[1, 2]", "{a: 1}", "1:3", "true", "null", "undefined", "NaN", "Infinity"),
  ),
  node: fc.oneof(
    { depthSize: "small" },
    tie("leaf"),
    fc.tuple(tie("node"), fc.constantFrom("+", "-", "*", "/", "^", "==", "<", " and ", "!", "'", "?", ":", ";", "=", "."), tie("node")).map(([l, op, r]) => `${l}${op}${r}`),
    fc.tuple(fc.constantFrom(...SAFE_FUNCTIONS, ...DANGEROUS), fc.array(tie("node"), { maxLength: 3 })).map(([f, args]) => `${f}(${args.join(", ")})`),
    fc.tuple(tie("node"), fc.constantFrom(...DANGEROUS)).map(([o, k]) => `${o}.${k}`),
    fc.tuple(tie("node"), fc.constantFrom(...DANGEROUS)).map(([o, k]) => `${o}["${k}"]`),
    fc.tuple(fc.constantFrom("f", "g", ...DANGEROUS), tie("node")).map(([n, body]) => `${n}(x) = ${body}`),
    tie("leaf").map((l) => `(${l})`),
  ),
})).node as fc.Arbitrary<string>;

const MUST_REFUSE = new RegExp(`\\b(${DANGEROUS.join("|")})\\s*\\(|\\.[A-Za-z_]|\\[|[^=<>!]=(?!=)|;|"|\\{`);

function check(text: string): void {
  let compiled;
  try {
    compiled = compileExpression(text);
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).field).toBe("expression");
    expect((err as Error).message.length).toBeGreaterThan(10);
    return;
  }
  expect(MUST_REFUSE.test(text), `accepted ${JSON.stringify(text)}`).toBe(false);
  const x = Float64Array.from([1, 2.5, 4]);
  const out = new Float64Array(3);
  compiled.evaluate(x, Float64Array.from(compiled.parameters, () => 0.5), out);
  for (const v of out) expect(typeof v).toBe("number");
}

describe("compileExpression under fuzzing", () => {
  it("compileExpression of grammar-built expressions refuses or yields a safe numeric model", () => {
    fc.assert(fc.property(expr, (text) => { check(text); }), { seed: SEED, numRuns: 1500 });
    expect((globalThis as Record<string, unknown>).pwned).toBeUndefined();
  });

  it("compileExpression of arbitrary unicode text throws only InputError", () => {
    fc.assert(fc.property(fc.string({ unit: "grapheme", maxLength: 120 }), (text) => { check(text); }), { seed: SEED, numRuns: 1500 });
  });

  it("compileExpression of a text over the length cap is refused naming the column", () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 2000 }), (extra) => {
      const text = "g*T" + "+0".repeat(Math.ceil((MAX_EXPRESSION_LENGTH + extra) / 2));
      expect(() => compileExpression(text)).toThrow(InputError);
    }), { seed: SEED, numRuns: 50 });
  });
});
