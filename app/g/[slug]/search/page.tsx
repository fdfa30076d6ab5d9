import type { Metadata } from "next";
import Link from "next/link";
import "@/app/components/notebook/notebook.css";
import { pageMember } from "@/app/_server/guard";
import { listSamples } from "@/lib/server/samples";
import { listAnalyses } from "@/lib/server/notebook";
import { groupPaths } from "@/app/_lib/paths";
import { Formula } from "@/app/components/Formula";
import { STATE_LABEL } from "@/app/components/notebook/display";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Search" };

/** Search the group's samples (label, formula, series, notes, tags) and analyses (title, sample). */
export default async function SearchPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ q?: string }> }) {
  const { slug } = await params;
  const q = ((await searchParams).q ?? "").slice(0, 200);
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, `${p.home}/search`);
  const [samples, analyses] = q.trim() ? await Promise.all([listSamples(db, member, { q, take: 50 }), listAnalyses(db, member, { q })]) : [[], []];
  return (
    <>
      <h1>Search</h1>
      <form className="inline-form" role="search" action={`${p.home}/search`}>
        <div className="field">
          <label htmlFor="q">Samples and analyses</label>
          <input id="q" name="q" type="search" defaultValue={q} size={40} placeholder="label, formula, series, title…" />
        </div>
        <button type="submit">Search</button>
      </form>
      {q.trim() && (
        <div className="columns">
          <section className="sheet" aria-labelledby="found-samples">
            <h2 id="found-samples">Samples ({samples.length})</h2>
            {samples.length === 0 ? <p className="muted">No sample matches.</p> : (
              <ul className="activity">{samples.map((s) => <li key={s.id}><Link href={p.sample(s.id)}>{s.label}</Link> · <Formula text={s.formula} />{s.seriesLabel && <span className="muted small"> · {s.seriesLabel}</span>}</li>)}</ul>
            )}
          </section>
          <section className="sheet" aria-labelledby="found-analyses">
            <h2 id="found-analyses">Analyses ({analyses.length})</h2>
            {analyses.length === 0 ? <p className="muted">No analysis matches.</p> : (
              <ul className="activity">{analyses.map((a) => <li key={a.id}><Link href={`${p.home}/analyses/${a.id}`}>{a.title}</Link> <span className="muted small">· {a.sampleLabel}{a.latestRevision ? ` · ${STATE_LABEL[a.latestRevision.state]}` : ""}</span></li>)}</ul>
            )}
          </section>
        </div>
      )}
    </>
  );
}
