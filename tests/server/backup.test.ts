import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { gunzipSync, gzipSync } from "node:zlib";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { makeAnalysis, sealAsIs } from "./apiFixtures";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { createSeries } from "../../lib/server/series";
import { verifyAuditChain } from "../../lib/server/audit";
import { exportGroup, restoreGroup, readArchive, verifyGroupAuditChain } from "../../lib/server/backup";
import { ConflictError, InputError } from "../../lib/engine/errors";

let src: TestDatabase;
let dst: TestDatabase;
let A: GroupFixture;
let archive: Uint8Array;
const FILE = new TextEncoder().encode("# invented demo data\nT (K);C (mJ/K)\n1,5;0,25\n2,5;0,75\n");

beforeAll(async () => {
  src = await freshDatabase();
  dst = await freshDatabase();
  A = await makeGroup(src.db, "Backup group");
  const B = await makeGroup(src.db, "Not exported");
  const s = await createSample(src.db, A.members.analyst, { label: "Nb", formula: "Nb", compositionValue: 0 });
  await createSample(src.db, B.members.owner, { label: "B's", formula: "Ta" });
  const m = await importMeasurement(src.db, A.members.analyst, s.id, "nb.txt", FILE, { kind: "sample", label: "run", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "mJ/K" }, parse: { delimiter: ";", decimalComma: true } });
  const first = await makeAnalysis(src.db, A.members.analyst, { sampleId: s.id, gamma: [7.8, 0.1], beta: [0.12, 0.01], state: "sealed" });
  // A second revision sealed after the first, which becomes replaced (what revising does).
  const rev2 = await src.db.analysisRevision.create({ data: { analysisId: first.analysisId, number: 2, basedOnId: first.revisionId } });
  await src.db.step.create({ data: { revisionId: rev2.id, position: 0, kind: "note", config: { text: "v2" }, output: { kind: "note", ok: true, error: null, warnings: [], result: {} } } });
  await src.db.step.create({ data: { revisionId: rev2.id, position: 1, kind: "data", config: { measurementIds: [m.id] }, output: { kind: "data", ok: true, error: null, warnings: [], result: {} } } });
  await sealAsIs(src.db, A.members.reviewer, rev2.id);
  await src.db.analysisRevision.update({ where: { id: first.revisionId }, data: { state: "replaced" } });
  await src.db.reviewDecision.create({ data: { revisionId: rev2.id, reviewerId: A.members.reviewer.userId, decision: "approve", comment: "fine" } });
  await makeAnalysis(src.db, A.members.analyst, { sampleId: s.id, gamma: [7.7, 0.2], beta: [0.12, 0.01], state: "open", title: "draft" });
  const thread = await src.db.thread.create({ data: { groupId: A.groupId, analysisId: first.analysisId, createdById: A.members.reviewer.userId, anchor: { plot: "CoverT", xMin: 1, xMax: 2 } } });
  await src.db.comment.create({ data: { threadId: thread.id, authorId: A.members.reviewer.userId, body: "=1+1 is not a formula here" } });
  await createSeries(src.db, A.members.analyst, { name: "Nb series", sampleIds: [s.id] });
  archive = (await exportGroup(src.db, A.slug)).archive;
});
afterAll(async () => { await src.drop(); await dst.drop(); });

describe("exportGroup", () => {
  it("exportGroup writes a versioned JSON-lines archive with only the group's rows and no password hashes", () => {
    const lines = gunzipSync(archive).toString("utf8").trim().split("\n").map((l) => JSON.parse(l));
    expect(lines[0].format).toBe("heatbook-group-backup");
    expect(lines[0].version).toBe(1);
    const { rows, end } = readArchive(archive);
    expect(rows.get("Group")!.length).toBe(1);
    expect(rows.get("Sample")!.map((r) => r.label)).toEqual(["Nb"]);
    expect(rows.get("User")!.every((u) => !("passwordHash" in u))).toBe(true);
    expect(rows.get("AuditEvent")!.every((e) => e.groupId === A.groupId)).toBe(true);
    expect(end.sealed.length).toBe(2);
  });
});

describe("restoreGroup", () => {
  it("restoreGroup into an empty database verifies seals and the group audit chain identically", async () => {
    const report = await restoreGroup(dst.db, archive);
    expect(report.seals.problems).toEqual([]);
    expect(report.audit.ok).toBe(true);
    expect(report.auditMatchesArchive).toBe(true);
    expect(report.ok).toBe(true);
    const before = await verifyGroupAuditChain(src.db, A.groupId);
    const after = await verifyGroupAuditChain(dst.db, A.groupId);
    expect(after).toEqual(before);
    expect((await verifyAuditChain(src.db)).ok).toBe(true);
  });
  it("the restored records equal the originals: rows, points bytes, original file bytes, states", async () => {
    for (const model of ["sample", "measurement", "storedFile", "analysisRevision", "step", "thread", "comment", "series", "reviewDecision"] as const) {
      const where = model === "analysisRevision" || model === "step" || model === "reviewDecision" || model === "comment" ? {} : { groupId: A.groupId };
      const d = (db: typeof src.db) => (db[model] as unknown as { findMany(a: object): Promise<unknown[]> }).findMany({ where: model === "series" ? { groupId: A.groupId } : where, orderBy: { id: "asc" } });
      const a = await d(dst.db);
      const b = (await d(src.db)).filter((r) => model === "analysisRevision" || model === "step" || model === "reviewDecision" || model === "comment" ? a.some((x) => (x as { id: string }).id === (r as { id: string }).id) : true);
      expect(a, model).toEqual(b);
      expect(a.length, model).toBeGreaterThan(0);
    }
    const audit = await dst.db.auditEvent.findMany({ orderBy: { id: "asc" } });
    expect(audit).toEqual(await src.db.auditEvent.findMany({ where: { groupId: A.groupId }, orderBy: { id: "asc" } }));
    const states = (await dst.db.analysisRevision.findMany({ orderBy: { number: "asc" } })).map((r) => r.state).sort();
    expect(states).toEqual(["open", "replaced", "sealed"]);
    expect(await dst.db.revisionMeasurement.count()).toBe(1);
  });
  it("the restored sealed revision is locked by the database like the original", async () => {
    const sealed = await dst.db.analysisRevision.findFirstOrThrow({ where: { state: "sealed" } });
    await expect(dst.db.analysisRevision.update({ where: { id: sealed.id }, data: { contentHash: "0".repeat(64) } })).rejects.toThrow(/immutable|refused/);
  });
  it("restoreGroup refuses a database that is not empty", async () => {
    await expect(restoreGroup(dst.db, archive)).rejects.toThrow(ConflictError);
    await expect(restoreGroup(src.db, archive)).rejects.toThrow(/empty database/);
  });
  it("restoreGroup reports a broken chain when an audit row was edited in the archive", async () => {
    const text = gunzipSync(archive).toString("utf8").replace('"action":"sample.create"', '"action":"sample.created"');
    const other = await freshDatabase();
    try {
      const report = await restoreGroup(other.db, gzipSync(Buffer.from(text)));
      expect(report.ok).toBe(false);
      expect(report.audit.reason).toMatch(/does not match its hash/);
    } finally {
      await other.drop();
    }
  });
  it("readArchive refuses a truncated or foreign file with InputError", () => {
    const lines = gunzipSync(archive).toString("utf8").trim().split("\n");
    expect(() => readArchive(gzipSync(Buffer.from(lines.slice(0, -1).join("\n"))))).toThrow(/truncated/);
    expect(() => readArchive(new Uint8Array([1, 2, 3]))).toThrow(InputError);
    expect(() => readArchive(gzipSync(Buffer.from('{"format":"other"}\n')))).toThrow(/not a Heatbook group backup/);
  });
});
