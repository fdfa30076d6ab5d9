import { describe, it, expect } from "vitest";
import { compileExpression, parseUserExpression, MAX_EXPRESSION_LENGTH } from "../../lib/engine/expression";
import { InputError } from "../../lib/engine/errors";
import { expectClose } from "../helpers/expectClose";

function refusal(text: string): InputError {
  try {
    parseUserExpression(text);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error(`accepted: ${text}`);
}

describe("parseUserExpression whitelist", () => {
  it.each([
    ["import({}, {override: true})", /function "import"/],
    ['createUnit("foo")', /literal|function "createUnit"/],
    ['evaluate("1+1")', /literal|function "evaluate"/],
    ["parse(x)", /function "parse"/],
    ["simplify(x)", /function "simplify"/],
    ["derivative(x, x)", /function "derivative"/],
    ["f(x) = x^2", /functionassignment/],
    ["a = 3", /assignment/],
    ["T.constructor", /accessor/],
    ["[1, 2]", /array/],
    ["x > 1 ? 1 : 2", /conditional/],
    ['"hello"', /literal/],
    ["a == b", /operator/],
    ["1:3", /range/],
  ])("parseUserExpression(%s) refuses it", (text, why) => {
    expect(refusal(text).message).toMatch(why);
  });
  it("parseUserExpression names the column of a refused function", () => {
    const e = refusal("g*T + import(b)");
    expect(e.where?.column).toBe(7);
    expect(e.message).toMatch(/column 7/);
  });
  it("parseUserExpression reports the column of a syntax error", () => {
    expect(refusal("g*T + ").where?.column).toBeGreaterThan(0);
  });
  it("parseUserExpression refuses text over the length cap and trees over the node cap", () => {
    expect(refusal("x+".repeat(MAX_EXPRESSION_LENGTH / 2) + "1").message).toMatch(/at most 500/);
    expect(refusal(Array.from({ length: 160 }, () => "1").join("+")).message).toMatch(/nodes/);
  });
  it("parseUserExpression accepts whitelisted functions, unary minus, implicit multiplication and pi", () => {
    expect(() => parseUserExpression("-a*exp(-b*T) + 2T + sqrt(abs(c)) * tanh(pi*T) + pow(T, 2) + log(T, 10)")).not.toThrow();
  });
});

describe("compileExpression", () => {
  it("compileExpression detects linearity in the parameters symbolically", () => {
    expect(compileExpression("g*T + b*T^3 + a/T^2").linear).toBe(true);
    expect(compileExpression("g*T + b*T^3 + 2*T^5").linear).toBe(true);
    expect(compileExpression("g*T + b*T^3*exp(-d/T)").linear).toBe(false);
    expect(compileExpression("a*b*T").linear).toBe(false);
  });
  it("compileExpression lists parameters in order of appearance and picks T as variable", () => {
    const c = compileExpression("g*T + b*T^3 + a/T^2");
    expect(c.variable).toBe("T");
    expect(c.parameters).toEqual(["g", "b", "a"]);
  });
  it("compileExpression evaluates like the formula and its Jacobian matches central differences", () => {
    const c = compileExpression("b1*(1-exp(-b2*x)) + b3*atan(x/b1)", { variable: "x" });
    const x = Float64Array.from([0.5, 1, 2, 7]);
    const p = Float64Array.from([2, 0.3, -1.5]);
    const out = new Float64Array(4);
    c.evaluate(x, p, out, 0);
    x.forEach((xi, i) => expectClose(out[i], 2 * (1 - Math.exp(-0.3 * xi)) - 1.5 * Math.atan(xi / 2), { rel: 1e-15 }));
    c.jacobian!.forEach((d, j) => {
      const g = new Float64Array(4);
      d(x, p, g, 0);
      const h = 1e-6;
      const up = new Float64Array(p);
      const dn = new Float64Array(p);
      up[j] += h;
      dn[j] -= h;
      const fu = new Float64Array(4);
      const fd = new Float64Array(4);
      c.evaluate(x, up, fu, 0);
      c.evaluate(x, dn, fd, 0);
      g.forEach((gi, i) => expectClose(gi, (fu[i] - fd[i]) / (2 * h), { rel: 1e-7, abs: 1e-9 }));
    });
  });
  it("compileExpression throws InputError when there is nothing to fit", () => {
    expect(() => compileExpression("2*T + pi")).toThrow(/no parameters/);
  });
  it("compileExpression keeps hostile symbol names out of the generated code", () => {
    const c = compileExpression("constructor*T + __proto__*T^3");
    const out = new Float64Array(1);
    c.evaluate(Float64Array.from([2]), Float64Array.from([1, 1]), out, 0);
    expect(out[0]).toBe(10);
  });
});

describe("parseUserExpression and names from Object.prototype", () => {
  it.each(["hasOwnProperty(T)", "constructor(T)", "toString()", "__proto__(T)", "valueOf(T)"])("parseUserExpression(%s) refuses the call with InputError", (text) => {
    expect(() => parseUserExpression(text)).toThrow(InputError);
  });
});
