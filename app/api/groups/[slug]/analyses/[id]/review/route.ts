import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { reviewStatus, reviewTransition } from "@/lib/server/review";
import { parseInput } from "@/lib/server/validate";
import { institutionSignInAt } from "@/lib/server/session";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The review picture: revisions, decisions, seals, and the actions the caller may take. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ review: await reviewStatus(db, member, id) });
});

const bodySchema = z.object({ revisionId: z.string().min(1, "name the revision") }).passthrough();

/**
 * A review action: { revisionId, action: submit|withdraw|return|approve|resubmit, version, comment? }.
 * approve is a signature: also { meaning, comment (the note, required), password, acknowledgedThreadIds };
 * the password is checked in this request before anything is written (accounts without one need an
 * institutional sign-in of the last few minutes).
 */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.submit", "analysis.review"]); // before the body: a role that may not write hears 403
  const body = await jsonBody(req);
  const { revisionId, ...rest } = parseInput(bodySchema, body);
  return NextResponse.json({ transition: await reviewTransition(db, member, id, revisionId, rest, { institutionSignInAt: await institutionSignInAt() }) });
});
