import { describe, expect, it } from "vitest";
import { changeMolarBasis, molarToSample, normalise, specificToMolar } from "../../../lib/engine/corrections";
import { parseFormula } from "../../../lib/engine/chemistry";
import { InputError } from "../../../lib/engine/errors";
import { expectClose } from "../../helpers/expectClose";

const cu = parseFormula("Cu");

describe("normalise", () => {
  it("normalise of 1000 mg of Cu divides by 1/63.546 mol (IUPAC 2021 A_r of Cu)", () => {
    const r = normalise({ temperatureK: [2, 4], heatCapacityJPerK: [1, 2e-3], sigma: [0.01, 1e-5] },
      { massMg: 1000, molarMassGPerMol: cu.molarMassGPerMol, per: "formula-unit" });
    expectClose(r.moles, 1 / 63.546, { rel: 1e-14 });
    expectClose(r.heatCapacityJPerMolK[0], 63.546, { rel: 1e-14 });
    expectClose(r.heatCapacityJPerMolK[1], 0.127092, { rel: 1e-14 });
    expectClose(r.sigma![1], 63.546e-5, { rel: 1e-14 });
    expect(r.per).toBe("formula-unit");
    expect(r.provenance).toMatchObject({ step: "normalisation", method: "sample-to-molar", parameters: { massMg: 1000, per: "formula-unit" } });
  });

  it("normalise per atom divides per formula unit by r (YBa2Cu3O7: r = 13)", () => {
    const y = parseFormula("YBa2Cu3O7");
    const data = { temperatureK: [10], heatCapacityJPerK: [1e-3] };
    const fu = normalise(data, { massMg: 12.5, molarMassGPerMol: y.molarMassGPerMol, per: "formula-unit" });
    const at = normalise(data, { massMg: 12.5, molarMassGPerMol: y.molarMassGPerMol, atomsPerFormulaUnit: y.atomsPerFormulaUnit, per: "atom" });
    expectClose(at.heatCapacityJPerMolK[0], fu.heatCapacityJPerMolK[0] / 13, { rel: 1e-14 });
  });

  it("normalise reports mass and molar-mass uncertainty as one common scale factor, not per point", () => {
    const r = normalise({ temperatureK: [2], heatCapacityJPerK: [1], sigma: [0.01] },
      { massMg: 10, massUncertaintyMg: 0.03, molarMassGPerMol: 63.546, molarMassUncertainty: 0.003, per: "formula-unit" });
    expectClose(r.scaleRelativeUncertainty, Math.hypot(0.003, 0.003 / 63.546), { rel: 1e-14 });
    expectClose(r.sigma![0], 0.01 * 63.546 / 0.01, { rel: 1e-14 });
  });

  it("normalise refuses a non-positive mass or molar mass, a missing r per atom and a bad basis", () => {
    const data = { temperatureK: [2], heatCapacityJPerK: [1] };
    expect(() => normalise(data, { massMg: 0, molarMassGPerMol: 63.546, per: "formula-unit" })).toThrow(/invalid massMg: 0/);
    expect(() => normalise(data, { massMg: 5, molarMassGPerMol: -1, per: "formula-unit" })).toThrow(/invalid molarMassGPerMol/);
    expect(() => normalise(data, { massMg: 5, molarMassGPerMol: 63.546, per: "atom" })).toThrow(/invalid atomsPerFormulaUnit: undefined/);
    expect(() => normalise(data, { massMg: 5, molarMassGPerMol: 63.546, per: "mole" as never })).toThrow(InputError);
    expect(() => normalise(data, { massMg: 5, molarMassGPerMol: 63.546, massUncertaintyMg: -1, per: "formula-unit" })).toThrow(/massUncertaintyMg/);
  });
});

describe("reverse and other bases", () => {
  it("molarToSample undoes normalise", () => {
    const data = { temperatureK: [1, 2, 3], heatCapacityJPerK: [1e-6, 3e-6, 7e-6], sigma: [1e-8, 2e-8, 3e-8] };
    const opts = { massMg: 23.4, molarMassGPerMol: 175.1955, atomsPerFormulaUnit: 4 };
    const back = molarToSample(normalise(data, { ...opts, per: "atom" }), opts);
    back.heatCapacityJPerK.forEach((c, i) => expectClose(c, data.heatCapacityJPerK[i], { rel: 1e-14 }));
    back.sigma!.forEach((s, i) => expectClose(s, data.sigma[i], { rel: 1e-14 }));
  });

  it("changeMolarBasis converts per formula unit to per atom and back", () => {
    const fu = { temperatureK: [5], heatCapacityJPerMolK: [7], sigma: [0.7], per: "formula-unit" as const };
    const at = changeMolarBasis(fu, "atom", 7);
    expect([at.heatCapacityJPerMolK[0], at.per]).toEqual([1, "atom"]);
    expectClose(at.sigma![0], 0.1, { rel: 1e-15 });
    expect(changeMolarBasis(at, "formula-unit", 7).heatCapacityJPerMolK).toEqual([7]);
    expect(changeMolarBasis(fu, "formula-unit", 7).heatCapacityJPerMolK).toEqual([7]);
    expect(() => changeMolarBasis(fu, "atom", 0)).toThrow(InputError);
  });

  it("specificToMolar turns Cu's 0.385 J/(g K) at 298 K into its molar Cp 24.44 J/(mol K) (CRC Handbook, from memory)", () => {
    const r = specificToMolar({ temperatureK: [298.15], heatCapacityJPerKgK: [385] }, { molarMassGPerMol: cu.molarMassGPerMol, per: "formula-unit" });
    expectClose(r.heatCapacityJPerMolK[0], 24.44, { rel: 3e-3 });
    expectClose(r.heatCapacityJPerMolK[0], 385 * 0.063546, { rel: 1e-14 });
  });
});
