import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { listSamples } from "@/lib/server/samples";
import { can } from "@/lib/server/permissions";
import { groupPaths } from "@/app/_lib/paths";
import { Formula } from "@/app/components/Formula";
import { fmtNumber } from "@/app/_lib/format";
import { SampleCreateForm } from "@/app/components/SampleCreateForm";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Samples" };

type Search = Record<string, string | string[] | undefined>;

export default async function SamplesPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<Search> }) {
  const { slug } = await params;
  const sp = await searchParams;
  const q = typeof sp.q === "string" ? sp.q : "";
  const archived = sp.archived === "1";
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, p.samples);
  const samples = await listSamples(db, member, { q, archived });
  return (
    <>
      <h1>Samples</h1>
      <p className="lede">Molar mass (IUPAC standard atomic weights) and atoms per formula unit are computed by the server from the formula.</p>
      <form className="inline-form sheet" method="get" role="search" aria-label="Search samples">
        <div className="field">
          <label htmlFor="sample-q">Search samples</label>
          <input id="sample-q" name="q" type="search" defaultValue={q} placeholder="label, formula, series, tag, notes" />
        </div>
        <label className="checkbox">
          <input type="checkbox" name="archived" value="1" defaultChecked={archived} /> Show archived only
        </label>
        <button type="submit" className="quiet">Search</button>
        {(q || archived) && <Link href={p.samples}>Clear</Link>}
      </form>
      <section className="sheet" aria-labelledby="sample-list">
        <h2 id="sample-list">{archived ? "Archived samples" : "Samples"}{q && <> matching “{q}”</>} <span className="muted small">({samples.length})</span></h2>
        {samples.length === 0 ? (
          <p className="muted">No samples {q ? "match this search" : archived ? "are archived" : "yet"}.</p>
        ) : (
          <div className="table-scroll">
            <table data-testid="sample-list">
              <thead>
                <tr>
                  <th>Label</th><th>Formula</th><th className="num">Molar mass (g/mol)</th><th className="num">Atoms per f.u.</th>
                  <th className="num">Mass (mg)</th><th>Series</th><th className="num">Composition</th><th>Tags</th>
                </tr>
              </thead>
              <tbody>
                {samples.map((s) => (
                  <tr key={s.id}>
                    <td><Link href={p.sample(s.id)}>{s.label}</Link></td>
                    <td><Formula text={s.formula} /></td>
                    <td className="num">{fmtNumber(s.molarMassGPerMol, 7)}</td>
                    <td className="num">{fmtNumber(s.atomsPerFormulaUnit, 6)}</td>
                    <td className="num">{fmtNumber(s.massMg, 5)}</td>
                    <td>{s.seriesLabel ?? <span className="muted">—</span>}</td>
                    <td className="num">{s.compositionVariable && s.compositionValue !== null ? `${s.compositionVariable} = ${fmtNumber(s.compositionValue, 4)}` : "—"}</td>
                    <td>{s.tags.map((t) => <span className="tag" key={t}>{t}</span>)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
      {can(member.role, "sample.write") && (
        <section className="sheet" aria-labelledby="new-sample">
          <h2 id="new-sample">Add a sample</h2>
          <SampleCreateForm apiBase={p.api} samplePath={p.samples} />
        </section>
      )}
    </>
  );
}
