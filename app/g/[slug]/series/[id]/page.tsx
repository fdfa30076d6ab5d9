import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { listSeries, seriesView } from "@/lib/server/series";
import { SeriesExplorer } from "@/app/components/series/SeriesExplorer";
import { JobsPanel } from "@/app/components/jobs/JobsPanel";
import { can } from "@/lib/server/permissions";
import "@/app/components/series/series.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Series" };

/** One composition series: chart with trends, the table of values, exports. The view is the server's (seriesView); the page only draws it. */
export default async function SeriesPage({ params }: { params: Promise<{ slug: string; id: string }> }) {
  const { slug, id } = await params;
  const home = `/g/${encodeURIComponent(slug)}`;
  const { db, member } = await pageMember(slug, `${home}/series/${id}`);
  const view = await orNotFound(() => seriesView(db, member, id, { axis: "x" }));
  const others = (await listSeries(db, member)).filter((s) => s.id !== id).map((s) => ({ id: s.id, name: s.name }));
  return (
    <>
      <div className="crumbs"><Link href={`${home}/series`}>Series</Link></div>
      <h1 data-testid="series-title">{view.series.name}</h1>
      {view.series.description && <p className="lede">{view.series.description}</p>}
      <SeriesExplorer slug={slug} initial={view} others={others} />
      {can(member.role, "series.write") && <JobsPanel slug={slug} seriesId={id} />}
    </>
  );
}
