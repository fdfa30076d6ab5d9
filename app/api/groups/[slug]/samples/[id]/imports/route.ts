import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup, readUpload } from "@/lib/server/handler";
import { getSample } from "@/lib/server/samples";
import { previewImport } from "@/lib/server/measurements";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Preview an upload (`options`: {parse?, mapping?}): parsed columns, first rows, guessed roles, every bad line, order checks, the curve. Stores nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  await getSample(db, member, id);
  const upload = await readUpload(req);
  return NextResponse.json({ preview: previewImport(member, upload.fileName, upload.bytes, upload.fields) });
});
