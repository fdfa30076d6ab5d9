import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";
import { thetaDFromBeta } from "../../lib/engine/derived";

async function cli(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t), readFile: () => new Uint8Array(), env: {} };
  const code = await main(["derive", ...argv], io);
  return { code, out: out.join("\n"), err: err.join("\n") };
}

interface Q { name: string; value: number; stdError: number | null; unit: string }
const find = (json: { quantities: Q[] }, name: string) => json.quantities.find((q) => q.name === name) as Q;

describe("heatbook derive", () => {
  // Cu: γ = 0.695 mJ mol⁻¹ K⁻² (Kittel Table 6.3, from memory), ρ = 8.96 g/cm³ (CRC, from memory).
  it("derive --json for Cu prints quantities with σ and units and no warnings", async () => {
    const r = await cli("--gamma", "0.695±0.005", "--beta", "0.0476+-0.0005", "--formula", "Cu", "--density", "8.96", "--json");
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.warnings).toEqual([]);
    expectClose(find(json, "thetaD").value, thetaDFromBeta(0.0476e-3, 1), { rel: 1e-12 });
    expectClose(find(json, "thetaD").stdError ?? NaN, (find(json, "thetaD").value * 0.0005) / (3 * 0.0476), { rel: 1e-9 });
    expectClose(find(json, "massRatio").value, 1.38, { rel: 0.03 });
    expect(find(json, "gamma").unit).toBe("mJ mol^-1 K^-2");
  });

  it("derive prints a readable table with the basis and the formula facts", async () => {
    const r = await cli("--gamma", "0.695", "--beta", "0.0476", "--formula", "Cu");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/per mole formula unit/);
    expect(r.out).toMatch(/Θ_D\s+344\.\d/);
  });

  it("derive --per atom halves γ for a two-atom formula unit and keeps Θ_D", async () => {
    const fu = JSON.parse((await cli("--gamma", "2", "--beta", "0.2", "--formula", "NbTi", "--json")).out);
    const at = JSON.parse((await cli("--gamma", "2", "--beta", "0.2", "--formula", "NbTi", "--per", "atom", "--json")).out);
    expectClose(find(at, "gamma").value, find(fu, "gamma").value / 2, { rel: 1e-12 });
    expectClose(find(at, "thetaD").value, find(fu, "thetaD").value, { rel: 1e-12 });
    expect(at.basis).toBe("atom");
  });

  it("derive --valence overrides the default electrons per formula unit", async () => {
    const one = JSON.parse((await cli("--gamma", "1.35", "--beta", "0.03", "--formula", "Al", "--density", "2.70", "--valence", "Al=1", "--json")).out);
    const three = JSON.parse((await cli("--gamma", "1.35", "--beta", "0.03", "--formula", "Al", "--density", "2.70", "--valence", "Al=3", "--json")).out);
    expect(three.formula.electronsPerFormulaUnit).toBe(3);
    // γ_free ∝ z/T_F ∝ z/z^{2/3} = z^{1/3}
    expectClose(find(three, "gammaFree").value / find(one, "gammaFree").value, Math.cbrt(3), { rel: 1e-12 });
  });

  it("derive with --band-gamma and --mu-star adds λ and the McMillan T_c", async () => {
    const r = JSON.parse((await cli("--gamma", "7.8±0.1", "--beta", "0.093±0.002", "--formula", "Nb", "--band-gamma", "4.3", "--mu-star", "0.13", "--tc", "9.25", "--json")).out);
    expectClose(find(r, "lambda").value, 7.8 / 4.3 - 1, { rel: 1e-12 });
    expect(find(r, "tcMcMillan").value).toBeGreaterThan(0);
    expect(find(r, "lambdaMcMillan").stdError).toBeGreaterThan(0);
  });

  it("derive exits 2 naming --gamma when its value does not parse", async () => {
    const r = await cli("--gamma", "0.7±x", "--beta", "0.05", "--formula", "Cu");
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/invalid --gamma/);
  });

  it("derive exits 2 naming the missing flag", async () => {
    const r = await cli("--gamma", "0.7", "--formula", "Cu");
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/missing --beta/);
  });

  it("derive exits 2 for a bad formula, a bad --per, and a valence for an absent element", async () => {
    expect((await cli("--gamma", "1", "--beta", "0.1", "--formula", "Xq2")).code).toBe(2);
    const per = await cli("--gamma", "1", "--beta", "0.1", "--formula", "Cu", "--per", "gram");
    expect(per.code).toBe(2);
    expect(per.err).toMatch(/--per/);
    const val = await cli("--gamma", "1", "--beta", "0.1", "--formula", "Cu", "--valence", "Zn=2");
    expect(val.err).toMatch(/--valence/);
  });

  it("derive --help prints the options and exits 0", async () => {
    const r = await cli("--help");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/--band-gamma/);
  });
});
