/** The review queue shows each waiting revision's γ, β, Θ_D with σ, its model and window, and its open threads. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { awaitingMyReview, queueFigures, reviewTransition } from "../../lib/server/review";
import { createThread } from "../../lib/server/notebook";

let t: TestDatabase;
let f: ReviewFixture;
beforeAll(async () => { t = await freshDatabase(); f = await makeReviewFixture(t.db); });
afterAll(async () => { await t.drop(); });

describe("queueFigures", () => {
  it("queueFigures gives γ, β and Θ_D as value(σ) with units, the model title, the window and the open threads of a submitted revision", async () => {
    const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "queued");
    await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
    await createThread(t.db, f.members.reviewer, r.analysisId, { body: "Is 6 K too high for T³?" });
    const version = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).version;
    await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version });
    const queue = await awaitingMyReview(t.db, f.members.reviewer.userId, f.groupId);
    const figures = await queueFigures(t.db, queue);
    const q = figures.get(r.revisionId)!;
    expect(q.gamma).toMatch(/^\d+\.\d+\(\d+\) mJ mol⁻¹ K⁻²$/);
    expect(q.beta).toMatch(/mJ mol⁻¹ K⁻⁴$/);
    expect(q.thetaD).toMatch(/^\d+(\.\d+)?\(\d+(\.\d+)?\) K$/);
    expect(q.model).toMatch(/Sommerfeld/i);
    expect(q.window).toMatch(/–6 K, \d+ points$/);
    expect(q.openThreads).toBe(1);
  });

  it("queueFigures of a revision without a fit gives no numbers and still counts threads", async () => {
    const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "no fit");
    const figures = await queueFigures(t.db, [r]);
    expect(figures.get(r.revisionId)).toEqual({ gamma: null, beta: null, thetaD: null, model: null, window: null, openThreads: 0 });
  });
});
