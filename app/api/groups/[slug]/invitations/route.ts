import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { inviteMember, listInvitations } from "@/lib/server/groups";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  return NextResponse.json({ invitations: await listInvitations(db, member) });
});

export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["group.manage"]); // before the body: a role that may not write hears 403
  const { token, invitation } = await inviteMember(db, member, await jsonBody(req));
  const origin = new URL(req.url).origin;
  return NextResponse.json({ invitation, token, link: `${origin}/invite/${token}` }, { status: 201 });
});
