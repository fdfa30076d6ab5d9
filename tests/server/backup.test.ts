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
import { auditKeyFromText } from "../../lib/server/auditKey";
import { main } from "../../lib/cli/main";

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
    expect(lines[0].version).toBe(2);
    const { rows, end } = readArchive(archive);
    expect(rows.get("Group")!.length).toBe(1);
    expect(rows.get("Sample")!.map((r) => r.label)).toEqual(["Nb"]);
    expect(rows.get("User")!.every((u) => !("passwordHash" in u))).toBe(true);
    expect(rows.get("AuditEvent")!.every((e) => e.groupId === A.groupId)).toBe(true);
    expect(end.sealed.length).toBe(2);
  });
});

describe("restoreGroup", () => {
  it("restoreGroup (as the owner) into an empty database verifies seals and the group's own audit chain against the archive's checkpoint", async () => {
    const report = await restoreGroup(dst.owner(), archive);
    expect(report.seals.problems).toEqual([]);
    expect(report.audit).toMatchObject({ ok: true, problems: [], checked: await src.db.auditEvent.count({ where: { groupId: A.groupId } }) });
    expect(report.auditMatchesArchive).toBe(true);
    expect(report.integrity.map((f) => f.ok)).toEqual(report.integrity.map(() => true));
    expect(report.ok).toBe(true);
    const { checkpoint: cpBefore, ...before } = await verifyGroupAuditChain(src.db, A.groupId);
    const { checkpoint: cpAfter, ...after } = await verifyGroupAuditChain(dst.db, A.groupId);
    expect(after).toEqual(before);
    expect(cpAfter.heads).toEqual(cpBefore.heads);
    expect((await verifyAuditChain(src.db)).ok).toBe(true);
  });
  it("the restored group's chain verifies on its own: `heatbook audit verify` over the restored database exits 0", async () => {
    let out = "";
    const code = await main(["audit", "verify", "--url", dst.ownerUrl, "--skip-engine"], { // fixture seals are not engine outputs
 out: (x) => (out += x), err: (x) => (out += x), readFile: () => new Uint8Array(), env: { HEATBOOK_AUDIT_KEY: process.env.HEATBOOK_AUDIT_KEY } });
    expect(out).toMatch(/audit chains intact: 1 chain, /);
    expect(code).toBe(0);
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
    await expect(restoreGroup(dst.owner(), archive)).rejects.toThrow(ConflictError);
    await expect(restoreGroup(src.db, archive)).rejects.toThrow(/empty database/);
  });
  it("restoreGroup reports a broken chain when an audit row was edited in the archive", async () => {
    const text = gunzipSync(archive).toString("utf8").replace('"action":"sample.create"', '"action":"sample.created"');
    const other = await freshDatabase();
    try {
      const report = await restoreGroup(other.owner(), gzipSync(Buffer.from(text)));
      expect(report.ok).toBe(false);
      expect(report.audit.problems[0]).toMatchObject({ kind: "edited", groupId: A.groupId });
      expect(report.audit.reason).toMatch(/no longer matches its signature/);
    } finally {
      await other.drop();
    }
  });
  it("restoreGroup names the newest audit events cut from an archive, against the archive's checkpoint", async () => {
    const lines = gunzipSync(archive).toString("utf8").trim().split("\n");
    const lastAudit = lines.map((l, i) => [l, i] as const).filter(([l]) => l.startsWith('{"table":"AuditEvent"')).at(-1)![1];
    const end = JSON.parse(lines.at(-1)!);
    end.end.counts.AuditEvent -= 1;
    const cut = [...lines.slice(0, lastAudit), ...lines.slice(lastAudit + 1, -1), JSON.stringify(end)].join("\n") + "\n";
    const other = await freshDatabase();
    try {
      const report = await restoreGroup(other.owner(), gzipSync(Buffer.from(cut)));
      expect(report.ok).toBe(false);
      expect(report.audit.problems).toEqual([expect.objectContaining({ kind: "deleted", groupId: A.groupId })]);
      expect(report.audit.reason).toMatch(/the newest event \(seq \d+\) is missing: the checkpoint of/);
    } finally {
      await other.drop();
    }
  });
  it("restoreGroup with another audit key refuses the archive's checkpoint before writing anything", async () => {
    const other = await freshDatabase();
    try {
      await expect(restoreGroup(other.owner(), archive, auditKeyFromText("some-other-servers-audit-key-0000000"))).rejects.toThrow(/signed by another audit key/);
      expect(await other.db.group.count()).toBe(0);
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
