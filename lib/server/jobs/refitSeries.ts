/**
 * Job "refit-series": after an engine upgrade, bring every analysis of a series' samples up to
 * date. Editable revisions (open, returned) are recomputed through computeRevisionSteps in
 * "edit" mode (only stale steps are rewritten, each only if its version is unchanged, so a
 * concurrent edit wins). Sealed and replaced revisions are never changed: their snapshot is
 * re-hashed and re-run by the engine (reproduceSnapshot) and the outcome reported. Revisions in
 * review are read frozen and reported as stale or fresh. Running it twice changes nothing more.
 */
import type { Db } from "../db/client";
import { computeRevisionSteps } from "../notebook/compute";
import { notify } from "../notebook/events";
import { reproduceSnapshot } from "../review/verify";
import type { RevisionSnapshot } from "../review/snapshot";
import { contentHash } from "../hash";
import { ENGINE_VERSION } from "../../engine/version";
import type { JobContext } from "./context";

export interface RefitTarget {
  analysisId: string;
  sampleId: string;
  title: string;
}

/** The analyses (not archived) of every sample in the series, oldest first. */
export async function refitTargets(db: Db, groupId: string, seriesId: string): Promise<RefitTarget[]> {
  const members = await db.seriesMember.findMany({ where: { seriesId, series: { groupId } }, select: { sampleId: true } });
  const rows = await db.analysis.findMany({
    where: { groupId, archivedAt: null, sampleId: { in: members.map((m) => m.sampleId) } },
    select: { id: true, sampleId: true, title: true },
    orderBy: { createdAt: "asc" },
  });
  return rows.map((r) => ({ analysisId: r.id, sampleId: r.sampleId, title: r.title }));
}

export interface RefitSummary {
  engineVersion: string;
  analyses: number;
  revisionsRecomputed: number;
  revisionsAlreadyFresh: number;
  sealedVerified: number;
  /** Sealed revisions whose snapshot no longer hashes or reproduces (never changed here). */
  sealedProblems: { analysisId: string; revisionId: string; number: number; detail: string }[];
  inReviewStale: number;
}

function verifySealed(snapshot: RevisionSnapshot, storedHash: string | null): string | null {
  if (contentHash(snapshot) !== storedHash) return "the snapshot no longer matches its content hash";
  let differing;
  try {
    differing = reproduceSnapshot(snapshot).filter((s) => s.outcome === "differs");
  } catch (err) {
    return `the snapshot cannot be re-run: ${(err as Error).message}`;
  }
  return differing.length ? `steps ${differing.map((s) => s.position + 1).join(", ")} differ under engine ${ENGINE_VERSION}` : null;
}

/** Run the job; `ctx.progress` is told after each analysis. */
export async function runRefitSeries(ctx: JobContext, params: { seriesId: string }): Promise<RefitSummary> {
  const { db, groupId } = ctx;
  const targets = await refitTargets(db, groupId, params.seriesId);
  const out: RefitSummary = { engineVersion: ENGINE_VERSION, analyses: targets.length, revisionsRecomputed: 0, revisionsAlreadyFresh: 0, sealedVerified: 0, sealedProblems: [], inReviewStale: 0 };
  await ctx.progress(0, targets.length, `${targets.length} analyses to bring up to date`);
  for (const [k, t] of targets.entries()) {
    const revisions = await db.analysisRevision.findMany({ where: { analysisId: t.analysisId }, select: { id: true, number: true, state: true, snapshot: true, contentHash: true }, orderBy: { number: "asc" } });
    for (const rev of revisions) {
      if (rev.state === "open" || rev.state === "returned") {
        const r = await computeRevisionSteps(db, groupId, t.sampleId, rev.id, "edit", undefined, { inThread: true });
        if (r.computed) {
          out.revisionsRecomputed++;
          await notify(db, { groupId, analysisId: t.analysisId, revisionId: rev.id, kind: "step", actorId: ctx.actorId });
        } else out.revisionsAlreadyFresh++;
      } else if (rev.snapshot) {
        const problem = verifySealed(rev.snapshot as unknown as RevisionSnapshot, rev.contentHash);
        if (problem) out.sealedProblems.push({ analysisId: t.analysisId, revisionId: rev.id, number: rev.number, detail: problem });
        else out.sealedVerified++;
      } else {
        const r = await computeRevisionSteps(db, groupId, t.sampleId, rev.id, "frozen");
        if (r.steps.some((s) => !s.fresh)) out.inReviewStale++;
      }
    }
    await ctx.pause();
    await ctx.progress(k + 1, targets.length, `${t.title}: done`);
  }
  return out;
}
