import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { getSample } from "@/lib/server/samples";
import { HEAT_CAPACITY_UNITS, listMeasurements } from "@/lib/server/measurements";
import { can } from "@/lib/server/permissions";
import { groupPaths } from "@/app/_lib/paths";
import { Formula } from "@/app/components/Formula";
import { fmtDate, fmtNumber } from "@/app/_lib/format";
import { SampleEditForm } from "@/app/components/SampleEditForm";
import { ArchiveSampleButton } from "@/app/components/ArchiveSampleButton";
import { ImportPanel } from "@/app/components/ImportPanel";
import { MeasurementOverlay } from "@/app/components/MeasurementOverlay";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Sample" };

export default async function SamplePage({ params }: { params: Promise<{ slug: string; id: string }> }) {
  const { slug, id } = await params;
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, p.sample(id));
  const sample = await orNotFound(() => getSample(db, member, id));
  const measurements = await listMeasurements(db, member, { sampleId: sample.id });
  const writeSample = can(member.role, "sample.write");
  const writeMeasurement = can(member.role, "measurement.write");
  const apiUrl = `${p.api}/samples/${sample.id}`;
  const valences = Object.entries(sample.valences);
  return (
    <>
      <div className="crumbs"><Link href={p.samples}>Samples</Link> / {sample.label}</div>
      <h1>{sample.label} {sample.archived && <span className="tag">archived</span>}</h1>
      <div className="columns">
        <section className="sheet" aria-labelledby="facts">
          <h2 id="facts">Sample</h2>
          <dl className="facts" data-testid="sample-facts">
            <dt>Formula</dt><dd><Formula text={sample.formula} /> <span className="muted small">({sample.formula})</span></dd>
            <dt>Molar mass</dt><dd>{fmtNumber(sample.molarMassGPerMol, 7)} g/mol</dd>
            <dt>Atoms per formula unit</dt><dd>{fmtNumber(sample.atomsPerFormulaUnit, 6)}</dd>
            <dt>Mass</dt><dd>{sample.massMg === null ? "—" : `${fmtNumber(sample.massMg, 6)} mg`}</dd>
            <dt>Density</dt><dd>{sample.densityGPerCm3 === null ? "—" : `${fmtNumber(sample.densityGPerCm3, 5)} g/cm³`}</dd>
            <dt>Composition</dt><dd>{sample.compositionVariable ? `${sample.compositionVariable} = ${fmtNumber(sample.compositionValue, 5)}` : "—"}</dd>
            <dt>Series</dt><dd>{sample.seriesLabel ?? "—"}</dd>
            <dt>Valences</dt><dd>{valences.length ? valences.map(([el, z]) => `${el}: ${z}`).join(", ") : "—"}</dd>
            <dt>Tags</dt><dd>{sample.tags.length ? sample.tags.map((t) => <span className="tag" key={t}>{t}</span>) : "—"}</dd>
            <dt>Changed</dt><dd>{fmtDate(sample.updatedAt)} (version {sample.version})</dd>
          </dl>
          {sample.notes && <p style={{ whiteSpace: "pre-wrap", marginTop: "0.8rem" }}>{sample.notes}</p>}
          <div className="actions" style={{ marginTop: "0.8rem" }}>
            {can(member.role, "analysis.write") && !sample.archived && <Link className="button" href={`${p.home}/analyses?sample=${sample.id}#new-analysis`} data-testid="new-analysis">New analysis</Link>}
            <Link className="button quiet" href={`${p.home}/analyses?sample=${sample.id}`}>Analyses of this sample</Link>
            {writeSample && <ArchiveSampleButton apiUrl={apiUrl} archived={sample.archived} />}
          </div>
        </section>
        <section className="sheet" aria-labelledby="measurements">
          <h2 id="measurements">Measurements</h2>
          {measurements.length === 0 ? (
            <p className="muted">No measurements yet.</p>
          ) : (
            <table data-testid="sample-measurements">
              <thead>
                <tr><th>Label</th><th>Kind</th><th className="num">Field (T)</th><th className="num">Points</th><th className="num">T range (K)</th></tr>
              </thead>
              <tbody>
                {measurements.map((m) => (
                  <tr key={m.id}>
                    <td><Link href={p.measurement(m.id)}>{m.label}</Link><div className="small muted">{m.fileName}</div></td>
                    <td className={m.kind === "addenda" ? "kind-addenda" : undefined}>{m.kind}</td>
                    <td className="num">{fmtNumber(m.fieldT, 4)}</td>
                    <td className="num">{m.pointCount}</td>
                    <td className="num">{fmtNumber(m.tMinK, 3)} – {fmtNumber(m.tMaxK, 3)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
      </div>
      <MeasurementOverlay apiBase={p.api} choices={measurements.map((m) => ({ id: m.id, label: m.label, kind: m.kind, fieldT: m.fieldT, basis: m.basis, pointCount: m.pointCount, tMinK: m.tMinK, tMaxK: m.tMaxK }))} />
      {writeMeasurement && !sample.archived && (
        <section className="sheet" aria-labelledby="import">
          <h2 id="import">Import a C(T) file</h2>
          <ImportPanel apiBase={apiUrl} measurementPath={`/g/${encodeURIComponent(slug)}/measurements`} heatCapacityUnits={[...HEAT_CAPACITY_UNITS]} />
        </section>
      )}
      {writeSample && !sample.archived && (
        <section className="sheet" aria-labelledby="edit">
          <h2 id="edit">Edit sample</h2>
          <SampleEditForm apiUrl={apiUrl} sample={sample} />
        </section>
      )}
    </>
  );
}
