/**
 * In-app notices: review requested, decision made, withdrawn (written here), and thread
 * replies and mentions (written by the notebook). A member lists their own, marks one read or
 * unread, or all read. Nobody sees or touches another user's notices (404, not 403).
 */
import type { Db } from "../db/client";
import { NotFoundError } from "../../engine/errors";
import { uuidOrNone } from "../samples";

export type Tx = Parameters<Parameters<Db["$transaction"]>[0]>[0];

export interface NoticeView {
  id: string;
  groupId: string | null;
  kind: string;
  message: string;
  link: string;
  read: boolean;
  readAt: string | null;
  createdAt: string;
}

export interface NewNotice {
  userIds: readonly string[];
  groupId: string;
  kind: string;
  message: string;
  link: string;
}

/** Write one notice per recipient (duplicates dropped) inside the caller's transaction. */
export async function sendNotices(tx: Tx, n: NewNotice): Promise<number> {
  const users = [...new Set(n.userIds)];
  if (users.length === 0) return 0;
  const r = await tx.notice.createMany({ data: users.map((userId) => ({ userId, groupId: n.groupId, kind: n.kind, message: n.message, link: n.link })) });
  return r.count;
}

function toView(n: { id: string; groupId: string | null; kind: string; message: string; link: string; readAt: Date | null; createdAt: Date }): NoticeView {
  return { id: n.id, groupId: n.groupId, kind: n.kind, message: n.message, link: n.link, read: n.readAt !== null, readAt: n.readAt?.toISOString() ?? null, createdAt: n.createdAt.toISOString() };
}

/** The user's notices, newest first; optionally one group's, optionally unread only. */
export async function listNotices(db: Db, userId: string, opts: { groupId?: string; unreadOnly?: boolean; take?: number } = {}): Promise<{ notices: NoticeView[]; unread: number }> {
  const where = { userId, ...(opts.groupId ? { groupId: opts.groupId } : {}) };
  const [rows, unread] = await Promise.all([
    db.notice.findMany({ where: { ...where, ...(opts.unreadOnly ? { readAt: null } : {}) }, orderBy: { createdAt: "desc" }, take: Math.min(Math.max(opts.take ?? 100, 1), 500) }),
    db.notice.count({ where: { ...where, readAt: null } }),
  ]);
  return { notices: rows.map(toView), unread };
}

/** Mark one of the user's notices read or unread. NotFoundError for anyone else's. */
export async function setNoticeRead(db: Db, userId: string, noticeId: string, read: boolean, groupId?: string): Promise<NoticeView> {
  const n = await db.notice.findFirst({ where: { id: uuidOrNone(noticeId), userId, ...(groupId ? { groupId } : {}) } });
  if (!n) throw new NotFoundError("notice");
  const row = await db.notice.update({ where: { id: n.id }, data: { readAt: read ? (n.readAt ?? new Date()) : null } });
  return toView(row);
}

/** Mark all the user's unread notices (of one group, if given) read; returns how many. */
export async function markAllNoticesRead(db: Db, userId: string, groupId?: string): Promise<number> {
  const r = await db.notice.updateMany({ where: { userId, readAt: null, ...(groupId ? { groupId } : {}) }, data: { readAt: new Date() } });
  return r.count;
}
