import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { createToken, listTokens } from "@/lib/server/tokens";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** The signed-in user's API tokens for this group (never the secrets). */
export const GET = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  return NextResponse.json({ tokens: await listTokens(db, member) });
});

/** Create a token {name, scope}; the answer carries the secret, shown this once. */
export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  const { token, info } = await createToken(db, member, await jsonBody(req));
  return NextResponse.json({ token, info }, { status: 201, headers: { "Cache-Control": "no-store" } });
});
