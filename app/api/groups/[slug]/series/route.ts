import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
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
  return NextResponse.json({ series: await createSeries(db, member, await jsonBody(req)) }, { status: 201 });
});
