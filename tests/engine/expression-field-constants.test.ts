/**
 * compileExpression's opt-in extras for joint fits: extra independent variables (the field H),
 * read after the parameters in p, and the named CODATA 2018 constants R, kB, muB, NA (values from
 * CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). Without the options, every
 * letter other than the variable is still a parameter (existing callers unchanged).
 */
import { describe, expect, it } from "vitest";
import { compileExpression } from "../../lib/engine/expression";
import { NAMED_CONSTANTS } from "../../lib/engine/constants";
import { expectClose } from "../helpers/expectClose";

const T = Float64Array.from([0.5, 1, 2, 4]);

describe("compileExpression with extra variables and named constants", () => {
  it("compileExpression without options keeps R, kB, H as parameters", () => {
    expect(compileExpression("R*T + kB*H").parameters).toEqual(["R", "kB", "H"]);
  });

  it("compileExpression with extraVariables [H] reads H after the parameters and gives it no Jacobian column", () => {
    const c = compileExpression("a*T + b*H^2/T^2", { variable: "T", extraVariables: ["H"] });
    expect(c.parameters).toEqual(["a", "b"]);
    expect(c.variables).toEqual(["H"]);
    const p = Float64Array.from([2, 3, 5]);
    const out = new Float64Array(4);
    const jac = new Float64Array(8);
    c.evaluate(T, p, out);
    T.forEach((t, i) => expectClose(out[i], 2 * t + (3 * 25) / (t * t)));
    c.valueAndJacobian(T, p, out, jac);
    T.forEach((t, i) => {
      expectClose(jac[i], t);
      expectClose(jac[4 + i], 25 / (t * t));
    });
    expect(c.linear).toBe(true);
  });

  it("compileExpression with namedConstants uses R, kB, muB, NA as CODATA 2018 values, never as parameters", () => {
    const c = compileExpression("n*R*T + kB*NA*m*T + muB*g", { namedConstants: true });
    expect(c.parameters).toEqual(["n", "m", "g"]);
    expect([...c.constants].sort()).toEqual(["NA", "R", "kB", "muB"]);
    const out = new Float64Array(1);
    c.evaluate(Float64Array.of(2), Float64Array.from([1, 1, 1]), out);
    expectClose(out[0], 8.314462618 * 2 + 1.380649e-23 * 6.02214076e23 * 2 + 9.2740100783e-24, { rel: 1e-9 });
  });

  it("NAMED_CONSTANTS hold the CODATA 2018 values (R = N_A k_B exact, μ_B 9.2740100783(28)e-24 J/T)", () => {
    expect(NAMED_CONSTANTS.kB).toBe(1.380649e-23);
    expect(NAMED_CONSTANTS.NA).toBe(6.02214076e23);
    expect(NAMED_CONSTANTS.muB).toBe(9.2740100783e-24);
    expectClose(NAMED_CONSTANTS.R, 8.314462618, { rel: 1e-10 });
  });

  it("compileExpression refuses an expression whose only letters are the variable, H and constants", () => {
    expect(() => compileExpression("R*T*H", { extraVariables: ["H"], namedConstants: true })).toThrow(/no parameters/);
  });
});
