/**
 * Review queues: what awaits my review (revisions in review in my groups, where my role may
 * review and the submission is not my own unless the group allows self-approval), and what was
 * sent back to me (revisions I submitted that a reviewer returned, with the latest comment).
 */
import type { Db } from "../db/client";
import { can, ROLES } from "../permissions";

export interface QueueItem {
  groupSlug: string;
  groupName: string;
  analysisId: string;
  title: string;
  sampleLabel: string;
  revisionId: string;
  number: number;
  version: number;
  submittedBy: string | null;
  submittedAt: string | null;
  link: string;
}

export interface ReturnedItem extends QueueItem {
  returnedBy: string | null;
  returnedAt: string | null;
  comment: string;
}

const REVIEW_ROLES = ROLES.filter((r) => can(r, "analysis.review"));

const INCLUDE = {
  analysis: { select: { id: true, title: true, sample: { select: { label: true } }, group: { select: { slug: true, name: true } } } },
} as const;

type Row = { id: string; number: number; version: number; submittedById: string | null; submittedAt: Date | null; analysis: { id: string; title: string; sample: { label: string }; group: { slug: string; name: string } } };

async function names(db: Db, ids: (string | null)[]): Promise<Map<string, string>> {
  const want = [...new Set(ids.filter((x): x is string => !!x))];
  const users = want.length ? await db.user.findMany({ where: { id: { in: want } }, select: { id: true, name: true } }) : [];
  return new Map(users.map((u) => [u.id, u.name]));
}

function item(r: Row, who: Map<string, string>): QueueItem {
  return {
    groupSlug: r.analysis.group.slug, groupName: r.analysis.group.name, analysisId: r.analysis.id, title: r.analysis.title, sampleLabel: r.analysis.sample.label,
    revisionId: r.id, number: r.number, version: r.version, submittedBy: r.submittedById ? (who.get(r.submittedById) ?? null) : null,
    submittedAt: r.submittedAt?.toISOString() ?? null, link: `/g/${r.analysis.group.slug}/analyses/${r.analysis.id}?revision=${r.id}`,
  };
}

/** Revisions in review that `userId` may approve or return; optionally within one group. Oldest first. */
export async function awaitingMyReview(db: Db, userId: string, groupId?: string): Promise<QueueItem[]> {
  const ms = await db.membership.findMany({ where: { userId, role: { in: [...REVIEW_ROLES] }, ...(groupId ? { groupId } : {}) }, select: { groupId: true, group: { select: { allowSelfApproval: true } } } });
  if (ms.length === 0) return [];
  const strict = ms.filter((m) => !m.group.allowSelfApproval).map((m) => m.groupId);
  const lenient = ms.filter((m) => m.group.allowSelfApproval).map((m) => m.groupId);
  const rows = (await db.analysisRevision.findMany({
    where: {
      state: "in_review",
      analysis: { archivedAt: null },
      OR: [
        { analysis: { groupId: { in: lenient } } },
        { analysis: { groupId: { in: strict } }, OR: [{ submittedById: null }, { submittedById: { not: userId } }] },
      ],
    },
    include: INCLUDE,
    orderBy: { submittedAt: "asc" },
    take: 200,
  })) as Row[];
  const who = await names(db, rows.map((r) => r.submittedById));
  return rows.map((r) => item(r, who));
}

/** Revisions `userId` submitted that were returned for changes; optionally within one group. Newest first. */
export async function sentBackToMe(db: Db, userId: string, groupId?: string): Promise<ReturnedItem[]> {
  const rows = await db.analysisRevision.findMany({
    where: { state: "returned", submittedById: userId, analysis: { archivedAt: null, group: { memberships: { some: { userId } } }, ...(groupId ? { groupId } : {}) } },
    include: { ...INCLUDE, decisions: { where: { decision: "returned" }, orderBy: { at: "desc" }, take: 1 } },
    orderBy: { updatedAt: "desc" },
    take: 200,
  });
  const who = await names(db, [...rows.map((r) => r.submittedById), ...rows.map((r) => r.decisions[0]?.reviewerId ?? null)]);
  return rows.map((r) => {
    const d = r.decisions[0];
    return { ...item(r as Row, who), returnedBy: d ? (who.get(d.reviewerId) ?? null) : null, returnedAt: d?.at.toISOString() ?? null, comment: d?.comment ?? "" };
  });
}
