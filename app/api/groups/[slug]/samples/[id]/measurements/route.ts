import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { authoriseAny } from "@/lib/server/access";
import { inGroup, readUpload } from "@/lib/server/handler";
import { importMeasurement, listMeasurements } from "@/lib/server/measurements";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  return NextResponse.json({ measurements: await listMeasurements(db, member, { sampleId: id }) });
});

/** Accept an import: multipart `file` + JSON `options` {kind, label, mapping, units, fieldT?, notes?, parse?}. */
export const POST = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  authoriseAny(member, ["measurement.write"]); // before the body: a role that may not write hears 403
  const upload = await readUpload(req);
  const measurement = await importMeasurement(db, member, id, upload.fileName, upload.bytes, upload.fields);
  return NextResponse.json({ measurement }, { status: 201 });
});
