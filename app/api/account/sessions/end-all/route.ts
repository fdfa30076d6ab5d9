import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { signedIn } from "@/lib/server/handler";
import { endAllSessions } from "@/lib/server/auth/sessions";

export const dynamic = "force-dynamic";

/** "Sign out everywhere": end every session of the signed-in user, this one included. */
export const POST = route(async (req) => {
  const { db, user } = await signedIn(req);
  return NextResponse.json({ ended: await endAllSessions(db, user.id) });
});
