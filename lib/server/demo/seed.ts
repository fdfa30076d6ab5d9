/**
 * The demo scenario, seeded once into an empty database. INVENTED: two groups, one account
 * per role, a Nb₁₋ₓMoₓ composition series of six samples with synthetic curves (see
 * curves.ts), an addenda curve, one superconducting sample measured in zero field, in the
 * mixed state (0.25–1.5 T) and in the normal state (2 T, 3 T), a dilute magnetic alloy in
 * 0, 2, 4 and 6 T (fieldCurves.ts), and a copper reference in the second group. Every record says it is demo data.
 */
import type { Db } from "../db/client";
import { hashPassword } from "../auth/password";
import { createGroup } from "../groups";
import { memberOf, type Member } from "../access";
import { createSample } from "../samples";
import { importMeasurement } from "../measurements";
import { seedDemoAnalyses } from "./analyses";
import { addendaHeatCapacity, demoFile, molarHeatCapacity, temperatureGrid, type CurveSpec, type DemoFile } from "./curves";
import { WIDE_RANGE, wideRangeHeatCapacity } from "./wideRange";
import { DEMO_HC2_T, MAGNETIC_ALLOY, MIXED_STATE_FIELDS_T, NORMAL_STATE_FIELDS_T, magneticAlloyHeatCapacity, mixedStateSpec, zeemanGapK } from "./fieldCurves";

export const DEMO_PASSWORD = "heatbook-demo";

export const DEMO_ACCOUNTS = [
  { email: "olga.owner@demo.heatbook", name: "Olga Owner", role: "owner" },
  { email: "arun.analyst@demo.heatbook", name: "Arun Analyst", role: "analyst" },
  { email: "rosa.reviewer@demo.heatbook", name: "Rosa Reviewer", role: "reviewer" },
  { email: "viktor.viewer@demo.heatbook", name: "Viktor Viewer", role: "viewer" },
  { email: "sven.second@demo.heatbook", name: "Sven Second", role: "owner of the second group" },
] as const;

// γ follows 7.7 − 9.2x + 3.4x² mJ mol⁻¹ K⁻² (invented, smooth so the demo's quadratic trend fits).
const SERIES: { x: number; spec: CurveSpec; massMg: number; density: number }[] = [
  { x: 0, massMg: 21.4, density: 8.57, spec: { gammaMJ: 7.7, thetaDK: 276, deltaMJ: 2e-6, tcK: 9.1, residualGammaFraction: 0.03, tcSpreadK: 0.08 } },
  { x: 0.2, massMg: 18.9, density: 8.92, spec: { gammaMJ: 6.0, thetaDK: 298, deltaMJ: 1.5e-6 } },
  { x: 0.4, massMg: 24.1, density: 9.26, spec: { gammaMJ: 4.56, thetaDK: 327, deltaMJ: 1.2e-6 } },
  { x: 0.6, massMg: 19.7, density: 9.55, spec: { gammaMJ: 3.4, thetaDK: 362, deltaMJ: 1e-6 } },
  { x: 0.8, massMg: 22.8, density: 9.86, spec: { gammaMJ: 2.52, thetaDK: 404, deltaMJ: 8e-7 } },
  { x: 1, massMg: 26.3, density: 10.2, spec: { gammaMJ: 1.9, thetaDK: 448, deltaMJ: 6e-7, nuclearAMJ: 0.004 } },
];

function formulaFor(x: number): string {
  if (x === 0) return "Nb";
  if (x === 1) return "Mo";
  return `Nb${+(1 - x).toFixed(2)}Mo${+x.toFixed(2)}`;
}

const UNITS = { temperature: "K", heatCapacity: "µJ/K" };
const MAPPING = { temperature: 0, heatCapacity: 1, sigma: 2 };

async function importDemo(db: Db, member: Member, sampleId: string, file: DemoFile, label: string, fieldT: number, notes: string): Promise<void> {
  await importMeasurement(db, member, sampleId, file.fileName, new TextEncoder().encode(file.text), {
    kind: "sample", label, fieldT, mapping: MAPPING, units: UNITS, notes: `${notes} INVENTED DEMO DATA.`,
  });
}

/**
 * The superconducting sample in field (fieldCurves.ts): the mixed state below the invented
 * H_c2(0) = 1.8 T, then the normal state at 2 T (the demo analysis uses it) and 3 T, in rising
 * field so that the newest-first lists show them in falling field.
 */
async function seedFieldCurves(db: Db, member: Member, sampleId: string, code: string, formula: string, spec: CurveSpec, moles: number, i: number): Promise<void> {
  for (const [k, h] of MIXED_STATE_FIELDS_T.entries()) {
    const mixed = mixedStateSpec(spec, h);
    const file = demoFile(`${code}-${h}T.csv`, `${formula}, ${h} T (mixed state, below the upper critical field)`, temperatureGrid(0.6, 20, 150), (T) => moles * molarHeatCapacity(mixed, T) + addendaHeatCapacity(T), 500 + 10 * i + k);
    await importDemo(db, member, sampleId, file, `${formula}, ${h} T mixed state`, h,
      `Total heat capacity incl. addenda. Mixed state below H_c2(0) = ${DEMO_HC2_T} T (invented): T_c(H) ≈ ${mixed.tcK!.toFixed(2)} K, residual γ(H)/γ_n = ${mixed.residualGammaFraction!.toFixed(3)}, linear in H (fully gapped).`);
  }
  for (const [k, h] of NORMAL_STATE_FIELDS_T.entries()) {
    // 300 + i: the seed of the 2 T curve since the demo began, so that curve is unchanged.
    const file = demoFile(`${code}-${h}T.csv`, `${formula}, ${h} T (above the upper critical field)`, temperatureGrid(1.8, 20, 100), (T) => moles * molarHeatCapacity(spec, T, true) + addendaHeatCapacity(T), 300 + i + 50 * k);
    await importDemo(db, member, sampleId, file, `${formula}, ${h} T normal state`, h, `Normal state in a field above H_c2 (invented H_c2(0) = ${DEMO_HC2_T} T).`);
  }
}

/** The dilute magnetic alloy MA-01 at 0, 2, 4, 6 T (fieldCurves.ts); not part of the Nb–Mo series. */
async function seedMagneticAlloy(db: Db, member: Member): Promise<void> {
  const m = MAGNETIC_ALLOY;
  const sample = await createSample(db, member, {
    label: `MA-01 ${m.label} (demo)`, formula: m.formula, massMg: m.massMg, densityGPerCm3: m.densityGPerCm3,
    notes: "Dilute magnetic alloy, 0.4 at.% Mn in Cu, quenched (invented provenance). Mn moments modelled as free spin-½ doublets with g = 2.04 (a simplification). INVENTED DEMO DATA.",
    tags: ["demo", "magnetic"],
  });
  const moles = (m.massMg * 1e-3) / sample.molarMassGPerMol;
  const temps = temperatureGrid(0.4, 16, 130);
  for (const [k, h] of m.fieldsT.entries()) {
    const file = demoFile(`MA-1-${h}T.csv`, `${m.formula}, ${h} T`, temps, (T) => moles * magneticAlloyHeatCapacity(m.spec, T, h) + addendaHeatCapacity(T), 600 + k);
    await importDemo(db, member, sample.id, file, `${m.label}, ${h} T`, h,
      h === 0 ? "Total heat capacity incl. addenda; zero field: no Zeeman Schottky term." : `Total heat capacity incl. addenda; Zeeman Schottky term with Δ = g μ_B H / k_B ≈ ${zeemanGapK(m.spec.g, h).toFixed(2)} K.`);
  }
}

/** Seed the scenario unless its first account exists. Returns whether it seeded. */
export async function seedDemo(db: Db): Promise<boolean> {
  if (await db.user.findUnique({ where: { email: DEMO_ACCOUNTS[0].email } })) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const users = [];
  for (const a of DEMO_ACCOUNTS) users.push(await db.user.create({ data: { email: a.email, name: a.name, passwordHash } }));
  const [owner, analyst, reviewer, viewer, second] = users as [typeof users[0], typeof users[0], typeof users[0], typeof users[0], typeof users[0]];

  const lab = await createGroup(db, owner.id, { name: "Cryogenic Calorimetry Lab (demo)" });
  await db.membership.createMany({
    data: [
      { userId: analyst.id, groupId: lab.id, role: "analyst" },
      { userId: reviewer.id, groupId: lab.id, role: "reviewer" },
      { userId: viewer.id, groupId: lab.id, role: "viewer" },
    ],
  });
  const labMember = await memberOf(db, analyst.id, lab.slug);
  const addendaSample = await createSample(db, labMember, {
    label: "Platform P-3 addenda (demo)", formula: "Cu", notes: "Empty platform with grease, measured before mounting. INVENTED DEMO DATA.", tags: ["demo", "addenda"],
  });
  const addendaTemps = temperatureGrid(0.45, 22, 90);
  const addenda = demoFile("platform-P3-addenda.csv", "Platform P-3 with grease, empty", addendaTemps, addendaHeatCapacity, 101, 0.006);
  await importMeasurement(db, labMember, addendaSample.id, addenda.fileName, new TextEncoder().encode(addenda.text), {
    kind: "addenda", label: "P-3 addenda, zero field", mapping: MAPPING, units: UNITS, notes: "INVENTED DEMO DATA",
  });

  for (const [i, s] of SERIES.entries()) {
    const formula = formulaFor(s.x);
    const sample = await createSample(db, labMember, {
      label: `NM-${String(i + 1).padStart(2, "0")} ${formula} (demo)`, formula, massMg: s.massMg, densityGPerCm3: s.density,
      compositionVariable: "x", compositionValue: s.x, seriesLabel: "Nb1-xMox (demo)", valences: s.x === 0 ? { Nb: 5 } : s.x === 1 ? { Mo: 6 } : { Nb: 5, Mo: 6 },
      notes: "Arc-melted button, annealed (invented provenance). INVENTED DEMO DATA.", tags: ["demo", "Nb-Mo"],
    });
    const molarMass = sample.molarMassGPerMol;
    const moles = s.massMg * 1e-3 / molarMass;
    const tMin = s.spec.nuclearAMJ ? 0.5 : 1.8;
    const temps = temperatureGrid(tMin, 20, s.spec.tcK ? 160 : 120);
    const file = demoFile(`NM-${i + 1}-zero-field.csv`, `${formula}, zero field`, temps, (T) => moles * molarHeatCapacity(s.spec, T) + addendaHeatCapacity(T), 200 + i);
    await importMeasurement(db, labMember, sample.id, file.fileName, new TextEncoder().encode(file.text), {
      kind: "sample", label: `${formula}, 0 T`, fieldT: 0, mapping: MAPPING, units: UNITS, notes: "Total heat capacity incl. addenda. INVENTED DEMO DATA.",
    });
    if (s.spec.tcK) await seedFieldCurves(db, labMember, sample.id, `NM-${i + 1}`, formula, s.spec, moles, i);
    if (i === 1) {
      // NM-02 also has a wide-range curve for the lattice views (wideRange.ts).
      const w = WIDE_RANGE;
      const wide = demoFile(`NM-${i + 1}-wide-range.csv`, `${formula}, zero field, 2–120 K (addenda subtracted)`, temperatureGrid(w.tMinK, w.tMaxK, w.points), (T) => moles * wideRangeHeatCapacity(s.spec.gammaMJ, s.spec.thetaDK, sample.atomsPerFormulaUnit, T), 700 + i, w.relNoise);
      await importDemo(db, labMember, sample.id, wide, `${formula}, 0 T, 2–120 K`, 0, "Wide-range curve from a second instrument, addenda already subtracted; includes a weak Einstein-like mode (Θ_E = 70 K, invented).");
    }
  }
  await seedMagneticAlloy(db, labMember);

  await seedDemoAnalyses(db, labMember);

  const unit = await createGroup(db, second.id, { name: "Thermal Properties Unit (demo)" });
  const unitMember = await memberOf(db, second.id, unit.slug);
  const cu = await createSample(db, unitMember, { label: "Cu reference (demo)", formula: "Cu", massMg: 45.2, densityGPerCm3: 8.96, valences: { Cu: 1 }, notes: "INVENTED DEMO DATA.", tags: ["demo"] });
  const cuMoles = 45.2e-3 / cu.molarMassGPerMol;
  const cuFile = demoFile("cu-reference.csv", "Cu reference, zero field", temperatureGrid(1.8, 15, 80), (T) => cuMoles * molarHeatCapacity({ gammaMJ: 0.69, thetaDK: 343 }, T), 400);
  await importMeasurement(db, unitMember, cu.id, cuFile.fileName, new TextEncoder().encode(cuFile.text), {
    kind: "sample", label: "Cu, 0 T (addenda subtracted)", mapping: MAPPING, units: UNITS, notes: "INVENTED DEMO DATA.",
  });
  return true;
}
