import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { setNoticeRead } from "@/lib/server/review";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

const bodySchema = z.object({ read: z.boolean() });

/** { read: true | false }: mark one of my notices read or unread. */
export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, user, member } = await inGroup(req, slug);
  const { read } = parseInput(bodySchema, await jsonBody(req));
  return NextResponse.json({ notice: await setNoticeRead(db, user.id, id, read, member.group.id) });
});
