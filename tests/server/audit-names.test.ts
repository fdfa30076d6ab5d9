/** The audit page names and links the objects of its events, and names nothing across groups. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeReviewFixture, type ReviewFixture } from "./reviewFixtures";
import { makeGroup } from "./fixtures";
import { auditObjectNames } from "../../lib/server/auditNames";
import { createThread } from "../../lib/server/notebook";
import { createSample } from "../../lib/server/samples";

let t: TestDatabase;
let f: ReviewFixture;
beforeAll(async () => { t = await freshDatabase(); f = await makeReviewFixture(t.db); });
afterAll(async () => { await t.drop(); });

describe("auditObjectNames", () => {
  it("auditObjectNames gives each event's object a readable name and a link to its page", async () => {
    const { threadId } = await createThread(t.db, f.members.reviewer, f.analysisId, { body: "window?" });
    const names = await auditObjectNames(t.db, f.members.owner, [
      { objectType: "analysis", objectId: f.analysisId },
      { objectType: "analysisRevision", objectId: f.revisionId },
      { objectType: "sample", objectId: f.sampleId },
      { objectType: "measurement", objectId: f.measurementId },
      { objectType: "thread", objectId: threadId },
      { objectType: "membership", objectId: f.members.analyst.userId },
    ]);
    expect(names.get(`analysis:${f.analysisId}`)).toEqual({ label: "analysis “Cu-like test analysis”", href: `/g/${f.slug}/analyses/${f.analysisId}` });
    expect(names.get(`analysisRevision:${f.revisionId}`)!.label).toBe("revision 1 of “Cu-like test analysis”");
    expect(names.get(`sample:${f.sampleId}`)).toEqual({ label: "sample RV-1", href: `/g/${f.slug}/samples/${f.sampleId}` });
    expect(names.get(`measurement:${f.measurementId}`)!.label).toBe("measurement “zero field (invented)” of RV-1");
    expect(names.get(`thread:${threadId}`)!.href).toBe(`/g/${f.slug}/analyses/${f.analysisId}#thread-${threadId}`);
    expect(names.get(`membership:${f.members.analyst.userId}`)!.label).toMatch(/^membership of /);
  });

  it("auditObjectNames names nothing of another group and survives ids that are not UUIDs", async () => {
    const other = await makeGroup(t.db, "Elsewhere");
    const s = await createSample(t.db, other.members.analyst, { label: "SECRET-1", formula: "Cu", massMg: 1 });
    const names = await auditObjectNames(t.db, f.members.owner, [{ objectType: "sample", objectId: s.id }, { objectType: "analysis", objectId: "not-a-uuid" }]);
    expect(names.has(`sample:${s.id}`)).toBe(false);
    expect(names.has("analysis:not-a-uuid")).toBe(false);
  });
});
