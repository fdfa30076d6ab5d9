import type { Metadata } from "next";
import { pageMember } from "@/app/_server/guard";
import { listNotices } from "@/lib/server/review";
import { NoticeList } from "@/app/components/review/NoticeList";
import "@/app/components/review/review.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Notices" };

/** My in-app notices in this group (review requested, decisions, replies and mentions), read and unread. */
export default async function NoticesPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const { db, user, member } = await pageMember(slug, `/g/${encodeURIComponent(slug)}/notices`);
  const { notices, unread } = await listNotices(db, user.id, { groupId: member.group.id, take: 200 });
  return (
    <>
      <h1>Notices</h1>
      <p className="lede">What happened that concerns you in {member.group.name}: reviews asked of you, decisions on your submissions, replies and mentions in discussions.</p>
      <NoticeList apiBase={`/api/groups/${encodeURIComponent(slug)}`} notices={notices} unread={unread} />
    </>
  );
}
