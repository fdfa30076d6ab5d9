import { describe, it, expect } from "vitest";
import { runCli } from "./cliHarness";
import { expectClose } from "../helpers/expectClose";
import { seededNormal } from "../engine/uncertainty.random";

// Invented normal-metal data with known truth: C = γT + βT³ + δT⁵, so (analytic)
// S(T) = γT + βT³/3 + δT⁵/5 and H(T) − H(0) = γT²/2 + βT⁴/4 + δT⁶/6.
const [G, B, D] = [1.35e-3, 2.04e-5, 2e-9];
const C = (T: number) => G * T + B * T ** 3 + D * T ** 5;
const S = (T: number) => G * T + (B * T ** 3) / 3 + (D * T ** 5) / 5;
const H = (T: number) => (G * T ** 2) / 2 + (B * T ** 4) / 4 + (D * T ** 6) / 6;

function file(seed: number, { relNoise = 0.002, unit = "mJ/(mol K)", factor = 1e3, step = 0.05, shuffle = false } = {}): string {
  const z = seededNormal(seed);
  const rows: string[] = [];
  for (let T = 0.5; T <= 20 + 1e-9; T += step) rows.push(`${T.toFixed(4)},${(C(T) * (1 + relNoise * z()) * factor).toPrecision(12)},${(C(T) * relNoise * factor).toPrecision(12)}`);
  if (shuffle) rows.reverse();
  return `# invented test data (seed ${seed})\nT (K),C (${unit}),dC (${unit})\n${rows.join("\n")}\n`;
}

interface Q { name: string; value: number; stdError: number | null; unit: string }
const find = (j: { quantities: Q[] }, name: string) => j.quantities.find((q) => q.name === name) as Q;

describe("heatbook entropy", () => {
  it.each([1, 2, 3])("heatbook entropy --fit-t-max gives S(T_max) and H(T_max) − H(0) within 3σ of the analytic values (seed %i)", async (seed) => {
    const r = await runCli(["entropy", "m.csv", "--fit-t-max", "3", "--json"], { "m.csv": file(seed) });
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    const s = find(j, "entropyAtTmax");
    const h = find(j, "enthalpyAtTmax");
    expect(s.unit).toBe("J mol^-1 K^-1");
    expect(h.unit).toBe("J mol^-1");
    expect(Math.abs(s.value - S(20))).toBeLessThan(3 * s.stdError!);
    expect(Math.abs(h.value - H(20))).toBeLessThan(3 * h.stdError!);
    expect(s.stdError! / s.value).toBeLessThan(0.005);
    expectClose(find(j, "gammaLowT").value, G * 1e3, { rel: 0.03 });
    expect(j.table.columns.map((c: { name: string }) => c.name)).toEqual(["T", "S", "sigmaS", "H - H(0)", "sigmaH"]);
    expect(j.table.rows).toHaveLength(391);
  });

  it("heatbook entropy with γ and β given uses them below T_min, exactly γT_min + βT_min³/3", async () => {
    const j = JSON.parse((await runCli(["entropy", "m.csv", "--gamma", "1.35±0.01", "--beta", "0.0204±0.0002", "--corr", "-0.9", "--unweighted", "--json"], { "m.csv": file(4, { relNoise: 0 }) })).out);
    const below = find(j, "entropyBelowTmin");
    expectClose(below.value, 1.35e-3 * 0.5 + (2.04e-5 * 0.5 ** 3) / 3, { rel: 1e-12 });
    expect(below.stdError).not.toBeNull();
    expectClose(find(j, "enthalpyBelowTmin").value, (1.35e-3 * 0.25) / 2 + (2.04e-5 * 0.5 ** 4) / 4, { rel: 1e-12 });
    // noise-free data: the trapezoid alone limits the accuracy (step 0.05 K)
    expectClose(find(j, "entropyAtTmax").value, S(20), { rel: 1e-4 });
  });

  it("heatbook entropy --at interpolates inside the data and matches the analytic S and H", async () => {
    const j = JSON.parse((await runCli(["entropy", "m.csv", "--fit-t-max", "3", "--at", "7.333,12", "--json"], { "m.csv": file(5, { relNoise: 0.001 }) })).out);
    expect(find(j, "entropyAt1").value).toBeCloseTo(S(7.333), 4);
    expect(Math.abs(find(j, "entropyAt1").value - S(7.333))).toBeLessThan(3 * find(j, "entropyAt1").stdError!);
    expect(Math.abs(find(j, "enthalpyAt2").value - H(12))).toBeLessThan(3 * find(j, "enthalpyAt2").stdError!);
  });

  it("heatbook entropy gives the same result for per-gram data with --formula, for J units and for reversed rows", async () => {
    const molar = JSON.parse((await runCli(["entropy", "a.csv", "--fit-t-max", "3", "--json"], { "a.csv": file(6) })).out);
    // Cu: M = 63.546 g/mol (IUPAC 2021 standard atomic weight)
    const perGram = JSON.parse((await runCli(["entropy", "b.csv", "--fit-t-max", "3", "--formula", "Cu", "--json"], { "b.csv": file(6, { unit: "J/(g K)", factor: 1 / 63.546 }) })).out);
    const joule = JSON.parse((await runCli(["entropy", "c.csv", "--fit-t-max", "3", "--json"], { "c.csv": file(6, { unit: "J/(mol K)", factor: 1, shuffle: true }) })).out);
    for (const other of [perGram, joule]) {
      expectClose(find(other, "entropyAtTmax").value, find(molar, "entropyAtTmax").value, { rel: 1e-9 });
      expectClose(find(other, "enthalpyAtTmax").stdError!, find(molar, "enthalpyAtTmax").stdError!, { rel: 1e-6 });
    }
    expect(perGram.basis).toMatchObject({ given: "specific", formula: "Cu" });
  });

  it("heatbook entropy prints a readable table and --csv prints every row", async () => {
    const text = await runCli(["entropy", "m.csv", "--fit-t-max", "3"], { "m.csv": file(7) });
    expect(text.code, text.err).toBe(0);
    expect(text.out).toMatch(/S\(20 K\)\s+0\.0\d+\(\d+\)\s+J mol⁻¹ K⁻¹/);
    expect(text.out).toMatch(/every 20th of 391 rows/);
    const csv = await runCli(["entropy", "m.csv", "--fit-t-max", "3", "--csv"], { "m.csv": file(7) });
    const lines = csv.out.trim().split("\n");
    expect(lines[1]).toBe("T (K),S (J mol^-1 K^-1),sigma S (J mol^-1 K^-1),H - H(0) (J mol^-1),sigma H (J mol^-1)");
    expect(lines).toHaveLength(393);
  });

  it("heatbook entropy without σ in the data reports the fit's σ only, and says so", async () => {
    const noSigma = "T (K),C (mJ/(mol K))\n" + Array.from({ length: 60 }, (_, i) => `${1 + i * 0.25},${C(1 + i * 0.25) * 1e3}`).join("\n");
    const r = await runCli(["entropy", "n.csv", "--fit-t-max", "4"], { "n.csv": noSigma });
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/the data carry no σ/);
  });

  it("heatbook entropy exits 2 naming the problem: no low-T fit, half a pair, --at outside, duplicate T, too few fit points", async () => {
    const data = { "m.csv": file(8) };
    const none = await runCli(["entropy", "m.csv"], data);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/needs a low-temperature fit: --fit-t-max K/);
    expect((await runCli(["entropy", "m.csv", "--gamma", "1"], data)).err).toMatch(/missing --beta/);
    expect((await runCli(["entropy", "m.csv", "--gamma", "1", "--beta", "0.1", "--fit-t-max", "3"], data)).code).toBe(2);
    const outside = await runCli(["entropy", "m.csv", "--fit-t-max", "3", "--at", "0.1"], data);
    expect(outside.code).toBe(2);
    expect(outside.err).toMatch(/--at 0\.1: outside the data/);
    const dup = await runCli(["entropy", "d.csv", "--fit-t-max", "3"], { "d.csv": "T (K),C (mJ/(mol K))\n1,1.4\n2,2.9\n2,3.0\n3,4.6\n" });
    expect(dup.code).toBe(2);
    expect(dup.err).toMatch(/two rows at T = 2 K \(lines 3 and 4\)/);
    const few = await runCli(["entropy", "m.csv", "--fit-t-max", "0.55"], data);
    expect(few.code).toBe(2);
    expect(few.err).toMatch(/only 2 points/);
    expect((await runCli(["entropy", "m.csv", "--fit-t-max", "3", "--json", "--csv"], data)).code).toBe(2);
  });
});
