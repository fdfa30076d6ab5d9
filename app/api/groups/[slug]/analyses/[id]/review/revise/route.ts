import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { reviseSealed } from "@/lib/server/review";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Start a new open revision from the analysis's sealed one (201 with the new revision). */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ revision: await reviseSealed(db, member, id) }, { status: 201 });
});
