import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { getOriginalFile } from "@/lib/server/measurements";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The uploaded file exactly as received, with its SHA-256 in a header. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const file = await getOriginalFile(db, member, id);
  return new Response(Buffer.from(file.bytes), {
    headers: {
      "content-type": "application/octet-stream",
      "content-disposition": `attachment; filename="${file.fileName.replace(/[^\w.\-]+/g, "_")}"`,
      "x-content-sha256": file.sha256,
    },
  });
});
