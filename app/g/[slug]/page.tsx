import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { listMeasurements } from "@/lib/server/measurements";
import { listRecentActivity, listRecentSamples } from "@/lib/server/activity";
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
  const [samples, measurements, activity] = await Promise.all([
    listRecentSamples(db, member, 8),
    listMeasurements(db, member, { take: 8 }),
    listRecentActivity(db, member, 12),
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
