import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { enqueueJob, listJobs } from "@/lib/server/jobs";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** The group's newest jobs with their progress. */
export const GET = route(async (req, { params }: Ctx) => {
  const { member } = await inGroup(req, (await params).slug);
  return NextResponse.json({ jobs: await listJobs(member) });
});

/** Enqueue {kind: "refit-series", seriesId} or {kind: "window-scan", analysisId, stepId, gridSize?} (owner, analyst). */
export const POST = route(async (req, { params }: Ctx) => {
  const { db, member } = await inGroup(req, (await params).slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ job: await enqueueJob(db, member, await jsonBody(req)) }, { status: 202 });
});
