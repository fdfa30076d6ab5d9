/**
 * Fixtures for the review tests: a group with one member per role, a sample, an invented
 * demo curve (C = γT + βT³ with made-up γ, β; not a measurement), and an analysis whose first
 * revision has a data step and a note step with outputs computed by the notebook engine.
 */
import { randomUUID } from "node:crypto";
import type { Db } from "../../lib/server/db/client";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { computeChain, type StepSpec } from "../../lib/engine/notebook";
import { inputHashes, loadContext } from "../../lib/server/notebook/context";
import { ENGINE_VERSION } from "../../lib/engine/version";

export interface ReviewFixture extends GroupFixture {
  sampleId: string;
  measurementId: string;
  fileId: string;
  analysisId: string;
  revisionId: string;
}

const enc = (s: string) => new TextEncoder().encode(s);

/** Invented curve: γ = 1.3 mJ mol⁻¹ K⁻², β = 0.05 mJ mol⁻¹ K⁻⁴ on 0.2 mmol of formula units. */
export function inventedCurve(n = 12): string {
  const lines = ["T (K),C (mJ/K),err (mJ/K)"];
  for (let i = 0; i < n; i++) {
    const t = 2 + i * 0.5;
    const c = 2e-4 * (1.3 * t + 0.05 * t ** 3);
    lines.push(`${t},${c.toPrecision(8)},${(c * 0.01).toPrecision(3)}`);
  }
  return lines.join("\n") + "\n";
}

export async function makeAnalysis(db: Db, g: GroupFixture, sampleId: string, measurementId: string, title = "Cu-like test analysis"): Promise<{ analysisId: string; revisionId: string }> {
  const analyst = g.members.analyst;
  const analysis = await db.analysis.create({ data: { groupId: g.groupId, sampleId, title, createdById: analyst.userId } });
  const rev = await db.analysisRevision.create({ data: { analysisId: analysis.id, number: 1, createdById: analyst.userId } });
  await writeSteps(db, g.groupId, sampleId, rev.id, [
    { id: "", kind: "data", config: { measurementIds: [measurementId], tMinK: null, tMaxK: 6, excluded: [] } },
    { id: "", kind: "note", config: { markdown: "first look" } },
  ]);
  return { analysisId: analysis.id, revisionId: rev.id };
}

/** Replace a revision's steps and store their computed outputs (what the notebook module will do). */
export async function writeSteps(db: Db, groupId: string, sampleId: string, revisionId: string, given: StepSpec[]): Promise<void> {
  const specs = given.map((s) => ({ ...s, id: randomUUID() }));
  const ctx = await loadContext(db, groupId, sampleId, specs);
  const outputs = computeChain(specs, ctx);
  const hashes = inputHashes(specs, ctx);
  await db.step.deleteMany({ where: { revisionId } });
  for (const [i, s] of specs.entries())
    await db.step.create({
      data: {
        id: s.id, revisionId, position: i, kind: s.kind, config: s.config as object, inputHash: hashes[i]!,
        output: JSON.parse(JSON.stringify({ ...outputs[i]!, state: undefined })), engineVersion: ENGINE_VERSION, computedAt: new Date(),
      },
    });
}

export async function makeReviewFixture(db: Db): Promise<ReviewFixture> {
  const g = await makeGroup(db, "Review group");
  // 2e-4 mol of Cu (IUPAC 2021 abridged: 63.546 g/mol) — matches the invented curve's scale.
  const sample = await createSample(db, g.members.analyst, { label: "RV-1", formula: "Cu", massMg: 0.2 * 63.546 });
  const m = await importMeasurement(db, g.members.analyst, sample.id, "invented.csv", enc(inventedCurve()), {
    kind: "sample", label: "zero field (invented)", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "mJ/K" },
  });
  const row = await db.measurement.findUniqueOrThrow({ where: { id: m.id }, select: { fileId: true } });
  const { analysisId, revisionId } = await makeAnalysis(db, g, sample.id, m.id);
  return { ...g, sampleId: sample.id, measurementId: m.id, fileId: row.fileId, analysisId, revisionId };
}

/** A full chain: data → normalisation → Sommerfeld fit over 2–6 K → derived quantities. */
export function fullChain(measurementId: string, tMaxK = 6): StepSpec[] {
  return [
    { id: "", kind: "data", config: { measurementIds: [measurementId] } },
    { id: "", kind: "normalise", config: { per: "formula-unit" } },
    { id: "", kind: "fit", config: { model: "sommerfeld", tMaxK, compare: [] } },
    { id: "", kind: "derive", config: {} },
  ];
}
