import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { removeSeriesMember } from "@/lib/server/series";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string; sampleId: string }> };

export const DELETE = route(async (req, { params }: Ctx) => {
  const { slug, id, sampleId } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["series.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ series: await removeSeriesMember(db, member, id, sampleId) });
});
