import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { renewToken } from "@/lib/server/tokens";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Renew a token (JSON body {} or {days}): it expires that many days from now (default 90). Its owner, or a group owner. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ token: await renewToken(db, member, id, await jsonBody(req)) });
});
