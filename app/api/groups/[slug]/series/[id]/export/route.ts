import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { seriesCsv, seriesLatex, seriesView } from "@/lib/server/series";
import { InputError } from "@/lib/engine/errors";
import { COLUMN_WIDTHS_CM, columnWidthPt, type ColumnWidth } from "@/lib/charts/figures";
import { seriesFigureSvg, seriesQuantity } from "@/lib/server/figures/seriesFigure";
import { figurePdf } from "@/lib/server/figures/svgPdf";
import { embedFont } from "@/lib/server/figures/embedFont";
import { viewOptions } from "../options";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";
type Ctx = { params: Promise<{ slug: string; id: string }> };

/**
 * The series for a manuscript, same options as the view: ?format=csv (default; safe cells,
 * units in headers) | latex (a tabular with value(σ) columns) | svg | pdf (the chart of
 * ?quantity=gamma|thetaD|dosEF|massRatio|tc with its ?degree=1|2 trend at ?column=single|double).
 */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id } = await params;
  const { db, member } = await inGroup(req, slug);
  const q = new URL(req.url).searchParams;
  const format = q.get("format") ?? "csv";
  if (!["csv", "latex", "svg", "pdf"].includes(format)) throw new InputError(`invalid format: ${JSON.stringify(format)} (csv, latex, svg or pdf)`, { field: "format" });
  const view = await seriesView(db, member, id, viewOptions(req));
  const name = view.series.name.replace(/[^A-Za-z0-9._-]+/g, "_");
  const file = (type: string, fileName: string) => ({ "Content-Type": type, "Content-Disposition": `attachment; filename="${fileName}"`, "Cache-Control": "private, no-store" });
  if (format === "csv") return new Response(seriesCsv(view), { headers: file("text/csv; charset=utf-8", `${name}.csv`) });
  if (format === "latex") return new Response(seriesLatex(view), { headers: file("application/x-tex; charset=utf-8", `${name}.tex`) });
  const quantity = seriesQuantity(q.get("quantity"));
  const degree = q.get("degree") === "2" ? 2 : 1;
  const column = (q.get("column") ?? "single") as ColumnWidth;
  if (!Object.hasOwn(COLUMN_WIDTHS_CM, column)) throw new InputError(`invalid column: ${JSON.stringify(column)} (single or double)`, { field: "column" });
  const svg = seriesFigureSvg(view, quantity, degree, { widthPt: columnWidthPt(column), fontSize: 8 });
  const stem = `${name}-${quantity}-${COLUMN_WIDTHS_CM[column]}cm`;
  if (format === "svg") return new Response(embedFont(svg), { headers: file("image/svg+xml; charset=utf-8", `${stem}.svg`) });
  const pdf = await figurePdf(svg, COLUMN_WIDTHS_CM[column], `${view.series.name}: ${quantity}`);
  return new Response(pdf as BodyInit, { headers: file("application/pdf", `${stem}.pdf`) });
});
