import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { assertSameOrigin } from "@/lib/server/handler";
import { database as getDb } from "@/lib/server/database";
import { describePasswordLink, setPasswordWithLink } from "@/lib/server/passwordLinks";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ token: string }> };

/** Set the password of the link's account: { password }. No session: the link is the proof. */
export const POST = route(async (req, { params }: Ctx) => {
  assertSameOrigin(req);
  const { token } = await params;
  await describePasswordLink(getDb(), token); // the link is the access: an unknown one is 404 before the body is read
  const body = (await jsonBody(req)) as { password?: unknown } | null;
  return NextResponse.json(await setPasswordWithLink(getDb(), token, body?.password));
});
