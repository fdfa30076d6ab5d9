import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { awaitingMyReview, sentBackToMe } from "@/lib/server/review";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** My review queues in this group: what awaits my review, and what was sent back to me. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, user, member } = await inGroup(req, slug);
  const [awaiting, sentBack] = await Promise.all([awaitingMyReview(db, user.id, member.group.id), sentBackToMe(db, user.id, member.group.id)]);
  return NextResponse.json({ awaitingMyReview: awaiting, sentBackToMe: sentBack });
});
