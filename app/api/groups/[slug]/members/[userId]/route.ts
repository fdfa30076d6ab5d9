import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { changeRole, removeMember } from "@/lib/server/groups";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; userId: string }> };

/** Change a member's role (owners only). */
export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, userId } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["group.manage"]); // before the body: a role that may not write hears 403
  await changeRole(db, member, userId, await jsonBody(req));
  return NextResponse.json({ ok: true });
});

/** Remove a member (owners), or leave the group (yourself). */
export const DELETE = route(async (req, { params }: Ctx) => {
  const { slug, userId } = await params;
  const { db, member } = await inGroup(req, slug);
  await removeMember(db, member, userId === "me" ? member.userId : userId);
  return NextResponse.json({ ok: true });
});
