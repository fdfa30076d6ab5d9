import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { addStep } from "@/lib/server/notebook";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Add a step: {revisionId, revisionVersion, kind, position?, title?, config?}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json(await addStep(db, member, id, await jsonBody(req)), { status: 201 });
});
