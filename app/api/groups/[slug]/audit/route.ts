import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { listAuditEvents } from "@/lib/server/review";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string }> };

/** Owners only: the group's audit events, newest first (?before=ID&take=N). */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug } = await params;
  const { db, member } = await inGroup(req, slug);
  const q = new URL(req.url).searchParams;
  const take = q.get("take") ? Number(q.get("take")) : undefined;
  return NextResponse.json({ events: await listAuditEvents(db, member, { ...(q.get("before") ? { before: q.get("before")! } : {}), ...(take && Number.isFinite(take) ? { take } : {}) }) });
});
