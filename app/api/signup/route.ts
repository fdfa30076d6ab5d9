import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { getDb } from "@/lib/server/db/client";
import { signUp } from "@/lib/server/users";
import { assertSameOrigin } from "@/lib/server/handler";

export const dynamic = "force-dynamic";

export const POST = route(async (req) => {
  assertSameOrigin(req);
  const user = await signUp(getDb(), await jsonBody(req));
  return NextResponse.json({ user }, { status: 201 });
});
