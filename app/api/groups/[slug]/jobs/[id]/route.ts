import { NextResponse } from "next/server";
import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { jobStatus } from "@/lib/server/jobs";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** One job: state, progress (done of total), message, result when done, error when failed. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { member } = await inGroup(req, slug);
  return NextResponse.json({ job: await jobStatus(member, id) });
});
