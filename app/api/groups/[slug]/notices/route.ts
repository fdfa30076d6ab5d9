import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { listNotices, markAllNoticesRead } from "@/lib/server/review";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** My notices in this group, newest first (?unread=1 for unread only, ?take=N). */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, user, member } = await inGroup(req, slug);
  const q = new URL(req.url).searchParams;
  const take = q.get("take") ? Number(q.get("take")) : undefined;
  return NextResponse.json(await listNotices(db, user.id, { groupId: member.group.id, unreadOnly: q.get("unread") === "1", ...(take && Number.isFinite(take) ? { take } : {}) }));
});

const bodySchema = z.object({ action: z.literal("read-all") });

/** { action: "read-all" }: mark all my notices in this group read. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, user, member } = await inGroup(req, slug);
  parseInput(bodySchema, await jsonBody(req));
  return NextResponse.json({ marked: await markAllNoticesRead(db, user.id, member.group.id) });
});
