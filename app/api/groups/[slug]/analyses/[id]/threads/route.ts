import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { createThread, listThreads } from "@/lib/server/notebook";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ threads: await listThreads(db, member, id) });
});

/** Start a thread: {stepId?, anchor?: {plot, xMin, xMax, …}, body}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["comment.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json(await createThread(db, member, id, await jsonBody(req)), { status: 201 });
});
