import type { Metadata } from "next";
import Link from "next/link";
import "@/app/components/notebook/notebook.css";
import { pageMember } from "@/app/_server/guard";
import { listMeasurements } from "@/lib/server/measurements";
import { countUnreadNotices, listRecentActivity, listRecentSamples, listThreadsWaitingForMe } from "@/lib/server/activity";
import { listAnalyses } from "@/lib/server/notebook";
import { STATE_LABEL } from "@/app/components/notebook/display";
import { can } from "@/lib/server/permissions";
import { groupPaths } from "@/app/_lib/paths";
import { Formula } from "@/app/components/Formula";
import { fmtDate, fmtNumber } from "@/app/_lib/format";
import { describeAction } from "@/app/_lib/activity";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Group home" };

export default async function GroupHome({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, p.home);
  const [samples, measurements, activity, analyses, waiting, unread] = await Promise.all([
    listRecentSamples(db, member, 8),
    listMeasurements(db, member, { take: 8 }),
    listRecentActivity(db, member, 12),
    listAnalyses(db, member),
    listThreadsWaitingForMe(db, member, 6),
    countUnreadNotices(db, member),
  ]);
  const sampleLabel = new Map(samples.map((s) => [s.id, s.label]));
  return (
    <>
      <h1>{member.group.name}</h1>
      <p className="lede">
        You are <span className="role">{member.role}</span> in this group.
        {can(member.role, "sample.write")
          ? " Add a sample, then import its C(T) curves on the sample's page."
          : can(member.role, "analysis.review")
            ? " You can read everything the group stores, comment, and review submitted analyses."
            : " You can read everything the group stores."}
      </p>
      <form className="inline-form" role="search" action={`${p.home}/search`}>
        <div className="field">
          <label htmlFor="home-q">Search samples and analyses</label>
          <input id="home-q" name="q" type="search" size={36} placeholder="label, formula, series, title…" />
        </div>
        <button type="submit" className="quiet">Search</button>
      </form>
      <div className="columns">
        <section className="sheet" aria-labelledby="waiting" data-testid="waiting-for-me">
          <h2 id="waiting">Waiting for me</h2>
          <p className="small">{unread === 0 ? "No unread notices." : `${unread} unread notice${unread > 1 ? "s" : ""} (mentions, replies, reviews).`}</p>
          {waiting.length === 0 ? <p className="muted small">No open discussion mentions you.</p> : (
            <ul className="activity">
              {waiting.map((w) => (
                <li key={w.threadId}>
                  <strong>{w.authorName}</strong> in <Link href={`${p.home}/analyses/${w.analysisId}#thread-${w.threadId}`}>{w.analysisTitle}</Link>
                  <div className="small muted">{w.excerpt}</div>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section className="sheet" aria-labelledby="recent-analyses">
          <h2 id="recent-analyses">Recent analyses</h2>
          {analyses.length === 0 ? <p className="muted">No analyses yet.</p> : (
            <table>
              <thead><tr><th>Analysis</th><th>State</th></tr></thead>
              <tbody>
                {analyses.slice(0, 6).map((a) => (
                  <tr key={a.id}>
                    <td><Link href={`${p.home}/analyses/${a.id}`}>{a.title}</Link></td>
                    <td className="small">{a.latestRevision ? `Revision ${a.latestRevision.number}: ${STATE_LABEL[a.latestRevision.state]}` : "—"}{a.sealedRevision && a.sealedRevision.number !== a.latestRevision?.number ? ` (revision ${a.sealedRevision.number} sealed)` : ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <p className="small"><Link href={`${p.home}/analyses`}>All analyses →</Link></p>
        </section>
      </div>
      <div className="columns">
        <section className="sheet" aria-labelledby="recent-samples">
          <h2 id="recent-samples">Recently changed samples</h2>
          {samples.length === 0 ? (
            <p className="muted">No samples yet. <Link href={p.samples}>Go to samples</Link>.</p>
          ) : (
            <table>
              <thead>
                <tr><th>Sample</th><th>Formula</th><th className="num">M (g/mol)</th></tr>
              </thead>
              <tbody>
                {samples.map((s) => (
                  <tr key={s.id}>
                    <td><Link href={p.sample(s.id)}>{s.label}</Link></td>
                    <td><Formula text={s.formula} /></td>
                    <td className="num">{fmtNumber(s.molarMassGPerMol, 6)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
          <p className="small"><Link href={p.samples}>All samples →</Link></p>
        </section>
        <section className="sheet" aria-labelledby="recent-measurements">
          <h2 id="recent-measurements">Latest measurements</h2>
          {measurements.length === 0 ? (
            <p className="muted">No measurements stored yet.</p>
          ) : (
            <table>
              <thead>
                <tr><th>Measurement</th><th>Kind</th><th className="num">Points</th><th className="num">T range (K)</th></tr>
              </thead>
              <tbody>
                {measurements.map((m) => (
                  <tr key={m.id}>
                    <td>
                      <Link href={p.measurement(m.id)}>{m.label}</Link>
                      {sampleLabel.get(m.sampleId) && <div className="small muted">{sampleLabel.get(m.sampleId)}</div>}
                    </td>
                    <td className={m.kind === "addenda" ? "kind-addenda" : undefined}>{m.kind}</td>
                    <td className="num">{m.pointCount}</td>
                    <td className="num">{fmtNumber(m.tMinK, 3)} – {fmtNumber(m.tMaxK, 3)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
      </div>
      <section className="sheet" aria-labelledby="activity">
        <h2 id="activity">Activity</h2>
        {activity.length === 0 ? (
          <p className="muted">Nothing has happened in this group yet.</p>
        ) : (
          <ul className="activity" data-testid="activity">
            {activity.map((a) => (
              <li key={a.id}>
                <time dateTime={a.at}>{fmtDate(a.at)}</time>
                <strong>{a.actorName ?? "someone"}</strong> {describeAction(a.action)}
                {a.objectLabel && (
                  <>
                    {" "}
                    {a.objectType === "sample" ? <Link href={p.sample(a.objectId)}>{a.objectLabel}</Link>
                      : a.objectType === "measurement" ? <Link href={p.measurement(a.objectId)}>{a.objectLabel}</Link>
                      : <em>{a.objectLabel}</em>}
                  </>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}
