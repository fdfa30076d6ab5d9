import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { moveStep, removeStep, updateStep } from "@/lib/server/notebook";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string; stepId: string }> };

/** Save a step's configuration: {version, config, title?}; 409 with the newer step on a conflict. */
export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id, stepId } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json(await updateStep(db, member, id, stepId, await jsonBody(req)));
});

/** Remove a step: ?revisionVersion=N. */
export const DELETE = route(async (req, { params }: Ctx) => {
  const { slug, id, stepId } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  await removeStep(db, member, id, stepId, { revisionVersion: Number(new URL(req.url).searchParams.get("revisionVersion")) });
  return NextResponse.json({ ok: true });
});

const moveSchema = z.object({ action: z.literal("move") }).passthrough();

/** Move a step: {action: "move", position, revisionVersion}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id, stepId } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  const body = await jsonBody(req);
  parseInput(moveSchema, body);
  await moveStep(db, member, id, stepId, body);
  return NextResponse.json({ ok: true });
});
