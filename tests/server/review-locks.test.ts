/**
 * The review-lock triggers, exercised in raw SQL over `pg` (no app code in the way): the audit
 * trail is append-only, a sealed revision with its steps, decisions, measurements and original
 * files is immutable, and nothing that owns a sealed revision can be deleted. As the owner (who
 * holds every table privilege), so the triggers themselves are what refuses; the runtime role is
 * refused earlier still (tests/security/db-roles.test.ts).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { inventedCurve, makeAnalysis, makeReviewFixture, type ReviewFixture } from "./reviewFixtures";
import { importMeasurement } from "../../lib/server/measurements";

let t: TestDatabase;
let f: ReviewFixture;
let sql: pg.Client;

async function refused(text: string, params: unknown[], message: RegExp, code = "HBL01"): Promise<void> {
  await expect(sql.query(text, params)).rejects.toMatchObject({ code, message: expect.stringMatching(message) });
}

/** Seal a revision the way approval does, in SQL: in_review, then sealed with its seal fields. */
async function sealInSql(revisionId: string, measurementIds: string[]): Promise<void> {
  await sql.query(`UPDATE "AnalysisRevision" SET state = 'in_review', "updatedAt" = now() WHERE id = $1`, [revisionId]);
  const snapshot = { inputs: { measurements: measurementIds.map((id) => ({ id })) } };
  await sql.query(
    `UPDATE "AnalysisRevision" SET state = 'sealed', snapshot = $2, "contentHash" = 'h', "sealedById" = $3, "sealedAt" = now(), "updatedAt" = now() WHERE id = $1`,
    [revisionId, snapshot, f.members.reviewer.userId],
  );
}

beforeAll(async () => {
  t = await freshDatabase();
  f = await makeReviewFixture(t.db);
  sql = new pg.Client({ connectionString: t.ownerUrl });
  await sql.connect();
  await sealInSql(f.revisionId, [f.measurementId]);
});
afterAll(async () => { await sql.end(); await t.drop(); });

describe("audit trail triggers", () => {
  it("UPDATE, DELETE and TRUNCATE of AuditEvent are refused as append-only", async () => {
    const { rows } = await sql.query(`SELECT id FROM "AuditEvent" ORDER BY id LIMIT 1`);
    expect(rows.length).toBe(1);
    await refused(`UPDATE "AuditEvent" SET action = 'x' WHERE id = $1`, [rows[0].id], /UPDATE on "AuditEvent" refused: the audit trail is append-only/, "HBA01");
    await refused(`DELETE FROM "AuditEvent" WHERE id = $1`, [rows[0].id], /DELETE on "AuditEvent" refused/, "HBA01");
    await refused(`TRUNCATE "AuditEvent"`, [], /TRUNCATE on "AuditEvent" refused/, "HBA01");
  });
});

describe("sealed revision triggers", () => {
  it("the sealing update records the snapshot's measurements in RevisionMeasurement", async () => {
    const { rows } = await sql.query(`SELECT "measurementId" FROM "RevisionMeasurement" WHERE "revisionId" = $1`, [f.revisionId]);
    expect(rows.map((r) => r.measurementId)).toEqual([f.measurementId]);
  });

  it("UPDATE of any field of a sealed revision is refused", async () => {
    await refused(`UPDATE "AnalysisRevision" SET snapshot = '{}' WHERE id = $1`, [f.revisionId], /UPDATE of analysis revision .* refused: it is sealed and therefore immutable/);
    await refused(`UPDATE "AnalysisRevision" SET state = 'open' WHERE id = $1`, [f.revisionId], /it is sealed and therefore immutable/);
    await refused(`UPDATE "AnalysisRevision" SET "contentHash" = 'forged' WHERE id = $1`, [f.revisionId], /immutable/);
  });

  it("sealed → replaced that also changes another field is refused", async () => {
    await refused(`UPDATE "AnalysisRevision" SET state = 'replaced', version = version + 1 WHERE id = $1`, [f.revisionId], /may change only its state and updatedAt/);
  });

  it("DELETE of a sealed revision is refused", async () => {
    await refused(`DELETE FROM "AnalysisRevision" WHERE id = $1`, [f.revisionId], /DELETE of analysis revision .* refused: it is sealed/);
  });

  it("INSERT, UPDATE and DELETE of a sealed revision's steps are refused", async () => {
    const { rows } = await sql.query(`SELECT id FROM "Step" WHERE "revisionId" = $1 ORDER BY position`, [f.revisionId]);
    expect(rows.length).toBe(2);
    await refused(`UPDATE "Step" SET config = '{}' WHERE id = $1`, [rows[0].id], /UPDATE of a step of analysis revision .* refused: the revision is sealed/);
    await refused(`UPDATE "Step" SET output = NULL WHERE id = $1`, [rows[0].id], /the revision is sealed/);
    await refused(`DELETE FROM "Step" WHERE id = $1`, [rows[1].id], /DELETE of a step .* sealed/);
    await refused(`INSERT INTO "Step" (id, "revisionId", position, kind, config, "updatedAt") VALUES (gen_random_uuid(), $1, 9, 'note', '{}', now())`, [f.revisionId], /INSERT of a step .* sealed/);
  });

  it("UPDATE and DELETE of a measurement the sealed revision used, and of its original file, are refused", async () => {
    await refused(`UPDATE "Measurement" SET label = 'changed' WHERE id = $1`, [f.measurementId], /UPDATE of measurement .* refused: sealed analysis revision .* used it/);
    await refused(`UPDATE "Measurement" SET "heatCapacity" = '\\x00'::bytea WHERE id = $1`, [f.measurementId], /refused/);
    await refused(`DELETE FROM "Measurement" WHERE id = $1`, [f.measurementId], /DELETE of measurement .* refused/);
    await refused(`UPDATE "StoredFile" SET bytes = '\\x00'::bytea WHERE id = $1`, [f.fileId], /UPDATE of stored file .* refused: it is the original of measurement/);
    await refused(`DELETE FROM "StoredFile" WHERE id = $1`, [f.fileId], /DELETE of stored file .* refused/);
  });

  it("UPDATE and DELETE of the RevisionMeasurement rows of a sealed revision are refused", async () => {
    await refused(`DELETE FROM "RevisionMeasurement" WHERE "revisionId" = $1`, [f.revisionId], /DELETE of "RevisionMeasurement" .* refused/);
  });

  it("DELETE of the analysis, sample or group that owns a sealed revision is refused", async () => {
    await refused(`DELETE FROM "Analysis" WHERE id = $1`, [f.analysisId], /DELETE of analysis .* refused: it owns sealed analysis revision/);
    await refused(`DELETE FROM "Sample" WHERE id = $1`, [f.sampleId], /DELETE of sample .* refused: it owns sealed/);
    await refused(`DELETE FROM "Group" WHERE id = $1`, [f.groupId], /DELETE of group .* refused: it owns sealed/);
  });

  it("UPDATE and DELETE of a sealed revision's review decision are refused", async () => {
    const { rows } = await sql.query(`INSERT INTO "ReviewDecision" (id, "revisionId", "reviewerId", decision) VALUES (gen_random_uuid(), $1, $2, 'approve') RETURNING id`, [f.revisionId, f.members.reviewer.userId]);
    await refused(`UPDATE "ReviewDecision" SET comment = 'x' WHERE id = $1`, [rows[0].id], /never edited/);
    await refused(`DELETE FROM "ReviewDecision" WHERE id = $1`, [rows[0].id], /DELETE of review decision .* refused/);
  });

  it("sealed → replaced changing only state and updatedAt is allowed, and a replaced revision stays immutable", async () => {
    const g = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "to be replaced");
    await sealInSql(g.revisionId, [f.measurementId]);
    await sql.query(`UPDATE "AnalysisRevision" SET state = 'replaced', "updatedAt" = now() WHERE id = $1`, [g.revisionId]);
    await refused(`UPDATE "AnalysisRevision" SET state = 'sealed' WHERE id = $1`, [g.revisionId], /it is replaced and therefore immutable/);
    await refused(`DELETE FROM "AnalysisRevision" WHERE id = $1`, [g.revisionId], /it is replaced/);
    await refused(`DELETE FROM "Step" WHERE "revisionId" = $1`, [g.revisionId], /the revision is replaced/);
  });
});

describe("revision state triggers before sealing", () => {
  it("INSERT of a revision already sealed or replaced is refused", async () => {
    for (const state of ["sealed", "replaced"])
      await refused(`INSERT INTO "AnalysisRevision" (id, "analysisId", number, state, "updatedAt") VALUES (gen_random_uuid(), $1, 99, $2, now())`, [f.analysisId, state], /starts open/);
  });

  it("sealing from open, or without the snapshot and hash, is refused", async () => {
    const g = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "not yet reviewed");
    await refused(`UPDATE "AnalysisRevision" SET state = 'sealed', snapshot = '{}', "contentHash" = 'h', "sealedById" = $2, "sealedAt" = now() WHERE id = $1`, [g.revisionId, f.members.reviewer.userId], /only a revision in review can be sealed \(it is open\)/);
    await sql.query(`UPDATE "AnalysisRevision" SET state = 'in_review' WHERE id = $1`, [g.revisionId]);
    await refused(`UPDATE "AnalysisRevision" SET state = 'sealed' WHERE id = $1`, [g.revisionId], /sealing needs the snapshot, its content hash/);
    await refused(`UPDATE "AnalysisRevision" SET state = 'replaced' WHERE id = $1`, [g.revisionId], /only a sealed revision can become replaced/);
  });

  it("steps of a revision in review accept refreshed outputs but refuse configuration edits, inserts and deletes", async () => {
    const g = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "in review");
    await sql.query(`UPDATE "AnalysisRevision" SET state = 'in_review' WHERE id = $1`, [g.revisionId]);
    const { rows } = await sql.query(`SELECT id FROM "Step" WHERE "revisionId" = $1 ORDER BY position`, [g.revisionId]);
    await sql.query(`UPDATE "Step" SET output = '{"refreshed": true}', "computedAt" = now() WHERE id = $1`, [rows[0].id]);
    await refused(`UPDATE "Step" SET config = '{}' WHERE id = $1`, [rows[0].id], /the revision is in review, so its steps are frozen/);
    await refused(`DELETE FROM "Step" WHERE id = $1`, [rows[1].id], /frozen/);
    await refused(`INSERT INTO "Step" (id, "revisionId", position, kind, config, "updatedAt") VALUES (gen_random_uuid(), $1, 9, 'note', '{}', now())`, [g.revisionId], /frozen/);
  });

  it("an open revision's steps and a measurement no sealed revision used stay editable", async () => {
    const g = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "open");
    const r = await sql.query(`UPDATE "Step" SET title = 'edited' WHERE "revisionId" = $1`, [g.revisionId]);
    expect(r.rowCount).toBe(2);
    const m = await importMeasurement(t.db, f.members.analyst, f.sampleId, "free.csv", new TextEncoder().encode(inventedCurve(4)), {
      kind: "sample", label: "unused", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "mJ/K" },
    });
    expect((await sql.query(`UPDATE "Measurement" SET label = 'relabelled' WHERE id = $1`, [m.id])).rowCount).toBe(1);
    expect((await sql.query(`DELETE FROM "Measurement" WHERE id = $1`, [m.id])).rowCount).toBe(1);
    expect((await sql.query(`DELETE FROM "Analysis" WHERE id = $1`, [g.analysisId])).rowCount).toBe(1);
  });
});
