import { describe, it, expect } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { deriveAll, thetaDFromBeta, type DeriveInput } from "../../lib/engine/derived";
import { InputError } from "../../lib/engine/errors";

// Cu: γ = 0.695 mJ mol⁻¹ K⁻² (Kittel Table 6.3, from memory), β = 0.0476 mJ mol⁻¹ K⁻⁴
// (≈ Θ_D 344 K), ρ = 8.96 g/cm³ (CRC, from memory), M = 63.546 g/mol (IUPAC, from memory).
const CU: DeriveInput = {
  gamma: { value: 0.695e-3, stdError: 0.005e-3 },
  beta: { value: 0.0476e-3, stdError: 0.0005e-3 },
  formula: { atomsPerFormulaUnit: 1, molarMassGPerMol: 63.546, electronsPerFormulaUnit: 1, label: "Cu" },
  free: { densityGPerCm3: 8.96 },
};

function get(result: ReturnType<typeof deriveAll>, name: string) {
  const q = result.quantities.find((x) => x.name === name);
  if (!q) throw new Error(`no quantity ${name}`);
  return q;
}

describe("deriveAll", () => {
  it("deriveAll(Cu) gives Θ_D ≈ 344 K, m*/m ≈ 1.38, display units, and no warnings", () => {
    const r = deriveAll(CU);
    expect(r.warnings).toEqual([]);
    expectClose(get(r, "gamma").value, 0.695, { rel: 1e-12 });
    expect(get(r, "gamma").unit).toBe("mJ mol^-1 K^-2");
    expectClose(get(r, "thetaD").value, thetaDFromBeta(0.0476e-3, 1), { rel: 1e-12 });
    expectClose(get(r, "massRatio").value, 1.38, { rel: 0.03 });
    expectClose(get(r, "fermiEnergy").value, 7.0, { rel: 0.015 });
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });

  it("deriveAll uses cov(γ, β) for T* = √(γ/β): positive covariance shrinks σ", () => {
    const s = (cov: number) => get(deriveAll({ ...CU, covGammaBeta: cov }), "crossoverT").stdError ?? NaN;
    const c = 0.9 * 0.005e-3 * 0.0005e-3;
    expect(s(c)).toBeLessThan(s(0));
    expect(s(-c)).toBeGreaterThan(s(0));
  });

  it("deriveAll per atom divides γ, β, D(E_F) by r but leaves Θ_D and m*/m unchanged", () => {
    const compound: DeriveInput = { ...CU, formula: { atomsPerFormulaUnit: 2, molarMassGPerMol: 127.092, electronsPerFormulaUnit: 2 } };
    const fu = deriveAll(compound);
    const atom = deriveAll({ ...compound, basis: "atom" });
    expect(atom.basis).toBe("atom");
    for (const name of ["gamma", "beta", "dosEF", "gammaFree"]) expectClose(get(atom, name).value, get(fu, name).value / 2, { rel: 1e-12 }, name);
    for (const name of ["thetaD", "massRatio", "fermiTemperature"]) expectClose(get(atom, name).value, get(fu, name).value, { rel: 1e-12 }, name);
    expect(get(atom, "dosEF").unit).toMatch(/atom/);
  });

  it("deriveAll warns on negative γ and non-positive β and leaves Θ_D out", () => {
    const r = deriveAll({ ...CU, gamma: { value: -0.1e-3, stdError: 0.01e-3 }, beta: { value: -1e-6, stdError: 1e-7 } });
    expect(r.warnings.join("\n")).toMatch(/negative γ/);
    expect(r.warnings.join("\n")).toMatch(/non-positive β/);
    expect(r.quantities.some((q) => q.name === "thetaD" || q.name === "crossoverT")).toBe(false);
  });

  it("deriveAll flags a heavy-fermion γ and m*/m > 50", () => {
    const r = deriveAll({ ...CU, gamma: { value: 0.4, stdError: 0.01 } });
    expect(r.warnings.some((w) => /heavy-fermion range/.test(w))).toBe(true);
    expect(r.warnings.some((w) => /m\*\/m = .* > 50/.test(w))).toBe(true);
  });

  it("deriveAll flags Θ_D below 100 K and |ρ(γ, β)| > 0.98", () => {
    const r = deriveAll({ ...CU, beta: { value: 3e-3, stdError: 1e-5 }, covGammaBeta: 0.99 * 0.005e-3 * 1e-5 });
    expect(r.warnings.some((w) => /Θ_D = .* below/.test(w))).toBe(true);
    expect(r.warnings.some((w) => /correlation/.test(w))).toBe(true);
  });

  it("deriveAll computes λ and a McMillan T_c whose σ depends on cov(γ, β)", () => {
    const base = { ...CU, gamma: { value: 7.8e-3, stdError: 0.1e-3 }, beta: { value: 0.093e-3, stdError: 0.002e-3 }, gammaBand: { value: 4.3e-3, stdError: null }, muStar: 0.13 };
    const r = deriveAll(base);
    expectClose(get(r, "lambda").value, 7.8 / 4.3 - 1, { rel: 1e-12 });
    const tc = get(r, "tcMcMillan");
    expect(tc.value).toBeGreaterThan(1);
    // ∂T_c/∂γ > 0 and ∂T_c/∂β < 0 (Θ_D falls), so a positive cov(γ, β) reduces σ(T_c).
    const corr = get(deriveAll({ ...base, covGammaBeta: 0.8 * 0.1e-3 * 0.002e-3 }), "tcMcMillan");
    expect(corr.stdError ?? NaN).toBeLessThan(tc.stdError ?? NaN);
  });

  it("deriveAll asks for μ* when γ_band or T_c is given without it", () => {
    const r = deriveAll({ ...CU, tcK: 1.2 });
    expect(r.warnings.some((w) => /give μ\*/.test(w))).toBe(true);
  });

  it("deriveAll adds the Wilson and Kadowaki–Woods ratios when χ and A are given", () => {
    const r = deriveAll({ ...CU, chi: { value: 1e-5, stdError: null, unit: "emu/mol" }, kwA: { value: 1e-6, stdError: null } });
    expect(get(r, "wilsonRatio").unit).toBe("1");
    expect(get(r, "kadowakiWoods").value).toBeGreaterThan(0);
  });

  it("deriveAll cross-checks lattice and density and warns on a > 5 % mismatch", () => {
    const ok = deriveAll({ ...CU, free: { densityGPerCm3: 8.96, lattice: { structure: "fcc", aAngstrom: 3.615 } } });
    expect(ok.warnings).toEqual([]);
    const bad = deriveAll({ ...CU, free: { densityGPerCm3: 8.96, lattice: { structure: "bcc", aAngstrom: 3.615 } } });
    expect(bad.warnings.some((w) => /differs/.test(w))).toBe(true);
  });

  it("deriveAll skips the free-electron part with a warning when z is unknown", () => {
    const r = deriveAll({ ...CU, formula: { atomsPerFormulaUnit: 1, molarMassGPerMol: 63.546 } });
    expect(r.quantities.some((q) => q.name === "massRatio")).toBe(false);
    expect(r.warnings.some((w) => /free-electron comparison skipped/.test(w))).toBe(true);
  });

  it("deriveAll throws InputError on a non-finite γ and on a covariance with |ρ| > 1", () => {
    expect(() => deriveAll({ ...CU, gamma: { value: NaN, stdError: null } })).toThrow(InputError);
    expect(() => deriveAll({ ...CU, covGammaBeta: 1 })).toThrow(/correlation/);
  });
});
