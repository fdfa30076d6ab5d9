import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup, inGroupWith } from "@/lib/server/handler";
import { authorise, authoriseAny } from "@/lib/server/access";
import { createSample, listSamples, sampleListParams, sampleListSql } from "@/lib/server/samples";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const url = new URL(req.url);
  const opts = {
    q: url.searchParams.get("q")?.trim() || undefined,
    archived: url.searchParams.get("archived") === "1",
    take: Number(url.searchParams.get("take") ?? 200),
    skip: Number(url.searchParams.get("skip") ?? 0),
  };
  if (opts.q) {
    const { db, member } = await inGroup(req, slug);
    return NextResponse.json({ samples: await listSamples(db, member, opts) });
  }
  // The plain list: membership and samples in one statement; the list arrives as JSON text.
  let page: ReturnType<typeof sampleListParams>;
  try {
    page = sampleListParams(opts);
  } catch (err) {
    await inGroup(req, slug); // who may not read the group hears 401/404 before any word on the page
    throw err;
  }
  const { member, extra } = await inGroupWith(req, slug, { sql: sampleListSql, values: page });
  authorise(member, "group.read");
  return new NextResponse(`{"samples":${extra ?? "[]"}}`, { headers: { "content-type": "application/json" } });
});

export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["sample.write"]); // before the body: a role that may not write hears 403
  const sample = await createSample(db, member, await jsonBody(req));
  return NextResponse.json({ sample }, { status: 201 });
});
