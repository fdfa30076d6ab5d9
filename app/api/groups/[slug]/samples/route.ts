import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { createSample, listSamples } from "@/lib/server/samples";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  const url = new URL(req.url);
  const samples = await listSamples(db, member, {
    q: url.searchParams.get("q") ?? undefined,
    archived: url.searchParams.get("archived") === "1",
    take: Number(url.searchParams.get("take") ?? 200),
    skip: Number(url.searchParams.get("skip") ?? 0),
  });
  return NextResponse.json({ samples });
});

export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  const sample = await createSample(db, member, await jsonBody(req));
  return NextResponse.json({ sample }, { status: 201 });
});
