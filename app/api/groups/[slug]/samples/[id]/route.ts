import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { getSample, setSampleArchived, updateSample } from "@/lib/server/samples";
import { listMeasurements } from "@/lib/server/measurements";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const sample = await getSample(db, member, id);
  return NextResponse.json({ sample, measurements: await listMeasurements(db, member, { sampleId: id }) });
});

export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["sample.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ sample: await updateSample(db, member, id, await jsonBody(req)) });
});

const archiveSchema = z.object({ archived: z.boolean() });

/** Archive or restore (samples are never deleted: measurements and analyses refer to them). */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["sample.write"]); // before the body: a role that may not write hears 403
  const { archived } = parseInput(archiveSchema, await jsonBody(req));
  return NextResponse.json({ sample: await setSampleArchived(db, member, id, archived) });
});
