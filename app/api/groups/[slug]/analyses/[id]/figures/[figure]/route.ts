import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { buildReport } from "@/lib/server/review";
import { InputError, NotFoundError } from "@/lib/engine/errors";
import { COLUMN_WIDTHS_CM, columnWidthPt, type ColumnWidth } from "@/lib/charts/figures";
import { figureSvg, reportFigures } from "@/lib/server/figures/reportFigures";
import { figurePdf } from "@/lib/server/figures/svgPdf";
import { embedFont } from "@/lib/server/figures/embedFont";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";
type Ctx = { params: Promise<{ slug: string; id: string; figure: string }> };

/**
 * One figure of a sealed revision's report for a manuscript: ?format=svg|pdf, ?column=single
 * (8.5 cm) | double (17.5 cm), ?revision=ID (default the sealed revision). Text stays text at
 * 8 pt in DejaVu Sans, embedded in both formats.
 */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id, figure } = await params;
  const { db, member } = await inGroup(req, slug);
  const url = new URL(req.url);
  const format = url.searchParams.get("format") ?? "svg";
  const column = (url.searchParams.get("column") ?? "single") as ColumnWidth;
  if (format !== "svg" && format !== "pdf") throw new InputError(`invalid format: ${JSON.stringify(format)} (svg or pdf)`, { field: "format" });
  if (!Object.hasOwn(COLUMN_WIDTHS_CM, column)) throw new InputError(`invalid column: ${JSON.stringify(column)} (single or double)`, { field: "column" });
  const report = await buildReport(db, member, id, url.searchParams.get("revision") ?? undefined);
  const fig = reportFigures(report, { widthPt: columnWidthPt(column), fontSize: 8 }).find((f) => f.id === figure);
  if (!fig) throw new NotFoundError("figure");
  const base = `${report.sample.label}-r${report.revision.number}-${fig.id}-${COLUMN_WIDTHS_CM[column]}cm`.replace(/[^\w.-]+/g, "_");
  const svg = figureSvg(fig, 8);
  const headers = (type: string, ext: string) => ({ "content-type": type, "content-disposition": `attachment; filename="${base}.${ext}"`, "cache-control": "private, no-store" });
  if (format === "svg") return new Response(embedFont(svg), { headers: headers("image/svg+xml; charset=utf-8", "svg") });
  const pdf = await figurePdf(svg, COLUMN_WIDTHS_CM[column], `${report.title}, revision ${report.revision.number}: ${fig.id}`);
  return new Response(pdf as BodyInit, { headers: headers("application/pdf", "pdf") });
});
