import type { Metadata } from "next";
import Link from "next/link";
import { orNotFound, pageMember } from "@/app/_server/guard";
import { buildReport } from "@/lib/server/review";
import { renderMarkdown } from "@/lib/server/markdown";
import { MODELS } from "@/lib/engine/models";
import { ConflictError } from "@/lib/engine/errors";
import { fmtBytes, fmtNumber } from "@/app/_lib/format";
import { groupedHash, when, DECISION_LABEL } from "@/app/components/review/labels";
import { reportFitSvg } from "@/app/components/review/reportPlot";
import { valueText } from "@/app/components/review/units";
import { PrintButton } from "@/app/components/review/PrintButton";
import "@/app/components/review/report.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Report" };

function unitsText(units: unknown): string {
  if (!units || typeof units !== "object") return "—";
  return Object.entries(units as Record<string, unknown>).map(([k, v]) => `${k}: ${String(v)}`).join(", ");
}

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
  return (
    <article className="rp-report" data-testid="report">
      <div className="rp-screen-only actions crumbs">
        <Link href={`${base}${q}`}>← Back to the analysis</Link>
        <PrintButton />
        <a className="button quiet small" href={`/api/groups/${encodeURIComponent(slug)}/analyses/${id}/report.pdf${q}`} download>Download PDF</a>
      </div>
      <header className="rp-head">
        <p className="rp-kicker">Heatbook · specific-heat analysis report · {r.group.name}</p>
        <h1>{r.title}</h1>
        <p className="rp-sub">Revision {r.revision.number} · {r.revision.state === "sealed" ? "sealed" : "superseded by a newer sealed revision"} · sealed {when(r.review.sealedAt)} by {r.review.sealedBy ?? "—"}</p>
      </header>
      <p className="rp-safety" data-testid="report-safety">{r.safetyNote}</p>

      <section><h2>Sample</h2>
        <dl className="facts">
          <dt>Label</dt><dd>{r.sample.label}</dd>
          <dt>Formula</dt><dd>{r.sample.formula}</dd>
          <dt>Molar mass</dt><dd>{fmtNumber(r.sample.molarMassGPerMol, 6)} g mol⁻¹ (per formula unit; {r.sample.atomsPerFormulaUnit} atom{r.sample.atomsPerFormulaUnit === 1 ? "" : "s"} per f.u.)</dd>
          <dt>Mass</dt><dd>{r.sample.massMg === null ? "—" : `${fmtNumber(r.sample.massMg, 6)} mg`}</dd>
          <dt>Density</dt><dd>{r.sample.densityGPerCm3 === null ? "—" : `${fmtNumber(r.sample.densityGPerCm3, 5)} g cm⁻³`}</dd>
          {r.context.pinned === "full" && <><dt>Composition</dt><dd>{r.context.compositionValue === null ? "none recorded" : `${r.context.compositionVariable ?? "x"} = ${fmtNumber(r.context.compositionValue, 6)}`}{r.context.series.length ? ` · series ${r.context.series.map((x) => `${x.name} (variable ${x.compositionVariable})`).join(", ")}` : ""}</dd></>}
        </dl>
        <p className="small muted">As sealed.{r.context.note ? ` ${r.context.note.charAt(0).toUpperCase()}${r.context.note.slice(1)}.` : ""}</p>
        {r.context.changedSinceSealing.length > 0 && <p className="rp-changed" data-testid="report-context-changed">Sample record changed since sealing (the values above are as sealed): {r.context.changedSinceSealing.join("; ")}.</p>}
      </section>

      <section><h2>Data provenance</h2>
        <table className="rp-table" data-testid="report-provenance">
          <thead><tr><th>Measurement</th><th>Kind</th><th>Original file</th><th className="num">Points</th><th>T range</th><th className="num">Field</th><th>Units on import</th></tr></thead>
          <tbody>
            {r.provenance.map((m) => (
              <tr key={m.measurementId}>
                <td>{m.label}</td><td>{m.kind}</td>
                <td>{m.fileName} <span className="muted">({fmtBytes(m.sizeBytes)})</span><br /><span className="mono rp-sha">SHA-256 {m.sha256}</span></td>
                <td className="num">{m.pointCount}</td><td>{fmtNumber(m.tMinK)}–{fmtNumber(m.tMaxK)} K</td><td className="num">{fmtNumber(m.fieldT)} T</td>
                <td className="small">{unitsText(m.units)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section><h2>Corrections</h2>
        {r.corrections.length === 0 ? <p className="muted">None.</p> : <ol className="rp-list">{r.corrections.map((c) => <li key={c.position}>Step {c.position + 1}: {c.summary}</li>)}</ol>}
      </section>

      {r.fits.map((f) => {
        const model = (MODELS as Record<string, { title: string; formula: string }>)[f.model];
        const svg = reportFitSvg(f);
        return (
          <section key={f.position} className="rp-fit"><h2>Fit (step {f.position + 1})</h2>
            <p>Model <strong>{model?.title ?? f.model}</strong>{model ? <> — <span className="mono">{model.formula}</span></> : null}; window {fmtNumber(f.tMinK)}–{fmtNumber(f.tMaxK)} K ({f.nPoints} points), {f.weighted ? "weighted by 1/σ²" : "unweighted"}, χ²_red = {f.reducedChiSquare === null ? "—" : fmtNumber(f.reducedChiSquare, 3)}; per mole {f.basis === "atom" ? "of atoms" : "formula unit"}.</p>
            <table className="rp-table rp-params" data-testid="report-parameters">
              <thead><tr><th>Parameter</th><th>Value (standard error in the last digits)</th></tr></thead>
              <tbody>{f.parameters.map((p) => <tr key={p.name}><td>{p.symbol}</td><td className="mono">{p.compact}</td></tr>)}</tbody>
            </table>
            {svg && <figure className="rp-figure"><div dangerouslySetInnerHTML={{ __html: svg }} /><figcaption className="small muted">C/T against T²: filled points inside the fit window (shaded), hollow outside; the line is the fitted model; bars are ±1σ.</figcaption></figure>}
          </section>
        );
      })}

      <section><h2>Derived quantities</h2>
        {r.derived.length === 0 ? <p className="muted">No derived-quantities step.</p> : (
          <table className="rp-table" data-testid="report-derived">
            <thead><tr><th>Quantity</th><th>Value</th><th>Note</th></tr></thead>
            <tbody>{r.derived.map((d) => <tr key={d.name}><td>{d.symbol} <span className="muted small">{d.name}</span></td><td className="mono">{valueText(d.value, d.stdError, d.unit)}</td><td className="small">{d.note ?? ""}</td></tr>)}</tbody>
          </table>
        )}
      </section>

      {r.warnings.length > 0 && <section><h2>Warnings at sealing</h2><ul className="rp-list">{r.warnings.map((w, i) => <li key={i}>{w}</li>)}</ul></section>}
      {r.notes.length > 0 && <section><h2>Notes</h2>{r.notes.map((n, i) => <div key={i} className="rp-note" dangerouslySetInnerHTML={{ __html: renderMarkdown(n) }} />)}</section>}

      <section className="rp-seal"><h2>Review and seal</h2>
        <dl className="facts">
          <dt>Submitted</dt><dd>{r.review.submittedBy ?? "—"}, {when(r.review.submittedAt)}</dd>
          <dt>Reviewed and sealed</dt><dd data-testid="report-reviewer">{r.review.sealedBy ?? "—"}, {when(r.review.sealedAt)}</dd>
          {r.signature ? (
            <>
              <dt>Signature</dt>
              <dd data-testid="report-signature">{r.signature.signerName} ({r.signature.signerEmail}), {r.signature.signerRole} of the group, {when(r.signature.signedAt)}; identity checked by {r.signature.method === "password" ? "password" : "a fresh institutional sign-in"}.<br />“{r.signature.statement}”</dd>
              <dt>Reviewer&apos;s note</dt><dd className="rp-note-text">{r.signature.note}</dd>
              {r.signature.acknowledgedThreads.length > 0 && <><dt>Open threads acknowledged</dt><dd>{r.signature.acknowledgedThreads.map((x) => `${x.openedBy}: “${x.excerpt}”`).join("; ")}</dd></>}
            </>
          ) : (
            <><dt>Signature</dt><dd className="muted">Sealed before approvals were signed: no statement of meaning or note was recorded.</dd></>
          )}
          <dt>Content hash (SHA-256)</dt><dd className="mono" data-testid="report-hash">{groupedHash(r.contentHash)}</dd>
          <dt>Engine version</dt><dd>{r.engineVersion}</dd>
        </dl>
        {r.review.decisions.length > 0 && (
          <ol className="rp-list">{r.review.decisions.map((d, i) => <li key={i}>{when(d.at)} — {d.reviewer ?? "former member"} {DECISION_LABEL[d.decision] ?? d.decision}{d.comment ? `: “${d.comment}”` : ""}</li>)}</ol>
        )}
        <p className="small muted">Anyone in the group can check this hash on the analysis page (Verify): the snapshot is re-hashed, the original files re-checked and the engine re-run.</p>
      </section>
    </article>
  );
}
