import { NextResponse } from "next/server";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup } from "@/lib/server/handler";
import { seriesView, updateSeries } from "@/lib/server/series";
import { viewOptions } from "./options";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The series table and trends (?axis=x|ea&include=drafts&trendFrom=sealed|shown). */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ view: await seriesView(db, member, id, viewOptions(req)) });
});

/** Rename / change the composition variable or description. */
export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["series.write"]); // before the body: a role that may not write hears 403
  return NextResponse.json({ series: await updateSeries(db, member, id, await jsonBody(req)) });
});
