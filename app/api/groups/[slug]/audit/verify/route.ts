import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { authorise } from "@/lib/server/access";
import { auditKey } from "@/lib/server/auditKey";
import { verifyGroup } from "@/lib/server/integrity";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** Owners only: verify this group's own audit chain (signatures, order, gaps) and the other integrity checks, naming every problem. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, member } = await inGroup(req, slug);
  authorise(member, "audit.read");
  return NextResponse.json(await verifyGroup(db, member.group.id, auditKey()));
});
