import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { listSeries } from "@/lib/server/series";
import { listSamples } from "@/lib/server/samples";
import { can } from "@/lib/server/permissions";
import { fmtDay } from "@/app/_lib/format";
import { SeriesCreateForm } from "@/app/components/series/SeriesCreateForm";
import { Sym } from "@/app/components/Sym";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Series" };

/** The group's composition series and, for analysts and owners, a form to start one. */
export default async function SeriesListPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const home = `/g/${encodeURIComponent(slug)}`;
  const { db, member } = await pageMember(slug, `${home}/series`);
  const [series, samples] = await Promise.all([listSeries(db, member), listSamples(db, member, { take: 500 })]);
  const write = can(member.role, "series.write");
  return (
    <>
      <h1>Composition series</h1>
      <p className="lede">γ, <Sym m="Θ_D" />, D(<Sym m="E_F" />), m*/m and <Sym m="T_c" /> across a series of samples, from reviewed (sealed) analyses, with weighted trends.</p>
      <section className="sheet" aria-labelledby="all-series">
        <h2 id="all-series">Series of {member.group.name}</h2>
        {series.length === 0 ? <p className="muted">No series yet.</p> : (
          <table data-testid="series-list">
            <thead><tr><th>Name</th><th>Composition variable</th><th className="num">Samples</th><th>Created</th></tr></thead>
            <tbody>
              {series.map((s) => (
                <tr key={s.id}>
                  <td><Link href={`${home}/series/${s.id}`}>{s.name}</Link>{s.description && <div className="small muted">{s.description}</div>}</td>
                  <td className="mono">{s.compositionVariable}</td>
                  <td className="num">{s.memberIds.length}</td>
                  <td>{fmtDay(s.createdAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {write && (
        <section className="sheet" aria-labelledby="new-series">
          <h2 id="new-series">Start a series</h2>
          <SeriesCreateForm apiBase={`/api/groups/${encodeURIComponent(slug)}`} seriesBase={`${home}/series`} samples={samples.filter((s) => !s.archived).map((s) => ({ id: s.id, label: s.label, formula: s.formula }))} />
        </section>
      )}
    </>
  );
}
