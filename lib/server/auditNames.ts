/**
 * Names and links for the objects of audit events, so the audit page says "analysis NM-03 γ and
 * Θ_D (revision 2)" with a link instead of an id. One query per object kind, scoped to the
 * caller's group: an id from another group (or one since deleted) gets no name.
 */
import type { Db } from "./db/client";
import type { Member } from "./access";
import { uuidOrNone } from "./samples";

export interface ObjectName {
  label: string;
  href: string | null;
}

interface EventRef { objectType: string; objectId: string }

/** Words for object kinds whose record is gone (deleted, or never in this group). */
export const OBJECT_KIND_WORD: Record<string, string> = {
  analysis: "analysis", analysisRevision: "revision", sample: "sample", measurement: "measurement", series: "series", thread: "discussion",
  comment: "comment", step: "step", membership: "membership", user: "account", invitation: "invitation", group: "group", apiToken: "API token", token: "API token",
};

const ids = (events: readonly EventRef[], type: string) => [...new Set(events.filter((e) => e.objectType === type).map((e) => uuidOrNone(e.objectId)))].filter((x) => x !== "00000000-0000-0000-0000-000000000000");

/** A name (and page link where there is one) per "type:id" of the events, for the caller's group. */
export async function auditObjectNames(db: Db, member: Member, events: readonly EventRef[]): Promise<Map<string, ObjectName>> {
  const groupId = member.group.id;
  const home = `/g/${member.group.slug}`;
  const out = new Map<string, ObjectName>();
  const put = (type: string, id: string, label: string, href: string | null) => out.set(`${type}:${id}`, { label, href });
  const [analyses, revisions, samples, measurements, series, threads, comments, steps, users, invitations] = await Promise.all([
    db.analysis.findMany({ where: { groupId, id: { in: ids(events, "analysis") } }, select: { id: true, title: true } }),
    db.analysisRevision.findMany({ where: { analysis: { groupId }, id: { in: ids(events, "analysisRevision") } }, select: { id: true, number: true, analysis: { select: { id: true, title: true } } } }),
    db.sample.findMany({ where: { groupId, id: { in: ids(events, "sample") } }, select: { id: true, label: true } }),
    db.measurement.findMany({ where: { groupId, id: { in: ids(events, "measurement") } }, select: { id: true, label: true, sample: { select: { label: true } } } }),
    db.series.findMany({ where: { groupId, id: { in: ids(events, "series") } }, select: { id: true, name: true } }),
    db.thread.findMany({ where: { groupId, id: { in: ids(events, "thread") } }, select: { id: true, analysis: { select: { id: true, title: true } } } }),
    db.comment.findMany({ where: { thread: { groupId }, id: { in: ids(events, "comment") } }, select: { id: true, thread: { select: { id: true, analysis: { select: { id: true, title: true } } } } } }),
    db.step.findMany({ where: { revision: { analysis: { groupId } }, id: { in: ids(events, "step") } }, select: { id: true, kind: true, title: true, revision: { select: { number: true, analysis: { select: { id: true, title: true } } } } } }),
    db.membership.findMany({ where: { groupId, userId: { in: [...ids(events, "membership"), ...ids(events, "user")] } }, select: { userId: true, user: { select: { name: true, email: true } } } }),
    db.invitation.findMany({ where: { groupId, id: { in: ids(events, "invitation") } }, select: { id: true, email: true } }),
  ]);
  for (const a of analyses) put("analysis", a.id, `analysis “${a.title}”`, `${home}/analyses/${a.id}`);
  for (const r of revisions) put("analysisRevision", r.id, `revision ${r.number} of “${r.analysis.title}”`, `${home}/analyses/${r.analysis.id}?revision=${r.id}`);
  for (const s of samples) put("sample", s.id, `sample ${s.label}`, `${home}/samples/${s.id}`);
  for (const m of measurements) put("measurement", m.id, `measurement “${m.label}” of ${m.sample.label}`, `${home}/measurements/${m.id}`);
  for (const s of series) put("series", s.id, `series “${s.name}”`, `${home}/series/${s.id}`);
  for (const t of threads) put("thread", t.id, `discussion on “${t.analysis.title}”`, `${home}/analyses/${t.analysis.id}#thread-${t.id}`);
  for (const c of comments) put("comment", c.id, `comment on “${c.thread.analysis.title}”`, `${home}/analyses/${c.thread.analysis.id}#thread-${c.thread.id}`);
  for (const s of steps) put("step", s.id, `${s.title || `${s.kind} step`} in revision ${s.revision.number} of “${s.revision.analysis.title}”`, `${home}/analyses/${s.revision.analysis.id}#step-${s.id}`);
  for (const m of users) {
    const name = m.user.name || m.user.email;
    put("membership", m.userId, `membership of ${name}`, `${home}/members`);
    put("user", m.userId, name, `${home}/members`);
  }
  for (const i of invitations) put("invitation", i.id, `invitation for ${i.email}`, `${home}/members`);
  put("group", groupId, `the group “${member.group.name}”`, `${home}/settings`);
  return out;
}
