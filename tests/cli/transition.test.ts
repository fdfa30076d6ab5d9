import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "../engine/uncertainty.random";
import { alphaModelReducedHeatCapacity } from "../../lib/engine/models";

// Invented data with known truth: a BCS-shaped superconductor (α-model at the BCS gap ratio 1.764,
// Padamsee et al. 1973, whose electronic entropy balances at T_c by construction) with a
// non-superconducting fraction f, lattice βT³, a Gaussian spread of T_c and seeded relative noise.
const TRUTH = { gammaN: 5e-3, beta: 2e-4, tc: 4, f: 0.1 };
const cEs = (T: number, tc: number) => TRUTH.gammaN * tc * alphaModelReducedHeatCapacity(T / tc, 1.764);
const jumpRatioTruth = (1 - TRUTH.f) * (alphaModelReducedHeatCapacity(1 - 1e-9, 1.764) - 1);

function file(seed: number, { relNoise = 0.002, spreadK = 0.03, unit = "mJ/(mol K)" as "mJ/(mol K)" | "J/(g K)", molarMass = 92.906, from = 0.4, to = 8, step = 0.04 } = {}): string {
  const z = seededNormal(seed);
  const rows = [`# invented test data (seed ${seed}): T_c = 4 K, γ_n = 5 mJ/(mol K²), β = 0.2 mJ/(mol K⁴), 10 % normal`, `T (K),C (${unit}),dC (${unit})`];
  const us = Array.from({ length: 41 }, (_, k) => -4 + 0.2 * k);
  const ws = us.map((u) => Math.exp((-u * u) / 2));
  const wsum = ws.reduce((a, b) => a + b, 0);
  for (let T = from; T <= to + 1e-9; T += step) {
    const sc = spreadK > 0 ? us.reduce((acc, u, k) => acc + ws[k] * cEs(T, TRUTH.tc + u * spreadK), 0) / wsum : cEs(T, TRUTH.tc);
    const c = TRUTH.f * TRUTH.gammaN * T + (1 - TRUTH.f) * sc + TRUTH.beta * T ** 3;
    const noisy = c * (1 + relNoise * z());
    const f = unit === "J/(g K)" ? 1 / molarMass : 1e3;
    rows.push(`${T.toFixed(4)},${(noisy * f).toPrecision(10)},${(c * relNoise * f).toPrecision(10)}`);
  }
  return rows.join("\n") + "\n";
}

interface Q { name: string; value: number; stdError: number | null; unit: string }
const find = (j: { quantities: Q[] }, name: string) => j.quantities.find((q) => q.name === name) as Q;
const within = (q: Q, truth: number, k = 3) => expect(Math.abs(q.value - truth), `${q.name} = ${q.value} ± ${q.stdError}, truth ${truth}`).toBeLessThanOrEqual(k * (q.stdError ?? 0));

describe("heatbook transition", () => {
  it.each([1, 2, 3])("heatbook transition --normal-above finds T_c, ΔC/(γ_n T_c) and a balanced entropy within 3σ of the truth (seed %i)", async (seed) => {
    const r = await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--json"], { "sc.csv": file(seed) });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    within(find(j, "tc"), TRUTH.tc);
    within(find(j, "jumpRatio"), jumpRatioTruth);
    within(find(j, "gammaN"), TRUTH.gammaN * 1e3);
    within(find(j, "beta"), TRUTH.beta * 1e3);
    within(find(j, "entropyBalance"), 1);
    expect(find(j, "entropyBalance").stdError!).toBeLessThan(0.02);
    expect(find(j, "tc").unit).toBe("K");
    expect(find(j, "deltaC").unit).toBe("mJ mol^-1 K^-1");
    expect(j.normalState.source).toBe("above-tc");
    expect(j.table.columns.map((c: { name: string }) => c.name)).toEqual(["T", "C_el/T"]);
    expect(j.table.rows.length).toBe(191);
    expect(j.idealised.rows.length).toBeGreaterThan(3);
  });

  it("heatbook transition reports the residual γ of the non-superconducting tenth near γ_r/γ_n = 0.1", async () => {
    const j = JSON.parse((await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--json"], { "sc.csv": file(4, { relNoise: 0.001 }) })).out);
    expect(Math.abs(find(j, "nonSuperconductingFraction").value - TRUTH.f)).toBeLessThan(0.01);
    expect(find(j, "gammaResidual").unit).toBe("mJ mol^-1 K^-2");
  });

  it("heatbook transition with --gamma-n/--beta given agrees with the fitted normal state and echoes the source", async () => {
    const data = { "sc.csv": file(5) };
    const fitted = JSON.parse((await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--json"], data)).out);
    const g = find(fitted, "gammaN");
    const b = find(fitted, "beta");
    const given = JSON.parse((await runCli(["transition", "sc.csv", "--gamma-n", `${g.value}±${g.stdError}`, "--beta", `${b.value}±${b.stdError}`, "--json"], data)).out);
    expect(find(given, "tc").value).toBeCloseTo(find(fitted, "tc").value, 9);
    expect(given.normalState.text).toMatch(/^given: --gamma-n/);
  });

  it("heatbook transition --normal-file takes the normal state from a field measurement and says so", async () => {
    const normal = ["T (K),C (mJ/(mol K)),dC (mJ/(mol K))"];
    for (let T = 0.5; T <= 8; T += 0.25) normal.push(`${T},${(TRUTH.gammaN * T + TRUTH.beta * T ** 3) * 1e3},${(TRUTH.gammaN * T + TRUTH.beta * T ** 3) * 2}`);
    const r = await runCli(["transition", "sc.csv", "--normal-file", "field.csv", "--json"], { "sc.csv": file(6), "field.csv": normal.join("\n") });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.normalState.source).toBe("field-above-hc2");
    within(find(j, "tc"), TRUTH.tc);
    expect(j.warnings.join(" ")).toMatch(/field above H_c2/);
  });

  it("heatbook transition on per-gram data with --molar-mass gives the molar result", async () => {
    const molar = JSON.parse((await runCli(["transition", "a.csv", "--normal-above", "4.6", "--json"], { "a.csv": file(7) })).out);
    const perGram = JSON.parse((await runCli(["transition", "b.csv", "--normal-above", "4.6", "--molar-mass", "92.906", "--json"], { "b.csv": file(7, { unit: "J/(g K)" }) })).out);
    // the two files round C to 10 digits in different units: agreement to 1e-6 relative
    for (const name of ["tc", "jumpRatio", "gammaN", "entropyBalance"]) expectClose(find(perGram, name).value, find(molar, name).value, { rel: 1e-6 });
    expect(perGram.basis).toMatchObject({ given: "specific", molarMassGPerMol: 92.906 });
  });

  it("heatbook transition prints a readable table with T_c, the jump ratio and the entropy balance", async () => {
    const r = await runCli(["transition", "sc.csv", "--normal-above", "4.6"], { "sc.csv": file(8) });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/T_c\s+4\.0\d*\(\d+\)\s+K/);
    expect(r.out).toMatch(/ΔC\/\(γ_n T_c\)\s+1\.\d+\(\d+\)/);
    expect(r.out).toMatch(/S_el\/\(γ_n T_u\)\s+[01]\.\d+\(\d+\)/);
    expect(r.out).not.toMatch(/NaN|undefined|null/);
  });

  it("heatbook transition with a normal-state window reaching into the transition warns: residual structure and an unbalanced entropy", async () => {
    const j = JSON.parse((await runCli(["transition", "sc.csv", "--normal-above", "3.5", "--json"], { "sc.csv": file(10) })).out);
    const w = j.warnings.join("\n");
    expect(w).toMatch(/C = γT \+ βT³ on \[3\.5, max\] K: residuals have structure/);
    expect(w).toMatch(/entropy balance S_el\/\(γ_n T_u\) = 0\.\d+ differs from 1 by more than 3σ/);
  });

  it("heatbook transition --lower/--upper/--branch-from set the construction window, and T_c stays within 3σ", async () => {
    const r = await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--lower", "3.6", "--upper", "4.5", "--branch-from", "3", "--branch-degree", "1", "--json"], { "sc.csv": file(11) });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.windows).toEqual({ lowerK: 3.6, upperK: 4.5, branchFromK: 3 });
    within(find(j, "tc"), TRUTH.tc);
    expect(find(j, "entropyNormal").value).toBeCloseTo(find(j, "gammaN").value * 4.5, 9);
  });

  it("heatbook transition exits 2 naming the problem: no normal state, two sources, half a pair, no jump, bad options", async () => {
    const data = { "sc.csv": file(9) };
    const none = await runCli(["transition", "sc.csv"], data);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/normal state is needed: --gamma-n and --beta, or --normal-above/);
    const two = await runCli(["transition", "sc.csv", "--gamma-n", "5", "--beta", "0.2", "--normal-above", "5"], data);
    expect(two.code).toBe(2);
    expect(two.err).toMatch(/choose one normal-state source/);
    const half = await runCli(["transition", "sc.csv", "--gamma-n", "5"], data);
    expect(half.code).toBe(2);
    expect(half.err).toMatch(/missing --beta/);
    const metal = ["T (K),C (mJ/(mol K))", ...Array.from({ length: 40 }, (_, i) => `${1 + i * 0.2},${5 * (1 + i * 0.2) + 0.2 * (1 + i * 0.2) ** 3}`)].join("\n");
    const noJump = await runCli(["transition", "m.csv", "--gamma-n", "5.5", "--beta", "0.2"], { "m.csv": metal });
    expect(noJump.code).toBe(2);
    expect(noJump.err).toMatch(/no superconducting transition.*m\.csv/);
    expect((await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--branch-degree", "3"], data)).err).toMatch(/--branch-degree: 3/);
    expect((await runCli(["transition", "sc.csv", "--normal-above", "4.6", "--residual-below", "1.5"], data)).code).toBe(2);
    const few = await runCli(["transition", "sc.csv", "--normal-above", "7.95"], data);
    expect(few.code).toBe(2);
    expect(few.err).toMatch(/only 2 points of sc\.csv lie in the fit window/);
    expect((await runCli(["transition"])).err).toMatch(/missing FILE/);
  });
});
