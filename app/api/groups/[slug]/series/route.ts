import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { createSeries, listSeries } from "@/lib/server/series";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  return NextResponse.json({ series: await listSeries(db, member) });
});

/** Create {name, compositionVariable?, description?, sampleIds?}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["series.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ series: await createSeries(db, member, await jsonBody(req)) }, { status: 201 });
});
