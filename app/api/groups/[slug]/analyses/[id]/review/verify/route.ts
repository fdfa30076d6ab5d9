import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { verifyRevision } from "@/lib/server/review";
import { InputError } from "@/lib/engine/errors";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** Verify a sealed revision (?revision=ID): content hash, file checksums, engine re-run per step. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug); // access first, then the query
  const revision = new URL(req.url).searchParams.get("revision");
  if (!revision) throw new InputError("name the revision to verify", { field: "revision" });
  return NextResponse.json({ verification: await verifyRevision(db, member, id, revision) });
});
