/**
 * Fixtures for the job tests: a group with a series of samples, each with an invented curve
 * (C = γT + βT³ with made-up γ, β — not a measurement) and an analysis whose revision holds
 * the full chain data → normalise → fit → derive with stored outputs; optionally the first
 * analysis sealed through the review flow (submit by the analyst, approve by the reviewer).
 */
import type { Db } from "../../lib/server/db/client";
import { createSample } from "../../lib/server/samples";
import { importMeasurement } from "../../lib/server/measurements";
import { reviewTransition } from "../../lib/server/review";
import { makeGroup, SIGN, type GroupFixture } from "./fixtures";
import { fullChain, inventedCurve, writeSteps } from "./reviewFixtures";

export interface SeriesFixture extends GroupFixture {
  seriesId: string;
  analyses: { analysisId: string; revisionId: string; sampleId: string }[];
  /** The sealed analysis (index 0) when `sealFirst`. */
  sealed: { analysisId: string; revisionId: string } | null;
}

const enc = (s: string) => new TextEncoder().encode(s);

export async function makeSeriesFixture(db: Db, opts: { samples: number; points?: number; sealFirst?: boolean }): Promise<SeriesFixture> {
  const g = await makeGroup(db, "Jobs group");
  const analyst = g.members.analyst;
  const analyses: SeriesFixture["analyses"] = [];
  for (let k = 0; k < opts.samples; k++) {
    const sample = await createSample(db, analyst, { label: `JB-${k}`, formula: "Cu", massMg: 0.2 * 63.546 });
    const m = await importMeasurement(db, analyst, sample.id, `invented-${k}.csv`, enc(inventedCurve(opts.points ?? 24)), {
      kind: "sample", label: "zero field (invented)", mapping: { temperature: 0, heatCapacity: 1, sigma: 2 }, units: { temperature: "K", heatCapacity: "mJ/K" },
    });
    const a = await db.analysis.create({ data: { groupId: g.groupId, sampleId: sample.id, title: `refit test ${k}`, createdById: analyst.userId } });
    const rev = await db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: analyst.userId } });
    await writeSteps(db, g.groupId, sample.id, rev.id, fullChain(m.id, 12));
    analyses.push({ analysisId: a.id, revisionId: rev.id, sampleId: sample.id });
  }
  const series = await db.series.create({ data: { groupId: g.groupId, name: "Jobs series", members: { create: analyses.map((a) => ({ sampleId: a.sampleId })) } } });
  let sealed: SeriesFixture["sealed"] = null;
  if (opts.sealFirst) {
    const a = analyses[0]!;
    await reviewTransition(db, g.members.analyst, a.analysisId, a.revisionId, { action: "submit", version: 1 });
    await reviewTransition(db, g.members.reviewer, a.analysisId, a.revisionId, { action: "approve", version: 2, ...SIGN, comment: "fixture approval" });
    sealed = { analysisId: a.analysisId, revisionId: a.revisionId };
  }
  return { ...g, seriesId: series.id, analyses, sealed };
}

/** Make every step of the open revisions look computed by an older engine (what an upgrade does). */
export async function ageOpenSteps(db: Db, f: SeriesFixture): Promise<number> {
  const ids = f.analyses.filter((a) => a.revisionId !== f.sealed?.revisionId).map((a) => a.revisionId);
  const r = await db.step.updateMany({ where: { revisionId: { in: ids } }, data: { inputHash: "engine-before-upgrade", engineVersion: "0.0.0-old" } });
  return r.count;
}
