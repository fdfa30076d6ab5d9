import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { getMeasurement } from "@/lib/server/measurements";
import { getSample } from "@/lib/server/samples";
import { groupPaths } from "@/app/_lib/paths";
import { Formula } from "@/app/components/Formula";
import { fmtBytes, fmtDate, fmtNumber } from "@/app/_lib/format";
import { MeasurementCharts } from "@/app/components/MeasurementCharts";
import { reduceMeasurementForScreen } from "@/lib/charts/reduce";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Measurement" };

const BASIS_TEXT = { sample: "whole sample (J K⁻¹)", molar: "per mole (J mol⁻¹ K⁻¹)", specific: "per mass (J kg⁻¹ K⁻¹ stored)" } as const;
const ROLE_TEXT: Record<string, string> = { temperature: "temperature", heatCapacity: "heat capacity", sigma: "σ", field: "field" };
const ROLE_ORDER = ["temperature", "heatCapacity", "sigma", "field"] as const;

export default async function MeasurementPage({ params }: { params: Promise<{ slug: string; id: string }> }) {
  const { slug, id } = await params;
  const p = groupPaths(slug);
  const { db, member } = await pageMember(slug, p.measurement(id));
  const m = await orNotFound(() => getMeasurement(db, member, id));
  const sample = await orNotFound(() => getSample(db, member, m.sampleId));
  // A large curve is sent to the browser reduced per pixel column (its shape kept); fits and exports use every point.
  const screen = reduceMeasurementForScreen({ temperatureK: m.temperatureK, heatCapacity: m.heatCapacity, sigma: m.sigma, sourceLines: m.sourceLines, basis: m.basis });
  const sigmaPercent = (m.columnMapping as Record<string, number>).sigmaPercentOfC;
  return (
    <>
      <div className="crumbs">
        <Link href={p.samples}>Samples</Link> / <Link href={p.sample(sample.id)}>{sample.label}</Link> / {m.label}
      </div>
      <h1>{m.label}</h1>
      <p className="lede">
        {m.kind === "addenda" ? "Addenda (empty platform and grease)" : "Sample measurement"} of {sample.label} (<Formula text={sample.formula} />),
        {" "}{m.pointCount} points from {fmtNumber(m.tMinK, 4)} K to {fmtNumber(m.tMaxK, 4)} K{m.fieldT ? ` in ${fmtNumber(m.fieldT, 4)} T` : " in zero field"}.
      </p>
      <MeasurementCharts series={screen.series} drawn={screen.drawn} total={screen.total} />
      <section className="sheet" aria-labelledby="meta">
        <h2 id="meta">Stored data</h2>
        <dl className="facts" data-testid="measurement-facts">
          <dt>Original file</dt>
          <dd>
            {m.fileName} ({fmtBytes(m.sizeBytes)}) — <a href={`${p.api}/measurements/${m.id}/original`} download>download the original, byte for byte</a>
          </dd>
          <dt>SHA-256</dt><dd className="mono">{m.sha256}</dd>
          <dt>Points</dt><dd>{m.pointCount}{sigmaPercent !== undefined ? `, each with σ = ${sigmaPercent} % of C (set at import)` : m.sigma ? ", each with σ" : ", no σ column"}</dd>
          <dt>Temperature range</dt><dd>{fmtNumber(m.tMinK, 5)} K – {fmtNumber(m.tMaxK, 5)} K</dd>
          <dt>Kind</dt><dd>{m.kind}</dd>
          <dt>Applied field</dt><dd>{fmtNumber(m.fieldT, 4)} T</dd>
          <dt>Heat capacity basis</dt><dd>{BASIS_TEXT[m.basis]}</dd>
          <dt>Units in the file</dt>
          <dd>{ROLE_ORDER.filter((k) => k in m.units).map((k) => `${ROLE_TEXT[k]}: ${m.units[k]}`).join("; ")}</dd>
          <dt>Columns used</dt>
          <dd>{ROLE_ORDER.filter((k) => k in m.columnMapping).map((k) => `${ROLE_TEXT[k]}: column ${m.columnMapping[k]! + 1}`).join("; ")}</dd>
          <dt>Stored</dt><dd>{fmtDate(m.createdAt)}</dd>
        </dl>
        {m.notes && <p style={{ whiteSpace: "pre-wrap", marginTop: "0.8rem" }}>{m.notes}</p>}
      </section>
    </>
  );
}
