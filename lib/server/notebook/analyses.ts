/**
 * Analyses of a group: list, create (with a starting chain of steps), rename, duplicate,
 * archive, and the notebook view of one revision. Each analysis has numbered revisions; the
 * newest is the working one. Only revisions in state open or returned can be edited.
 */
import { z } from "zod";
import type { Db } from "../db/client";
import { ConflictError, NotFoundError } from "../../engine/errors";
import { parseStepConfig } from "../../engine/notebook";
import { recordAudit } from "../audit";
import { authorise, type Member } from "../access";
import { parseInput } from "../validate";
import { uuidOrNone } from "../samples";
import { computeRevisionSteps, defaultWaitMs, outputJson, type StepView } from "./compute";
import { notify } from "./events";
import { starterSteps } from "./starter";
import { readNotebookRows, type NotebookRows, type RevisionRow } from "./read";
import { isSealedState, sealedStepViews } from "../review/served";

export const createAnalysisSchema = z.object({
  sampleId: z.string().uuid("choose a sample"),
  title: z.string().trim().min(1, "a title is needed").max(160),
  starter: z.enum(["standard", "empty"]).default("standard"),
});

export const renameSchema = z.object({ title: z.string().trim().min(1, "a title is needed").max(160) });

export type RevisionStateName = "open" | "in_review" | "returned" | "sealed" | "replaced";
export const EDITABLE_STATES: readonly RevisionStateName[] = ["open", "returned"];

export interface AnalysisSummary {
  id: string;
  title: string;
  sampleId: string;
  sampleLabel: string;
  archived: boolean;
  latestRevision: { id: string; number: number; state: RevisionStateName } | null;
  sealedRevision: { id: string; number: number; contentHash: string | null } | null;
  updatedAt: string;
}

export interface RevisionInfo {
  id: string;
  number: number;
  state: RevisionStateName;
  version: number;
  basedOnId: string | null;
  contentHash: string | null;
  submittedAt: string | null;
  sealedAt: string | null;
  sealedBy: string | null;
  createdAt: string;
}

export interface NotebookView {
  analysis: AnalysisSummary;
  revision: RevisionInfo;
  revisions: RevisionInfo[];
  editable: boolean;
  steps: StepView[];
  computeMillis: number;
  /** The computation outlasted the request's wait: stale steps have no output yet; a "step" event follows. */
  computing: boolean;
  /** Sealed revisions: set when the stored snapshot does not match its content hash (nothing of it is shown). */
  sealProblem: string | null;
}



function toRevision(r: RevisionRow): RevisionInfo {
  return {
    id: r.id, number: r.number, state: r.state, version: r.version, basedOnId: r.basedOnId, contentHash: r.contentHash,
    submittedAt: r.submittedAt?.toISOString() ?? null, sealedAt: r.sealedAt?.toISOString() ?? null, sealedBy: r.sealedById, createdAt: r.createdAt.toISOString(),
  };
}

type SummaryRow = {
  id: string; title: string; sampleId: string; archivedAt: Date | null; updatedAt: Date;
  sample: { label: string };
  revisions: { id: string; number: number; state: RevisionStateName; contentHash: string | null }[];
};

/** The summary of an analysis row read with its sample label and revisions (newest first). */
function toSummary(a: SummaryRow): AnalysisSummary {
  const latest = a.revisions[0];
  const sealed = a.revisions.find((r) => r.state === "sealed");
  return {
    id: a.id, title: a.title, sampleId: a.sampleId, sampleLabel: a.sample.label, archived: a.archivedAt !== null,
    latestRevision: latest ? { id: latest.id, number: latest.number, state: latest.state } : null,
    sealedRevision: sealed ? { id: sealed.id, number: sealed.number, contentHash: sealed.contentHash } : null,
    updatedAt: a.updatedAt.toISOString(),
  };
}

async function summaries(db: Db, where: object): Promise<AnalysisSummary[]> {
  const rows = await db.analysis.findMany({
    where,
    include: { sample: { select: { label: true } }, revisions: { select: { id: true, number: true, state: true, contentHash: true }, orderBy: { number: "desc" } } },
    orderBy: { updatedAt: "desc" },
    take: 300,
  });
  return rows.map(toSummary);
}

export async function listAnalyses(db: Db, member: Member, opts: { sampleId?: string; q?: string; archived?: boolean } = {}): Promise<AnalysisSummary[]> {
  authorise(member, "group.read");
  const q = opts.q?.trim();
  return summaries(db, {
    groupId: member.group.id,
    archivedAt: opts.archived ? { not: null } : null,
    ...(opts.sampleId ? { sampleId: uuidOrNone(opts.sampleId) } : {}),
    ...(q ? { OR: [{ title: { contains: q, mode: "insensitive" } }, { sample: { label: { contains: q, mode: "insensitive" } } }] } : {}),
  });
}

async function findAnalysis(db: Db, member: Member, id: string) {
  const a = await db.analysis.findFirst({ where: { id: uuidOrNone(id), groupId: member.group.id } });
  if (!a) throw new NotFoundError("analysis");
  return a;
}

export async function createAnalysis(db: Db, member: Member, input: unknown): Promise<AnalysisSummary> {
  authorise(member, "analysis.write");
  const data = parseInput(createAnalysisSchema, input);
  const sample = await db.sample.findFirst({ where: { id: data.sampleId, groupId: member.group.id, archivedAt: null } });
  if (!sample) throw new NotFoundError("sample");
  const steps = data.starter === "standard" ? await starterSteps(db, member.group.id, sample) : [];
  const id = await db.$transaction(async (tx) => {
    const a = await tx.analysis.create({
      data: {
        groupId: member.group.id, sampleId: sample.id, title: data.title, createdById: member.userId,
        revisions: { create: { number: 1, createdById: member.userId, steps: { create: steps.map((s, i) => ({ position: i, kind: s.kind, title: s.title, config: parseStepConfig(s.kind, s.config) as object, updatedById: member.userId })) } } },
      },
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "analysis.create", objectType: "analysis", objectId: a.id, detail: { title: data.title, sampleId: sample.id } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, kind: "analysis", actorId: member.userId });
    return a.id;
  });
  return (await summaries(db, { id }))[0]!;
}

/** Renaming is allowed in every state (a sealed revision keeps the title it was sealed with, in its snapshot); audited. */
export async function renameAnalysis(db: Db, member: Member, id: string, input: unknown): Promise<void> {
  authorise(member, "analysis.write");
  const { title } = parseInput(renameSchema, input);
  const a = await findAnalysis(db, member, id);
  await db.$transaction(async (tx) => {
    await tx.analysis.update({ where: { id: a.id }, data: { title } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "analysis.rename", objectType: "analysis", objectId: a.id, detail: { from: a.title, to: title } });
    await notify(tx, { groupId: member.group.id, analysisId: a.id, kind: "analysis", actorId: member.userId });
  });
}

/** Archiving hides the analysis from lists; its sealed revisions stay in their series and reports. Audited. */
export async function setAnalysisArchived(db: Db, member: Member, id: string, archived: boolean): Promise<void> {
  authorise(member, "analysis.write");
  const a = await findAnalysis(db, member, id);
  await db.$transaction(async (tx) => {
    await tx.analysis.update({ where: { id: a.id }, data: { archivedAt: archived ? new Date() : null } });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: archived ? "analysis.archive" : "analysis.restore", objectType: "analysis", objectId: a.id });
  });
}

/** A new analysis with a copy of the newest revision's steps, as an open revision 1. */
export async function duplicateAnalysis(db: Db, member: Member, id: string, input: unknown): Promise<AnalysisSummary> {
  authorise(member, "analysis.write");
  const { title } = parseInput(renameSchema, input);
  const a = await findAnalysis(db, member, id);
  const latest = await db.analysisRevision.findFirst({ where: { analysisId: a.id }, orderBy: { number: "desc" }, include: { steps: { orderBy: { position: "asc" } } } });
  const newId = await db.$transaction(async (tx) => {
    const copy = await tx.analysis.create({
      data: {
        groupId: member.group.id, sampleId: a.sampleId, title, createdById: member.userId,
        revisions: { create: { number: 1, createdById: member.userId, steps: { create: (latest?.steps ?? []).map((s) => ({ position: s.position, kind: s.kind, title: s.title, config: s.config as object, updatedById: member.userId })) } } },
      },
    });
    await recordAudit(tx, { groupId: member.group.id, actorId: member.userId, action: "analysis.duplicate", objectType: "analysis", objectId: copy.id, detail: { from: a.id } });
    return copy.id;
  });
  return (await summaries(db, { id: newId }))[0]!;
}

/**
 * The notebook: one revision (default: the newest) with its steps computed. `preread`: the rows
 * as already read for this member's group (null: not found), e.g. in the membership's statement.
 */
export async function openNotebook(db: Db, member: Member, analysisId: string, revisionId?: string, preread?: NotebookRows | null): Promise<NotebookView> {
  authorise(member, "group.read");
  const rows = preread === undefined ? await readNotebookRows(db, member.group.id, analysisId, revisionId) : preread;
  if (!rows) throw new NotFoundError("analysis");
  const a = rows.analysis;
  const revisions = rows.revisions;
  const rev = revisions.find((r) => r.id === rows.revisionId);
  if (!rev) throw new NotFoundError("revision");
  const editable = EDITABLE_STATES.includes(rev.state);
  // Viewers and reviewers see what is stored; computing (and writing) is for those who may edit.
  const mode = editable && (member.role === "owner" || member.role === "analyst") ? "edit" : "frozen";
  // A sealed revision shows its snapshot (one truth), never the step rows beside it.
  // Otherwise a long computation answers "computing" after HEATBOOK_COMPUTE_WAIT_MS and goes on in
  // the pool; the page hears its progress and its end on the live event stream.
  const t0 = performance.now();
  const sealed = isSealedState(rev.state) ? await sealedStepViews(db, rev, rows.steps) : null;
  const event = { groupId: member.group.id, analysisId: a.id, revisionId: rev.id, actorId: member.userId };
  const quiet = () => undefined;
  const computed = sealed
    ? { steps: sealed.steps, millis: performance.now() - t0, computing: false }
    : await computeRevisionSteps(db, member.group.id, a.sampleId, rev.id, mode, { steps: rows.steps, sample: rows.sample, measurements: rows.measurements }, {
      waitMs: defaultWaitMs(),
      whenDone: () => void notify(db, { ...event, kind: "step" }).catch(quiet),
      onProgress: (p) => { if (p.runningMs > 1000) void notify(db, { ...event, stepId: p.stepId, kind: "computing", progress: { position: p.position, runningMs: Math.round(p.runningMs) } }).catch(quiet); },
    });
  return {
    analysis: toSummary({ ...a, revisions }),
    revision: toRevision(rev),
    revisions: revisions.map(toRevision),
    editable: editable && (member.role === "owner" || member.role === "analyst"),
    steps: computed.steps,
    computeMillis: computed.millis,
    computing: computed.computing ?? false,
    sealProblem: sealed?.problem ?? null,
  };
}

/** The editable revision of an analysis, or ConflictError saying why it cannot be edited. */
export async function editableRevision(db: Pick<Db, "analysisRevision">, analysisId: string, revisionId: string) {
  const rev = await db.analysisRevision.findFirst({ where: { id: uuidOrNone(revisionId), analysisId } });
  if (!rev) throw new NotFoundError("revision");
  if (!EDITABLE_STATES.includes(rev.state)) {
    const why = rev.state === "in_review" ? "it is waiting for review (withdraw it to edit)" : rev.state === "sealed" ? "it is approved and locked (start a new revision to change it)" : "a newer revision replaced it";
    throw new ConflictError(`revision ${rev.number} cannot be edited: ${why}`);
  }
  return rev;
}

/** A JSON object's text with one more member whose value is already JSON text. */
function withMember(objectJson: string, key: string, valueJson: string): string {
  const member = `${JSON.stringify(key)}:${valueJson}`;
  return objectJson === "{}" ? `{${member}}` : `${objectJson.slice(0, -1)},${member}}`;
}

/**
 * `{"notebook": view}` as JSON text, the same as JSON.stringify would give, but carrying each
 * step's output as its stored JSON text instead of serialising it again (outputs are most of a
 * notebook's bytes, and they are the same on every read).
 */
export function notebookJson(view: NotebookView): string {
  const steps = view.steps.map(({ output, ...rest }) => withMember(JSON.stringify(rest), "output", output ? outputJson(output) : "null"));
  const { steps: _steps, ...head } = view;
  return `{"notebook":${withMember(JSON.stringify(head), "steps", `[${steps.join(",")}]`)}}`;
}
