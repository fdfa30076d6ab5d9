import { v1, ENDPOINTS } from "@/lib/server/api";
import { seriesCsv, seriesView } from "@/lib/server/series";

export const dynamic = "force-dynamic";

export const GET = v1(ENDPOINTS.getSeries, async ({ db, member, params, query }) => {
  const view = await seriesView(db, member, params.id!, { axis: query.axis, includeDrafts: query.include === "drafts", trendFrom: query.trendFrom });
  if (query.format !== "csv") return view;
  const name = view.series.name.replace(/[^A-Za-z0-9._-]+/g, "_");
  return new Response(seriesCsv(view), { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${name}.csv"` } });
});
