import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { signedIn } from "@/lib/server/handler";
import { acceptInvitation } from "@/lib/server/groups";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ token: string }> };

export const POST = route(async (req, { params }: Ctx) => {
  const { db, user } = await signedIn(req);
  const group = await acceptInvitation(db, user, (await params).token);
  return NextResponse.json({ group });
});
