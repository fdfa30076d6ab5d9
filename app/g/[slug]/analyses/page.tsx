import type { Metadata } from "next";
import Link from "next/link";
import "@/app/components/notebook/notebook.css";
import { pageMember } from "@/app/_server/guard";
import { listAnalyses } from "@/lib/server/notebook";
import { listSamples } from "@/lib/server/samples";
import { can } from "@/lib/server/permissions";
import { groupPaths } from "@/app/_lib/paths";
import { fmtDate } from "@/app/_lib/format";
import { STATE_LABEL } from "@/app/components/notebook/display";
import { CreateAnalysisForm, AnalysisActions } from "@/app/components/notebook/AnalysisControls";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Analyses" };

export default async function AnalysesPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ archived?: string; sample?: string }> }) {
  const { slug } = await params;
  const sp = await searchParams;
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, `${p.home}/analyses`);
  const archived = sp.archived === "1";
  const [analyses, samples] = await Promise.all([listAnalyses(db, member, { archived, ...(sp.sample ? { sampleId: sp.sample } : {}) }), listSamples(db, member)]);
  const write = can(member.role, "analysis.write");
  const api = `${p.api}/analyses`;
  const forSample = sp.sample ? samples.find((s) => s.id === sp.sample) ?? null : null;
  return (
    <>
      <h1>Analyses</h1>
      <p className="lede">Each analysis is a chain of steps from a sample&apos;s measurements to its γ, β and Θ_D, computed on the server and discussed by the group.</p>
      {write && !archived && (
        <section className="sheet" aria-labelledby="new-analysis">
          <h2 id="new-analysis">New analysis</h2>
          <CreateAnalysisForm api={api} basePath={`${p.home}/analyses`} samples={samples.map((s) => ({ id: s.id, label: s.label }))} initialSampleId={sp.sample ?? null} />
        </section>
      )}
      <section className="sheet" aria-labelledby="list">
        <h2 id="list">{archived ? "Archived analyses" : forSample ? `Analyses of ${forSample.label}` : "Analyses of the group"}</h2>
        <p className="small">
          {forSample && <><Link href={`${p.home}/analyses`}>Show the whole group&apos;s analyses</Link> · </>}
          {archived ? <Link href={`${p.home}/analyses`}>Show current analyses</Link> : <Link href={`${p.home}/analyses?archived=1`}>Show archived analyses</Link>}
        </p>
        {analyses.length === 0 ? <p className="muted">{archived ? "No archived analyses." : forSample ? `No analyses of ${forSample.label} yet.` : "No analyses yet."}</p> : (
          <div className="table-scroll">
            <table data-testid="analyses-list">
              <thead><tr><th>Title</th><th>Sample</th><th>Newest revision</th><th>Sealed</th><th>Changed</th>{write && <th><span className="sr-only">Actions</span></th>}</tr></thead>
              <tbody>
                {analyses.map((a) => (
                  <tr key={a.id}>
                    <td><Link href={`${p.home}/analyses/${a.id}`}>{a.title}</Link></td>
                    <td><Link href={p.sample(a.sampleId)}>{a.sampleLabel}</Link></td>
                    <td>{a.latestRevision ? <>r{a.latestRevision.number} <span className={`nb-state nb-state-${a.latestRevision.state}`}>{STATE_LABEL[a.latestRevision.state]}</span></> : "—"}</td>
                    <td>{a.sealedRevision ? <span className="nb-sealed" title={a.sealedRevision.contentHash ?? undefined}>sealed r{a.sealedRevision.number}</span> : <span className="muted">—</span>}</td>
                    <td className="small">{fmtDate(a.updatedAt)}</td>
                    {write && <td><AnalysisActions api={`${api}/${a.id}`} title={a.title} archived={a.archived} basePath={`${p.home}/analyses`} /></td>}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </>
  );
}
