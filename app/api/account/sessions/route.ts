import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { signedIn } from "@/lib/server/handler";
import { listLiveSessions } from "@/lib/server/auth/sessions";

export const dynamic = "force-dynamic";

/** The signed-in user's live sessions (when started, last used, when they end at the latest). */
export const GET = route(async (req) => {
  const { db, user } = await signedIn(req);
  return NextResponse.json({ sessions: await listLiveSessions(db, user.id) });
});
