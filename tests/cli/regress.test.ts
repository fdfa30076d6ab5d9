import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { loadNist, lreOrAbs } from "../engine/nistData";

describe("heatbook regress", () => {
  it("heatbook regress fits NIST Misra1a from start 1 to the certified values (NIST StRD, ≥ 6 digits)", async () => {
    const d = loadNist("Misra1a");
    const text = "y x\n" + d.x!.map((x, i) => `${d.y[i]} ${x}`).join("\n") + "\n";
    const r = await runCli(["regress", "m.dat", "--model", "b1*(1-exp(-b2*x))", "--x", "x", "--y", "y", "--start", "b1=500,b2=0.0001", "--json"], { "m.dat": text });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    d.certified.parameters.forEach((c, k) => {
      expect(lreOrAbs(j.parameters[k].value, c.value, 0)).toBeGreaterThanOrEqual(6);
      expect(lreOrAbs(j.parameters[k].stdError, c.stdError, 0)).toBeGreaterThanOrEqual(4);
    });
    expect(j.statistics.converged).toBe(true);
  });
  it("heatbook regress solves a linear expression without a start", async () => {
    const r = await runCli(["regress", "l.csv", "--model", "a + b*x", "--json"], { "l.csv": "x,y\n1,3\n2,5\n3,7.1\n4,8.9\n" });
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(r.out).method).toBe("linear-qr");
  });
  it("heatbook regress exits 2 for a refused expression", async () => {
    const files = { "l.csv": "x,y\n1,3\n2,5\n3,7\n" };
    const refused = await runCli(["regress", "l.csv", "--model", "import(x)"], files);
    expect(refused.code).toBe(2);
    expect(refused.err).toMatch(/function "import" is not allowed.*column 1/);
  });
  it("heatbook regress fits a nonlinear expression without a start (global search)", async () => {
    const files = { "e.csv": "x,y\n0,2\n1,2.7183\n2,3.6945\n3,5.0214\n4,6.8248\n" };
    const r = await runCli(["regress", "e.csv", "--model", "a*exp(b*x)", "--json"], files);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.statistics.converged).toBe(true);
    expect(j.parameters[0].value).toBeCloseTo(2, 3);
    expect(j.parameters[1].value).toBeCloseTo(0.307, 3);
  });
});
