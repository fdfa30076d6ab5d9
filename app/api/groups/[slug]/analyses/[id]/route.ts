import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { duplicateAnalysis, notebookJson, openNotebook, renameAnalysis, setAnalysisArchived } from "@/lib/server/notebook";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The notebook: a revision (?revision=ID, default the newest) with every step computed. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const revision = new URL(req.url).searchParams.get("revision") ?? undefined;
  return new NextResponse(notebookJson(await openNotebook(db, member, id, revision)), { headers: { "content-type": "application/json" } });
});

export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  await renameAnalysis(db, member, id, await jsonBody(req));
  return NextResponse.json({ ok: true });
});

const actionSchema = z.discriminatedUnion("action", [
  z.object({ action: z.literal("archive"), archived: z.boolean() }),
  z.object({ action: z.literal("duplicate"), title: z.string() }),
]);

/** Archive/restore or duplicate. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const body = parseInput(actionSchema, await jsonBody(req));
  if (body.action === "archive") {
    await setAnalysisArchived(db, member, id, body.archived);
    return NextResponse.json({ ok: true });
  }
  return NextResponse.json({ analysis: await duplicateAnalysis(db, member, id, { title: body.title }) }, { status: 201 });
});
