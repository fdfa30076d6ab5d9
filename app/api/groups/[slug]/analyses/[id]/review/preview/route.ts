import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { sealPreview } from "@/lib/server/review";
import { InputError } from "@/lib/engine/errors";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** What approving revision ?revision=ID would seal, its open threads and the signature's meanings (reviewers). */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const revision = new URL(req.url).searchParams.get("revision");
  if (!revision) throw new InputError("name the revision", { field: "revision" });
  return NextResponse.json({ preview: await sealPreview(db, member, id, revision) });
});
