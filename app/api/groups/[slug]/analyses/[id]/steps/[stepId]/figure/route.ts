import { route } from "@/lib/server/http";
import { inGroup } from "@/lib/server/handler";
import { openNotebook } from "@/lib/server/notebook";
import { ConflictError, InputError, NotFoundError } from "@/lib/engine/errors";
import { COLUMN_WIDTHS_CM, columnWidthPt, fitFigure, scanFigure, type ColumnWidth } from "@/lib/charts/figures";
import { chartSvg } from "@/lib/charts/svg";
import type { FitStepResult } from "@/lib/charts/notebook";
import { FIGURE_FONT_FAMILY } from "@/lib/server/figures/fonts";
import { figurePdf } from "@/lib/server/figures/svgPdf";
import { embedFont } from "@/lib/server/figures/embedFont";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";
type Ctx = { params: Promise<{ slug: string; id: string; stepId: string }> };

/**
 * A fit step's chart as a manuscript figure, from its stored result: ?chart=fit (C/T vs T² with
 * residuals) | scan (the window scan), ?format=pdf|svg, ?column=single (8.5 cm) | double
 * (17.5 cm), ?revision=ID (default the newest). Text is text at 8 pt in embedded DejaVu Sans.
 */
export const GET = route(async (req, { params }: Ctx) => {
  const { slug, id, stepId } = await params;
  const { db, member } = await inGroup(req, slug);
  const q = new URL(req.url).searchParams;
  const chart = q.get("chart") ?? "fit", format = q.get("format") ?? "pdf", column = (q.get("column") ?? "single") as ColumnWidth;
  if (chart !== "fit" && chart !== "scan") throw new InputError(`invalid chart: ${JSON.stringify(chart)} (fit or scan)`, { field: "chart" });
  if (format !== "svg" && format !== "pdf") throw new InputError(`invalid format: ${JSON.stringify(format)} (svg or pdf)`, { field: "format" });
  if (!Object.hasOwn(COLUMN_WIDTHS_CM, column)) throw new InputError(`invalid column: ${JSON.stringify(column)} (single or double)`, { field: "column" });
  const nb = await openNotebook(db, member, id, q.get("revision") ?? undefined);
  const step = nb.steps.find((s) => s.id === stepId);
  if (!step || step.kind !== "fit") throw new NotFoundError("fit step");
  if (!step.output?.ok || !step.output.result) throw new ConflictError("this fit step has no result to draw: fix its settings first");
  const r = step.output.result as unknown as FitStepResult;
  if (chart === "scan" && !r.scan) throw new ConflictError("this fit step ran no window scan");
  const paper = { widthPt: columnWidthPt(column), fontSize: 8 };
  const options = chart === "fit" ? fitFigure(r, paper) : scanFigure(r.scan!, r.basis, paper, null);
  const svg = chartSvg(options, { fontSize: 8, fontFamily: `${FIGURE_FONT_FAMILY}, sans-serif`, background: "#ffffff" });
  const stem = `${nb.analysis.title}-r${nb.revision.number}-step${step.position + 1}-${chart}-${COLUMN_WIDTHS_CM[column]}cm`.replace(/[^\w.-]+/g, "_");
  const headers = (type: string, ext: string) => ({ "content-type": type, "content-disposition": `attachment; filename="${stem}.${ext}"`, "cache-control": "private, no-store" });
  if (format === "svg") return new Response(embedFont(svg), { headers: headers("image/svg+xml; charset=utf-8", "svg") });
  return new Response((await figurePdf(svg, COLUMN_WIDTHS_CM[column], `${nb.analysis.title}: ${chart}`)) as BodyInit, { headers: headers("application/pdf", "pdf") });
});
