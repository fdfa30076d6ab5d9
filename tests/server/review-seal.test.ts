/**
 * Sealing on approval: the snapshot holds the complete inputs and outputs, its content hash is
 * SHA-256 of its canonical JSON, verification recomputes the hash and re-runs the engine, stale
 * chains cannot be approved, and a step write racing an approval loses.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { reviewTransition, reproduceSnapshot, verifyRevision, type RevisionSnapshot, type ReviewAction } from "../../lib/server/review";
import { contentHash, sha256Hex } from "../../lib/server/hash";
import { updateSample } from "../../lib/server/samples";
import { updateStep } from "../../lib/server/notebook";
import { inventedCurve } from "./reviewFixtures";
import { ENGINE_VERSION } from "../../lib/engine/version";
import type { Role } from "../../lib/server/permissions";

let t: TestDatabase;
let f: ReviewFixture;
let sealedId: string;
let analysisId: string;

async function act(role: Role, action: ReviewAction, r: { analysisId: string; revisionId: string }, comment?: string) {
  const v = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).version;
  return reviewTransition(t.db, f.members[role], r.analysisId, r.revisionId, { action, version: v, ...(comment ? { comment } : {}), ...(action === "approve" ? { ...SIGN, comment: comment ?? "checked the fit window and residuals" } : {}) });
}

async function fullAnalysis(title: string) {
  const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, title);
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  return r;
}

beforeAll(async () => {
  t = await freshDatabase();
  f = await makeReviewFixture(t.db);
  const r = await fullAnalysis("sealed one");
  await act("analyst", "submit", r);
  await act("reviewer", "approve", r);
  sealedId = r.revisionId;
  analysisId = r.analysisId;
});
afterAll(async () => { await t.drop(); });

describe("approve seals the revision", () => {
  it("approve stores a snapshot whose SHA-256 of canonical JSON is the content hash, with reviewer and time", async () => {
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: sealedId } });
    expect(rev.state).toBe("sealed");
    expect(rev.contentHash).toBe(contentHash(rev.snapshot));
    expect(rev.sealedById).toBe(f.members.reviewer.userId);
    const s = rev.snapshot as unknown as RevisionSnapshot;
    expect(s.seal).toEqual({ sealedById: f.members.reviewer.userId, sealedAt: rev.sealedAt!.toISOString() });
    expect(s.engineVersion).toBe(ENGINE_VERSION);
  });

  it("the snapshot holds every step's kind, position, config, input hash, engine version and output", async () => {
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: sealedId }, include: { steps: { orderBy: { position: "asc" } } } });
    const s = rev.snapshot as unknown as RevisionSnapshot;
    expect(s.inputs.steps.map((x) => [x.position, x.kind])).toEqual([[0, "data"], [1, "normalise"], [2, "fit"], [3, "derive"]]);
    rev.steps.forEach((row, i) => {
      expect(s.inputs.steps[i]).toMatchObject({ id: row.id, config: row.config, inputHash: row.inputHash, engineVersion: row.engineVersion });
      expect(s.outputs.steps[i]!.output).toEqual(row.output);
    });
    expect(s.outputs.steps[2]!.output.ok).toBe(true);
  });

  it("the snapshot holds each measurement's original-file checksum, points, units and mapping, and the sample fields used", async () => {
    const s = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: sealedId } })).snapshot as unknown as RevisionSnapshot;
    const file = await t.db.storedFile.findUniqueOrThrow({ where: { id: f.fileId } });
    expect(s.inputs.measurements.length).toBe(1);
    const m = s.inputs.measurements[0]!;
    expect(m.file.sha256).toBe(sha256Hex(file.bytes));
    expect(m.points.temperatureK.length).toBe(12);
    expect(m.points.temperatureK[0]).toBe(2);
    expect(m.points.heatCapacity[0]).toBe(2e-7 * (1.3 * 2 + 0.05 * 8)); // invented curve, mJ → J
    expect(m.units).toEqual({ temperature: "K", heatCapacity: "mJ/K" });
    expect(m.columnMapping).toEqual({ temperature: 0, heatCapacity: 1, sigma: 2 });
    expect(s.inputs.sample.massMg).toBe(0.2 * 63.546);
    expect(s.inputs.sampleFieldsUsed).toEqual(expect.arrayContaining(["massMg", "molarMassGPerMol", "atomsPerFormulaUnit", "formula"]));
  });

  it("approve records the measurement in RevisionMeasurement, so the database locks it", async () => {
    const rows = await t.db.revisionMeasurement.findMany({ where: { revisionId: sealedId } });
    expect(rows.map((r) => r.measurementId)).toEqual([f.measurementId]);
  });
});

describe("verifyRevision", () => {
  it("verifyRevision recomputes the hash and reproduces every step exactly under the same engine", async () => {
    const v = await verifyRevision(t.db, f.members.viewer, analysisId, sealedId);
    expect(v).toMatchObject({ ok: true, hashMatches: true, tolerance: 0 });
    expect(v.files).toEqual([expect.objectContaining({ measurementId: f.measurementId, matches: true })]);
    expect(v.steps.map((s) => [s.kind, s.outcome, s.inputHashReproduced])).toEqual([["data", "identical", true], ["normalise", "identical", true], ["fit", "identical", true], ["derive", "identical", true]]);
  });

  it("reproduceSnapshot with a perturbed stored γ says differs under the same engine, within tolerance across versions", async () => {
    const s = structuredClone((await t.db.analysisRevision.findUniqueOrThrow({ where: { id: sealedId } })).snapshot) as unknown as RevisionSnapshot;
    const fit = (s.outputs.steps[2]!.output.result as unknown as { fit: { parameters: { value: number }[] } }).fit;
    fit.parameters[0]!.value *= 1 + 1e-12;
    const same = reproduceSnapshot(s);
    expect(same[2]).toMatchObject({ outcome: "differs", firstDifference: "result.fit.parameters[0].value" });
    expect(same[0]!.outcome).toBe("identical");
    const other = reproduceSnapshot({ ...s, engineVersion: "0.0.1-older" });
    expect(other[2]!.outcome).toBe("within-tolerance");
    expect(other[2]!.maxRelDiff).toBeGreaterThan(5e-13);
    expect(other[2]!.maxRelDiff).toBeLessThan(2e-12);
    fit.parameters[0]!.value *= 1 + 1e-6;
    expect(reproduceSnapshot({ ...s, engineVersion: "0.0.1-older" })[2]!.outcome).toBe("differs");
  });

  it("verifyRevision of a snapshot altered behind the triggers reports the hash mismatch", async () => {
    const r = await fullAnalysis("to tamper");
    await act("analyst", "submit", r);
    await act("owner", "approve", r);
    const c = new pg.Client({ connectionString: t.ownerUrl });
    await c.connect();
    try {
      await c.query(`ALTER TABLE "AnalysisRevision" DISABLE TRIGGER "AnalysisRevision_lock"`);
      await c.query(`UPDATE "AnalysisRevision" SET snapshot = jsonb_set(snapshot, '{inputs,sample,massMg}', '13') WHERE id = $1`, [r.revisionId]);
      await c.query(`ALTER TABLE "AnalysisRevision" ENABLE TRIGGER "AnalysisRevision_lock"`);
    } finally {
      await c.end();
    }
    const v = await verifyRevision(t.db, f.members.owner, r.analysisId, r.revisionId);
    expect(v).toMatchObject({ ok: false, hashMatches: false, summary: expect.stringMatching(/does not match its content hash/) });
    // and the engine, re-run with the altered mass, no longer reproduces the normalised data
    expect(v.steps[1]!.outcome).toBe("differs");
  });

  it("verifyRevision of a revision that is not sealed is refused as a conflict", async () => {
    const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "open");
    await expect(verifyRevision(t.db, f.members.owner, r.analysisId, r.revisionId)).rejects.toMatchObject({ name: "ConflictError" });
  });
});

describe("approve refuses what cannot be sealed", () => {
  it("approve after the sample's mass changed (normalisation stale) is refused naming the step", async () => {
    const r = await fullAnalysis("goes stale");
    await act("analyst", "submit", r);
    const s = await t.db.sample.findUniqueOrThrow({ where: { id: f.sampleId } });
    await updateSample(t.db, f.members.analyst, f.sampleId, { massMg: 12.8, version: s.version });
    try {
      await expect(act("reviewer", "approve", r)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/step 2 \(normalise\) is stale/) });
      expect((await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).state).toBe("in_review");
    } finally {
      const s2 = await t.db.sample.findUniqueOrThrow({ where: { id: f.sampleId } });
      await updateSample(t.db, f.members.analyst, f.sampleId, { massMg: 0.2 * 63.546, version: s2.version });
    }
  });

  it("editing a sealed revision's step through the notebook is refused", async () => {
    const step = await t.db.step.findFirstOrThrow({ where: { revisionId: sealedId, kind: "fit" } });
    await expect(updateStep(t.db, f.members.owner, analysisId, step.id, { version: step.version, config: { model: "sommerfeld", tMaxK: 7 } })).rejects.toMatchObject({ name: "ConflictError" });
    expect((await t.db.step.findUniqueOrThrow({ where: { id: step.id } })).config).toEqual(step.config);
  });

  it("a step write racing an approval waits for it and is then refused by the database", async () => {
    const r = await fullAnalysis("race");
    await act("analyst", "submit", r);
    const step = await t.db.step.findFirstOrThrow({ where: { revisionId: r.revisionId, kind: "fit" } });
    const a = new pg.Client({ connectionString: t.url }), b = new pg.Client({ connectionString: t.url });
    await a.connect(); await b.connect();
    try {
      await a.query("BEGIN");
      await a.query(`SELECT 1 FROM "AnalysisRevision" WHERE id = $1 FOR UPDATE`, [r.revisionId]);
      const pid = (await b.query("SELECT pg_backend_pid() AS pid")).rows[0].pid;
      const write = b.query(`UPDATE "Step" SET output = '{"late": true}' WHERE id = $1`, [step.id]).then(() => "written", (e: Error) => e.message);
      for (let i = 0; i < 100; i++) {
        const w = await a.query(`SELECT wait_event_type FROM pg_stat_activity WHERE pid = $1`, [pid]);
        if (w.rows[0]?.wait_event_type === "Lock") break;
        await new Promise((res) => setTimeout(res, 20));
      }
      await a.query(`UPDATE "AnalysisRevision" SET state = 'sealed', snapshot = '{}', "contentHash" = 'h', "sealedById" = $2, "sealedAt" = now() WHERE id = $1`, [r.revisionId, f.members.reviewer.userId]);
      await a.query("COMMIT");
      expect(await write).toMatch(/refused: the revision is sealed/);
    } finally {
      await a.end(); await b.end();
    }
  });
});

describe("sealed measurements", () => {
  it("a second measurement imported after sealing is not locked, the sealed one is", async () => {
    const { importMeasurement } = await import("../../lib/server/measurements");
    const m = await importMeasurement(t.db, f.members.analyst, f.sampleId, "later.csv", new TextEncoder().encode(inventedCurve(5)), {
      kind: "sample", label: "later", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "mJ/K" },
    });
    await t.db.measurement.update({ where: { id: m.id }, data: { notes: "ok to edit" } });
    await expect(t.db.measurement.update({ where: { id: f.measurementId }, data: { notes: "not ok" } })).rejects.toThrow(/sealed analysis revision .* used it/);
  });
});
