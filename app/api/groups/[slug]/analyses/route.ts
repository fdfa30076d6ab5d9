import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { createAnalysis, listAnalyses } from "@/lib/server/notebook";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  const url = new URL(req.url);
  const analyses = await listAnalyses(db, member, { sampleId: url.searchParams.get("sampleId") ?? undefined, q: url.searchParams.get("q") ?? undefined, archived: url.searchParams.get("archived") === "1" });
  return NextResponse.json({ analyses });
});

export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ analysis: await createAnalysis(db, member, await jsonBody(req)) }, { status: 201 });
});
