import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { issuePasswordLink } from "@/lib/server/passwordLinks";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; userId: string }> };

/** Owner: a single-use, expiring link for a member without a password (shown once). */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, userId } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ link: await issuePasswordLink(db, member, userId) }, { status: 201 });
});
