import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { addSeriesMembers } from "@/lib/server/series";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Add member samples {sampleIds: [...]}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["series.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ series: await addSeriesMembers(db, member, id, await jsonBody(req)) });
});
