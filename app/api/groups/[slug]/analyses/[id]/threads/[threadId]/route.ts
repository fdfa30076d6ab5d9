import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { replyToThread, setThreadState } from "@/lib/server/notebook";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string; threadId: string }> };

/** Reply: {body}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id, threadId } = await params;
  const { db, member } = await inGroup(req, slug);
  const { unmatchedMentions } = await replyToThread(db, member, id, threadId, await jsonBody(req));
  return NextResponse.json({ ok: true, unmatchedMentions }, { status: 201 });
});

/** Resolve or reopen: {state: "resolved" | "open"}. */
export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id, threadId } = await params;
  const { db, member } = await inGroup(req, slug);
  await setThreadState(db, member, id, threadId, await jsonBody(req));
  return NextResponse.json({ ok: true });
});
