import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { seriesCsv, seriesView } from "@/lib/server/series";
import { viewOptions } from "../options";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/** The series table as CSV (safe cells, units in headers), same options as the view. */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const view = await seriesView(db, member, id, viewOptions(req));
  const name = view.series.name.replace(/[^A-Za-z0-9._-]+/g, "_");
  return new Response(seriesCsv(view), { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${name}.csv"` } });
});
