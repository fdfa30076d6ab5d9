/** Notebooks on a real PostgreSQL: starter chain, computation cached by input hash, invalidation, conflicts, threads. */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createSample, updateSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { sourceAt, type PackedSources } from "../../lib/engine/notebook";
import { addStep, createAnalysis, createThread, listThreads, notebookJson, openNotebook, removeStep, replyToThread, setThreadState, updateStep, moveStep } from "../../lib/server/notebook";

let t: TestDatabase;
let g: GroupFixture;
let analysisId: string;

function file(): Uint8Array {
  // Invented test curve: C = n(γT + βT³) with n = 20 mg / 92.906 g/mol, γ = 7 mJ/(mol K²), β = 0.12 mJ/(mol K⁴), 0.2 % noise-free jitter.
  const n = 20e-3 / 92.90637;
  const lines = ["T (K),C (J/K),sigma (J/K)"];
  for (let i = 0; i < 80; i++) {
    const T = 1.8 + i * 0.08;
    const c = n * (7e-3 * T + 1.2e-4 * T ** 3) * (1 + 0.002 * Math.sin(i * 1.7));
    lines.push(`${T},${c},${c * 0.003}`);
  }
  return new TextEncoder().encode(lines.join("\n"));
}

beforeAll(async () => {
  t = await freshDatabase();
  g = await makeGroup(t.db);
  const s = await createSample(t.db, g.members.analyst, { label: "NB-1", formula: "Nb", massMg: 20, densityGPerCm3: 8.57 });
  await importMeasurement(t.db, g.members.analyst, s.id, "nb.csv", file(), { kind: "sample", label: "0 T", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "J/K" } });
  analysisId = (await createAnalysis(t.db, g.members.analyst, { sampleId: s.id, title: "NB-1 γ" })).id;
});
afterAll(async () => { await t.drop(); });

const gammaOf = (nb: Awaited<ReturnType<typeof openNotebook>>) => {
  const fit = nb.steps.find((s) => s.kind === "fit")!.output!.result as unknown as { fit: { parameters: { name: string; value: number }[] } };
  return fit.fit.parameters.find((p) => p.name === "gamma")!.value;
};

describe("notebooks", () => {
  it("createAnalysis starts a chain of data, normalisation, fit and derived quantities, all computed on first open", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(nb.steps.map((s) => s.kind)).toEqual(["data", "normalise", "fit", "derive"]);
    expect(nb.steps.every((s) => s.fresh && s.output?.ok)).toBe(true);
    expect(gammaOf(nb)).toBeGreaterThan(6e-3);
    expect(nb.editable).toBe(true);
  });

  it("openNotebook a second time computes nothing: every output matches its input hash", async () => {
    const before = await t.db.step.findMany({ where: { revision: { analysisId } }, select: { computedAt: true }, orderBy: { position: "asc" } });
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const after = await t.db.step.findMany({ where: { revision: { analysisId } }, select: { computedAt: true }, orderBy: { position: "asc" } });
    expect(after).toEqual(before);
    expect(nb.steps.every((s) => s.fresh)).toBe(true);
  });

  it("updateStep of the fit window recomputes that step and everything below it, not above", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    await updateStep(t.db, g.members.analyst, analysisId, fit.id, { version: fit.version, config: { ...(fit.config as object), tMinK: 2, tMaxK: 6 } });
    const again = await openNotebook(t.db, g.members.analyst, analysisId);
    const [d0, n0, f0, v0] = nb.steps, [d1, n1, f1, v1] = again.steps;
    expect(d1!.computedAt).toBe(d0!.computedAt);
    expect(n1!.computedAt).toBe(n0!.computedAt);
    expect(f1!.inputHash).not.toBe(f0!.inputHash);
    expect(v1!.inputHash).not.toBe(v0!.inputHash);
    expect(gammaOf(again)).not.toBe(gammaOf(nb));
  });

  it("a change to the sample's mass invalidates the normalisation step and those below it", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const s = await t.db.sample.findFirstOrThrow({ where: { label: "NB-1" } });
    await updateSample(t.db, g.members.analyst, s.id, { massMg: 40, version: s.version });
    const again = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(again.steps[0]!.inputHash).toBe(nb.steps[0]!.inputHash);
    expect(again.steps[1]!.inputHash).not.toBe(nb.steps[1]!.inputHash);
    expect(gammaOf(again) / gammaOf(nb)).toBeCloseTo(0.5, 10);
  });

  it("updateStep with a stale version is refused with the newer step, and the newer edit stays", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    await updateStep(t.db, g.members.owner, analysisId, fit.id, { version: fit.version, config: { ...(fit.config as object), tMaxK: 7 } });
    const err = await updateStep(t.db, g.members.analyst, analysisId, fit.id, { version: fit.version, config: { ...(fit.config as object), tMaxK: 5 } }).catch((e) => e);
    expect(err.name).toBe("ConflictError");
    expect(err.current.config.tMaxK).toBe(7);
    const again = await openNotebook(t.db, g.members.analyst, analysisId);
    expect((again.steps.find((s) => s.kind === "fit")!.config as { tMaxK: number }).tMaxK).toBe(7);
  });

  it("updateStep with an invalid configuration names the field and changes nothing", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    await expect(updateStep(t.db, g.members.analyst, analysisId, fit.id, { version: fit.version, config: { model: "sommerfeld", tMinK: -3 } })).rejects.toMatchObject({ field: "config.tMinK" });
    expect((await t.db.step.findUniqueOrThrow({ where: { id: fit.id } })).version).toBe(fit.version);
  });

  it("addStep, moveStep and removeStep keep positions contiguous and refuse a stale revision version", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const { stepId } = await addStep(t.db, g.members.analyst, analysisId, { revisionId: nb.revision.id, revisionVersion: nb.revision.version, kind: "note", position: 1, config: { markdown: "checked the thermometer calibration" } });
    await expect(addStep(t.db, g.members.analyst, analysisId, { revisionId: nb.revision.id, revisionVersion: nb.revision.version, kind: "note" })).rejects.toMatchObject({ name: "ConflictError" });
    let now = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(now.steps.map((s) => s.kind)).toEqual(["data", "note", "normalise", "fit", "derive"]);
    await moveStep(t.db, g.members.analyst, analysisId, stepId, { revisionVersion: now.revision.version, position: 4 });
    now = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(now.steps.map((s) => s.kind)).toEqual(["data", "normalise", "fit", "derive", "note"]);
    await removeStep(t.db, g.members.analyst, analysisId, stepId, { revisionVersion: now.revision.version });
    now = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(now.steps.map((s) => s.position)).toEqual([0, 1, 2, 3]);
  });

  it("openNotebook reads a step rewritten elsewhere afresh: outputs are cached by step and stored input hash", async () => {
    const nb = await openNotebook(t.db, g.members.viewer, analysisId);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    // As if another instance (say, another engine version) had rewritten the stored output.
    const marked = { ...(fit.output as object), warnings: ["written elsewhere"] };
    await t.db.$executeRaw`UPDATE "Step" SET "output" = ${JSON.stringify(marked)}::json, "inputHash" = ${"elsewhere-" + fit.inputHash} WHERE "id" = ${fit.id}::uuid`;
    const viewer = await openNotebook(t.db, g.members.viewer, analysisId);
    expect(viewer.steps.find((s) => s.kind === "fit")!.output!.warnings).toEqual(["written elsewhere"]);
    expect(viewer.steps.find((s) => s.kind === "fit")!.fresh).toBe(false);
    // An analyst's open recomputes it (its hash no longer matches) and the viewer then sees that.
    const analyst = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(analyst.steps.find((s) => s.kind === "fit")!.output!.warnings).not.toContain("written elsewhere");
    const after = await openNotebook(t.db, g.members.viewer, analysisId);
    expect(after.steps.find((s) => s.kind === "fit")!).toMatchObject({ fresh: true, inputHash: fit.inputHash });
    expect(after.steps.find((s) => s.kind === "fit")!.output!.warnings).not.toContain("written elsewhere");
  });

  it("notebookJson gives the same JSON as serialising the view, with the stored output texts spliced in", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    expect(JSON.parse(notebookJson(nb))).toEqual(JSON.parse(JSON.stringify({ notebook: nb })));
    const sealedLike = { ...nb, steps: nb.steps.map((s) => ({ ...s, output: null })) };
    expect(JSON.parse(notebookJson(sealedLike))).toEqual(JSON.parse(JSON.stringify({ notebook: sealedLike })));
  });

  it("openNotebook of another analysis's revision id, or an id that is not a UUID, is not found", async () => {
    const other = await createAnalysis(t.db, g.members.analyst, { sampleId: (await t.db.sample.findFirstOrThrow({ where: { label: "NB-1" } })).id, title: "other" });
    const otherNb = await openNotebook(t.db, g.members.analyst, other.id);
    await expect(openNotebook(t.db, g.members.analyst, analysisId, otherNb.revision.id)).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(openNotebook(t.db, g.members.analyst, analysisId, "not-a-uuid")).rejects.toMatchObject({ name: "NotFoundError" });
    await expect(openNotebook(t.db, g.members.analyst, "not-a-uuid")).rejects.toMatchObject({ name: "NotFoundError" });
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    expect((await openNotebook(t.db, g.members.analyst, analysisId, nb.revision.id)).steps.map((s) => s.id)).toEqual(nb.steps.map((s) => s.id));
  });

  it("the fit step's output names each point's measurement and index, packed", async () => {
    const nb = await openNotebook(t.db, g.members.analyst, analysisId);
    const r = nb.steps.find((s) => s.kind === "fit")!.output!.result as unknown as { points: { temperatureK: number[]; source: PackedSources } };
    const m = await t.db.measurement.findFirstOrThrow({ where: { groupId: g.members.analyst.group.id } });
    expect(r.points.source.measurementIds).toEqual([m.id]);
    expect(r.points.source.index).toHaveLength(r.points.temperatureK.length);
    expect(sourceAt(r.points.source, 3)).toEqual({ measurementId: m.id, index: 3 });
  });

  it("a viewer opens the notebook without computing and cannot edit it", async () => {
    const nb = await openNotebook(t.db, g.members.viewer, analysisId);
    expect(nb.editable).toBe(false);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    await expect(updateStep(t.db, g.members.viewer, analysisId, fit.id, { version: fit.version, config: fit.config })).rejects.toMatchObject({ name: "ForbiddenError" });
  });

  it("threads on a point range take replies, resolve and reopen, and a reviewer may comment", async () => {
    const nb = await openNotebook(t.db, g.members.reviewer, analysisId);
    const fit = nb.steps.find((s) => s.kind === "fit")!;
    const { threadId } = await createThread(t.db, g.members.reviewer, analysisId, { stepId: fit.id, anchor: { plot: "ct-vs-t2", xMin: 4, xMax: 9 }, body: "Upturn here? @owner" });
    await replyToThread(t.db, g.members.analyst, analysisId, threadId, { body: "Within noise; see residuals." });
    await setThreadState(t.db, g.members.analyst, analysisId, threadId, { state: "resolved" });
    let threads = await listThreads(t.db, g.members.viewer, analysisId);
    expect(threads[0]!.comments.map((c) => c.body)).toEqual(["Upturn here? @owner", "Within noise; see residuals."]);
    expect(threads[0]!.state).toBe("resolved");
    expect(threads[0]!.anchor).toMatchObject({ plot: "ct-vs-t2", xMin: 4, xMax: 9 });
    await setThreadState(t.db, g.members.reviewer, analysisId, threadId, { state: "open" });
    threads = await listThreads(t.db, g.members.viewer, analysisId);
    expect(threads[0]!.state).toBe("open");
    await expect(createThread(t.db, g.members.viewer, analysisId, { body: "hi" })).rejects.toMatchObject({ name: "ForbiddenError" });
    // The reviewer who started the thread is told about the analyst's reply.
    expect(await t.db.notice.count({ where: { userId: g.members.reviewer.userId, kind: "reply" } })).toBe(1);
  });
});
