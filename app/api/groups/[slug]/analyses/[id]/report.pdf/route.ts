import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { buildReport, renderReportPdf } from "@/lib/server/review";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The PDF report of a sealed revision (?revision=ID; default the analysis's sealed revision). */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const report = await buildReport(db, member, id, new URL(req.url).searchParams.get("revision") ?? undefined);
  const pdf = await renderReportPdf(report);
  const name = `${report.sample.label}-r${report.revision.number}-${report.contentHash.slice(0, 8)}.pdf`.replace(/[^\w.-]+/g, "_");
  return new Response(pdf as BodyInit, { headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="${name}"`, "cache-control": "private, no-store" } });
});
