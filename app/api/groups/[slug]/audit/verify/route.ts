import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { authorise } from "@/lib/server/access";
import { verifyAuditChain } from "@/lib/server/audit";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** Owners only: walk the whole audit hash chain and name the first broken row, if any. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, member } = await inGroup(req, slug);
  authorise(member, "audit.read");
  return NextResponse.json({ chain: await verifyAuditChain(db) });
});
