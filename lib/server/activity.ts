/**
 * Recent activity of one group, read from the audit trail (read-only, group-scoped), with the
 * actor's name and a readable label for the object where one can be found. The full trail with
 * hashes and chain verification is a separate, owner-only view (permission "audit.read"); this
 * short list shows only who did what, when, and is open to every member ("group.read").
 */
import type { Db } from "./db/client";
import { isUuid } from "./ids";
import { authorise, type Member } from "./access";
import { toSampleInfo, type SampleInfo } from "./samples";

export interface ActivityItem {
  id: string;
  at: string;
  action: string;
  objectType: string;
  objectId: string;
  actorName: string | null;
  /** A short human label of the object: sample label, measurement label or file name, e-mail… */
  objectLabel: string | null;
}

function text(v: unknown): string | null {
  return typeof v === "string" && v ? v : null;
}

/** The `take` (≤ 50) most recent audit events of the member's group, newest first. */
export async function listRecentActivity(db: Db, member: Member, take = 12): Promise<ActivityItem[]> {
  authorise(member, "group.read");
  const rows = await db.auditEvent.findMany({
    where: { groupId: member.group.id },
    orderBy: { id: "desc" },
    take: Math.min(Math.max(1, take), 50),
    select: { id: true, at: true, action: true, objectType: true, objectId: true, actorId: true, detail: true },
  });
  const actorIds = [...new Set(rows.map((r) => r.actorId).filter((x): x is string => !!x))];
  const ids = (type: string) => [...new Set(rows.filter((r) => r.objectType === type).map((r) => r.objectId))].filter(isUuid);
  const [actors, samples, measurements] = await Promise.all([
    actorIds.length ? db.user.findMany({ where: { id: { in: actorIds } }, select: { id: true, name: true, email: true } }) : [],
    ids("sample").length ? db.sample.findMany({ where: { id: { in: ids("sample") }, groupId: member.group.id }, select: { id: true, label: true } }) : [],
    ids("measurement").length ? db.measurement.findMany({ where: { id: { in: ids("measurement") }, groupId: member.group.id }, select: { id: true, label: true } }) : [],
  ]);
  const actorName = new Map(actors.map((a) => [a.id, a.name || a.email]));
  const label = new Map<string, string>([...samples.map((s) => [s.id, s.label] as const), ...measurements.map((m) => [m.id, m.label] as const)]);
  return rows.map((r) => {
    const d = (r.detail ?? {}) as Record<string, unknown>;
    return {
      id: r.id.toString(),
      at: r.at.toISOString(),
      action: r.action,
      objectType: r.objectType,
      objectId: r.objectId,
      actorName: r.actorId ? actorName.get(r.actorId) ?? null : null,
      objectLabel: label.get(r.objectId) ?? text(d.fileName) ?? text(d.email) ?? text(d.name) ?? null,
    };
  });
}


/** The `take` (≤ 50) most recently changed samples of the member's group (archived ones left out). */
export async function listRecentSamples(db: Db, member: Member, take = 8): Promise<SampleInfo[]> {
  authorise(member, "group.read");
  const rows = await db.sample.findMany({
    where: { groupId: member.group.id, archivedAt: null },
    orderBy: { updatedAt: "desc" },
    take: Math.min(Math.max(1, take), 50),
  });
  return rows.map(toSampleInfo);
}

/** How many of the user's notices in this group are unread. */
export async function countUnreadNotices(db: Db, member: Member): Promise<number> {
  authorise(member, "group.read");
  return db.notice.count({ where: { userId: member.userId, groupId: member.group.id, readAt: null } });
}

export interface WaitingThread {
  threadId: string;
  analysisId: string;
  analysisTitle: string;
  excerpt: string;
  authorName: string;
  at: string;
}

/**
 * Open discussion threads of the group that mention the member (@ + the member's handle, the
 * e-mail name part or the name without spaces, as lib/server/notebook/threads.ts recognises),
 * newest first, at most `take`.
 */
export async function listThreadsWaitingForMe(db: Db, member: Member, take = 8): Promise<WaitingThread[]> {
  authorise(member, "group.read");
  const me = await db.user.findUnique({ where: { id: member.userId }, select: { email: true, name: true } });
  if (!me) return [];
  const mine = await db.membership.findFirst({ where: { userId: member.userId, groupId: member.group.id }, select: { handle: true } });
  const handles = [...new Set([mine?.handle ?? "", me.email.split("@")[0]!, me.name.replace(/\s+/g, "")].filter((h) => h.length > 0))];
  const rows = await db.comment.findMany({
    where: { thread: { groupId: member.group.id, state: "open" }, authorId: { not: member.userId }, OR: handles.map((h) => ({ body: { contains: `@${h}`, mode: "insensitive" as const } })) },
    include: { author: { select: { name: true } }, thread: { select: { id: true, analysis: { select: { id: true, title: true } } } } },
    orderBy: { createdAt: "desc" },
    take: 50,
  });
  const seen = new Set<string>();
  const out: WaitingThread[] = [];
  for (const c of rows) {
    if (seen.has(c.thread.id)) continue;
    seen.add(c.thread.id);
    out.push({ threadId: c.thread.id, analysisId: c.thread.analysis.id, analysisTitle: c.thread.analysis.title, excerpt: c.body.length > 140 ? `${c.body.slice(0, 139)}…` : c.body, authorName: c.author.name, at: c.createdAt.toISOString() });
    if (out.length >= take) break;
  }
  return out;
}
