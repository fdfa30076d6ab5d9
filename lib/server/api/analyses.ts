/**
 * Analyses for the JSON API, read straight from the Analysis, AnalysisRevision and Step tables
 * with a mapper of our own (the notebook layer has a richer view for the app's pages).
 * Open revisions: step outputs as stored (computed on the server when the step last ran).
 * Sealed and replaced revisions: everything comes from the sealed snapshot (checked against its
 * content hash first; a mismatch refuses the read with 409), never from the step rows, with the
 * sealed sample context and the reviewer's signature.
 */
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import type { Member } from "../access";
import { uuidOrNone } from "../samples";
import { afterCursor, pageOf, PAGE_ORDER } from "./pagination";
import { intactSnapshot, isSealedState, sealedSteps } from "../review/served";
import { contextChanges, pinnedContext, type ContextChange } from "../review/context";
import type { SealedContext } from "../review/snapshot";
import type { SealSignature } from "../review/signature";

export type RevisionStateName = "open" | "in_review" | "returned" | "sealed" | "replaced";

export interface ApiRevisionSummary {
  id: string;
  number: number;
  state: RevisionStateName;
  contentHash: string | null;
}

export interface ApiAnalysis {
  id: string;
  title: string;
  sampleId: string;
  archived: boolean;
  createdAt: string;
  updatedAt: string;
  revisions: ApiRevisionSummary[];
}

export interface ApiStep {
  id: string;
  position: number;
  kind: string;
  title: string;
  config: unknown;
  output: unknown;
  inputHash: string | null;
  engineVersion: string | null;
  computedAt: string | null;
}

export interface ApiRevision extends ApiRevisionSummary {
  basedOnId: string | null;
  submittedAt: string | null;
  sealedAt: string | null;
  sealedById: string | null;
  createdAt: string;
  steps: ApiStep[];
  /** Sealed revisions: the sample record as sealed ("full"), or only the chain's fields ("chain", format 1). */
  sealedContext?: { pinned: "full" | "chain"; sample: SealedContext["sample"]; note: string | null; changedSinceSealing: ContextChange[] } | null;
  /** Sealed revisions sealed with a signature (format 2). */
  signature?: SealSignature | null;
}

const REV_SUMMARY = { id: true, number: true, state: true, contentHash: true } as const;

type AnalysisRow = { id: string; title: string; sampleId: string; archivedAt: Date | null; createdAt: Date; updatedAt: Date; revisions: ApiRevisionSummary[] };

function toAnalysis(a: AnalysisRow): ApiAnalysis {
  return { id: a.id, title: a.title, sampleId: a.sampleId, archived: a.archivedAt !== null, createdAt: a.createdAt.toISOString(), updatedAt: a.updatedAt.toISOString(), revisions: a.revisions };
}

/** A page of the group's analyses (optionally of one sample), oldest first. */
export async function listApiAnalyses(db: Db, member: Member, opts: { sampleId?: string; limit: number; cursor?: string }): Promise<{ items: ApiAnalysis[]; nextCursor: string | null }> {
  const rows = await db.analysis.findMany({
    where: { groupId: member.group.id, ...(opts.sampleId ? { sampleId: uuidOrNone(opts.sampleId) } : {}), ...afterCursor(opts.cursor) },
    include: { revisions: { select: REV_SUMMARY, orderBy: { number: "asc" } } },
    orderBy: PAGE_ORDER,
    take: opts.limit + 1,
  });
  return pageOf(rows, opts.limit, toAnalysis);
}

/** One analysis with its revisions (all, or only number `revision`) and their steps. */
export async function getApiAnalysis(db: Db, member: Member, id: string, opts: { revision?: number } = {}): Promise<{ analysis: ApiAnalysis; revisions: ApiRevision[] }> {
  const a = await db.analysis.findFirst({
    where: { id: uuidOrNone(id), groupId: member.group.id },
    include: { sample: true, revisions: { orderBy: { number: "asc" }, include: { steps: { orderBy: { position: "asc" } } } } },
  });
  if (!a) throw new NotFoundError("analysis");
  const revs = a.revisions.filter((r) => opts.revision === undefined || r.number === opts.revision);
  if (opts.revision !== undefined && revs.length === 0) throw new NotFoundError(`revision ${opts.revision}`);
  return {
    analysis: toAnalysis({ ...a, revisions: a.revisions.map((r) => ({ id: r.id, number: r.number, state: r.state, contentHash: r.contentHash })) }),
    revisions: revs.map((r) => {
      const head = {
        id: r.id, number: r.number, state: r.state, contentHash: r.contentHash, basedOnId: r.basedOnId, submittedAt: r.submittedAt?.toISOString() ?? null,
        sealedAt: r.sealedAt?.toISOString() ?? null, sealedById: r.sealedById, createdAt: r.createdAt.toISOString(),
      };
      if (!isSealedState(r.state)) return { ...head, steps: r.steps.map((s) => ({ id: s.id, position: s.position, kind: s.kind, title: s.title, config: s.config, output: s.output, inputHash: s.inputHash, engineVersion: s.engineVersion, computedAt: s.computedAt?.toISOString() ?? null })) };
      const snap = intactSnapshot(r, a.title);
      const computedAt = new Map(r.steps.map((s) => [s.id, s.computedAt?.toISOString() ?? null]));
      const ctx = pinnedContext(snap);
      return {
        ...head,
        steps: sealedSteps(snap).map((s) => ({ id: s.id, position: s.position, kind: s.kind, title: s.title, config: s.config, output: s.output, inputHash: s.inputHash, engineVersion: s.engineVersion, computedAt: computedAt.get(s.id) ?? null })),
        sealedContext: { pinned: ctx.pinned, sample: ctx.sample, note: ctx.note, changedSinceSealing: contextChanges(ctx, a.sample) },
        signature: snap.signature ?? null,
      };
    }),
  };
}
