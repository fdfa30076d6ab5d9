import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { diffRevisions } from "@/lib/server/review";
import { InputError } from "@/lib/engine/errors";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** What changed from revision ?a=ID to revision ?b=ID of this analysis. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  // Access first: a stranger hears 401/404, never what the route expects.
  const { db, member } = await inGroup(req, slug);
  const q = new URL(req.url).searchParams;
  const a = q.get("a"), b = q.get("b");
  if (!a) throw new InputError("name the older revision", { field: "a" });
  if (!b) throw new InputError("name the newer revision", { field: "b" });
  return NextResponse.json({ diff: await diffRevisions(db, member, a, b, id) });
});
