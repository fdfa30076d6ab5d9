import { NextResponse } from "next/server";
import { z } from "zod";
import { route, jsonBody } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup, inGroupWith } from "@/lib/server/handler";
import { notebookParams, notebookSql, parseNotebookRow } from "@/lib/server/notebook/read";
import { duplicateAnalysis, notebookJson, openNotebook, renameAnalysis, setAnalysisArchived } from "@/lib/server/notebook";
import { parseInput } from "@/lib/server/validate";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The notebook: a revision (?revision=ID, default the newest) with every step computed. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const revision = new URL(req.url).searchParams.get("revision") ?? undefined;
  // The membership and the notebook's rows in one statement (group-scoped by that membership).
  const { db, member, extra } = await inGroupWith(req, slug, { sql: (group, p) => notebookSql(group, `${p(0)}::uuid`, `${p(1)}::uuid`), values: notebookParams(id, revision) });
  const view = await openNotebook(db, member, id, revision, extra === null ? null : parseNotebookRow(extra));
  return new NextResponse(notebookJson(view), { headers: { "content-type": "application/json" } });
});

export const PATCH = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
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
  authoriseAny(member, ["analysis.write"]); // before the body: a role that may not write hears 403
  const body = parseInput(actionSchema, await jsonBody(req));
  if (body.action === "archive") {
    await setAnalysisArchived(db, member, id, body.archived);
    return NextResponse.json({ ok: true });
  }
  return NextResponse.json({ analysis: await duplicateAnalysis(db, member, id, { title: body.title }) }, { status: 201 });
});
