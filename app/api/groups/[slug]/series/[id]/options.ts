/** Query options of the series page's routes: ?axis=x|ea&include=drafts&trendFrom=sealed|shown. */
import type { SeriesViewOptions } from "@/lib/server/series";

export function viewOptions(req: Request): SeriesViewOptions {
  const q = new URL(req.url).searchParams;
  return {
    axis: q.get("axis") === "ea" ? "ea" : "x",
    includeDrafts: q.get("include") === "drafts",
    trendFrom: q.get("trendFrom") === "shown" ? "shown" : "sealed",
  };
}
