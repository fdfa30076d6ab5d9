import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { buildReport } from "@/lib/server/review";
import { renderMarkdown } from "@/lib/server/markdown";
import { ConflictError } from "@/lib/engine/errors";
import { reportFigures } from "@/lib/server/figures/reportFigures";
import { chartSvg } from "@/lib/charts/svg";
import { COLUMN_WIDTHS_CM } from "@/lib/charts/figures";
import { ReportView } from "@/app/components/review/ReportView";
import { PrintButton } from "@/app/components/review/PrintButton";
import "@/app/components/review/report.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Report" };

/** The print-ready report of a sealed revision (?revision=ID; default the analysis's sealed one). Renders buildReport's object; computes nothing. */
export default async function ReportPage({ params, searchParams }: { params: Promise<{ slug: string; id: string }>; searchParams: Promise<{ revision?: string }> }) {
  const { slug, id } = await params;
  const { revision } = await searchParams;
  const base = `/g/${encodeURIComponent(slug)}/analyses/${id}`;
  const { db, member } = await pageMember(slug, `${base}/report${revision ? `?revision=${revision}` : ""}`);
  let r;
  try {
    r = await orNotFound(() => buildReport(db, member, id, revision));
  } catch (err) {
    if (!(err instanceof ConflictError)) throw err;
    return (<><h1>No report yet</h1><p className="notice-info">{err.message}. A report exists once a reviewer has approved and sealed a revision.</p><p><Link href={base}>Back to the analysis</Link></p></>);
  }
  const q = `?revision=${encodeURIComponent(r.revision.id)}`;
  const api = `/api/groups/${encodeURIComponent(slug)}/analyses/${id}`;
  const figures = reportFigures(r, { widthPt: 640, fontSize: 11 }).map((g) => ({
    id: g.id, position: g.position, caption: g.caption,
    svg: chartSvg(g.options, { fontSize: 11, fontFamily: "inherit" }),
    exports: (["single", "double"] as const).flatMap((col) => (["svg", "pdf"] as const).map((format) => ({
      label: `${format.toUpperCase()} ${COLUMN_WIDTHS_CM[col]} cm`, href: `${api}/figures/${g.id}${q}&format=${format}&column=${col}`,
    }))),
  }));
  const toolbar = (
    <div className="rp-screen-only actions crumbs">
      <Link href={`${base}${q}`}>← Back to the analysis</Link>
      <PrintButton />
      <a className="button quiet small" href={`${api}/report.pdf${q}`} download>Download PDF</a>
    </div>
  );
  return <ReportView r={r} figures={figures} toolbar={toolbar} renderNote={renderMarkdown} />;
}
