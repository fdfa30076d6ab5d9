import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { signedIn } from "@/lib/server/handler";
import { createGroup, listMyGroups } from "@/lib/server/groups";

export const dynamic = "force-dynamic";

export const GET = route(async (req) => {
  const { db, user } = await signedIn(req);
  return NextResponse.json({ groups: await listMyGroups(db, user.id) });
});

export const POST = route(async (req) => {
  const { db, user } = await signedIn(req);
  const group = await createGroup(db, user.id, await jsonBody(req));
  return NextResponse.json({ group }, { status: 201 });
});
