import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { database as getDb } from "@/lib/server/database";
import { signUp } from "@/lib/server/users";
import { assertSameOrigin } from "@/lib/server/handler";

export const dynamic = "force-dynamic";

/** Sign up {email, name, password}. The same 202 answer whether or not the address had an account (lib/server/users.ts). */
export const POST = route(async (req) => {
  assertSameOrigin(req);
  const answer = await signUp(getDb(), await jsonBody(req));
  return NextResponse.json(answer, { status: 202 });
});
