/**
 * The report of a sealed revision as HTML, from the report object and its figures (SVG text
 * drawn on the server): no JavaScript needed to read or print it. Same sections, numbers and
 * sentences as the PDF (lib/server/review/reportText.ts).
 */
import type { ReactNode } from "react";
import type { RevisionReport } from "@/lib/server/review/report";
import { formatNumber } from "@/lib/display";
import { reportSentences, formatBytes, type TextPiece } from "@/lib/server/review/reportText";
import { formatTime } from "@/lib/display/numbers";
import { Sym } from "../Sym";

export interface ReportViewFigure { id: string; position: number; caption: string; svg: string; exports: { label: string; href: string }[] }

function pieces(list: TextPiece[]): ReactNode {
  return list.map((p, i) => (typeof p === "string" ? <span key={i}>{p}</span> : <Sym key={i} m={p.sym} />));
}

function unitsText(units: unknown): string {
  if (!units || typeof units !== "object") return "—";
  const names: Record<string, string> = { temperature: "T", heatCapacity: "C", sigma: "σ", basis: "basis" };
  return Object.entries(units as Record<string, unknown>).map(([k, v]) => `${names[k] ?? k}: ${String(v).replace(/\^(-?\d+)/g, (_, e: string) => e.replace(/-/g, "⁻").replace(/\d/g, (d) => "⁰¹²³⁴⁵⁶⁷⁸⁹"[Number(d)]!))}`).join(", ");
}

export function ReportView({ r, figures, toolbar, renderNote }: { r: RevisionReport; figures: ReportViewFigure[]; toolbar?: ReactNode; renderNote: (markdown: string) => string }) {
  const s = reportSentences(r);
  return (
    <article className="rp-report" data-testid="report">
      {toolbar}
      <header className="rp-head">
        <p className="rp-kicker">Heatbook · specific-heat analysis report · {r.group.name}</p>
        <h1>{r.title}</h1>
        <p className="rp-sub">{s.subtitle}</p>
      </header>
      <p className="rp-safety" data-testid="report-safety">{r.safetyNote}</p>

      <section><h2>Sample</h2><p>{s.sample}</p>
        {r.context?.pinned === "full" && r.context.compositionValue !== null && <p>Composition {r.context.compositionVariable ?? "x"} = {formatNumber(r.context.compositionValue, 6)}{r.context.series.length ? `, series ${r.context.series.map((x) => x.name).join(", ")}` : ""}.</p>}
        <p className="small muted">As sealed.{r.context?.note ? ` ${r.context.note.charAt(0).toUpperCase()}${r.context.note.slice(1)}.` : ""}</p>
        {r.context && r.context.changedSinceSealing.length > 0 && <p className="rp-changed" data-testid="report-context-changed">Sample record changed since sealing (the values above are as sealed): {r.context.changedSinceSealing.join("; ")}.</p>}
      </section>

      <section><h2>Data provenance</h2>
        <table className="rp-table" data-testid="report-provenance">
          <thead><tr><th>Measurement</th><th>Kind</th><th>Original file</th><th className="num">Points</th><th>T range</th><th className="num">Field</th><th>Units on import</th></tr></thead>
          <tbody>
            {r.provenance.map((m) => (
              <tr key={m.measurementId}>
                <td>{m.label}</td><td>{m.kind === "addenda" ? "addenda" : "sample"}</td>
                <td>{m.fileName} <span className="muted">({formatBytes(m.sizeBytes)})</span><br /><span className="mono rp-sha">SHA-256 {m.sha256}</span></td>
                <td className="num">{m.pointCount}</td><td>{s.range(m.tMinK, m.tMaxK)}</td><td className="num">{s.field(m.fieldT)}</td>
                <td className="small">{unitsText(m.units)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section><h2>Corrections and data selection</h2>
        {r.corrections.length === 0 ? <p className="muted">None.</p> : <ol className="rp-list">{r.corrections.map((c) => <li key={c.position}>Step {c.position + 1}: {c.summary}.</li>)}</ol>}
      </section>

      {r.fits.map((f) => (
        <section key={f.position} className="rp-fit"><h2>Fit (step {f.position + 1}): <Sym m={f.modelLabel} /></h2>
          <p>{pieces(s.fitLine(f))}</p>
          <table className="rp-table rp-params" data-testid="report-parameters">
            <thead><tr><th>Parameter</th><th>Value (standard error in the last digits)</th></tr></thead>
            <tbody>{f.parameters.map((p) => <tr key={p.name}><td><Sym m={p.symbol} /> <span className="muted small">{p.label}</span></td><td className="mono">{p.compact}</td></tr>)}</tbody>
          </table>
          {figures.filter((g) => g.position === f.position).map((g) => (
            <figure key={g.id} className="rp-figure" data-testid={`report-figure-${g.id}`}>
              <div dangerouslySetInnerHTML={{ __html: g.svg }} />
              <figcaption className="small muted"><Sym m={g.caption} />{g.exports.length > 0 && <span className="rp-screen-only"> Download: {g.exports.map((e, i) => <span key={e.href}>{i ? " · " : ""}<a href={e.href} download>{e.label}</a></span>)}</span>}</figcaption>
            </figure>
          ))}
        </section>
      ))}

      {(r.stepResults ?? []).map((x) => (
        <section key={x.position} className="rp-fit" data-testid={`report-${x.kind}`}><h2><Sym m={`${x.heading} (step ${x.position + 1})`} /></h2>
          <p><Sym m={x.summary} /></p>
          {x.values.length > 0 && (
            <table className="rp-table rp-params">
              <thead><tr><th>Parameter</th><th>Value (standard error in the last digits)</th></tr></thead>
              <tbody>{x.values.map((p) => <tr key={p.name}><td><Sym m={p.symbol} /> <span className="muted small">{p.label}</span></td><td className="mono">{p.compact}</td></tr>)}</tbody>
            </table>
          )}
        </section>
      ))}

      <section><h2>Derived quantities</h2>
        {r.derived.length === 0 ? <p className="muted">No derived-quantities step.</p> : (
          <table className="rp-table" data-testid="report-derived">
            <thead><tr><th>Quantity</th><th>Value</th><th>Note</th></tr></thead>
            <tbody>{r.derived.map((d) => <tr key={d.name}><td><Sym m={d.symbol} /> <span className="muted small">{d.label}</span></td><td className="mono">{d.compact}</td><td className="small">{d.note ? <Sym m={d.note} /> : ""}</td></tr>)}</tbody>
          </table>
        )}
      </section>

      {r.warnings.length > 0 && <section><h2>Warnings at sealing</h2><ul className="rp-list">{r.warnings.map((w, i) => <li key={i}><Sym m={w} /></li>)}</ul></section>}
      {r.notes.length > 0 && <section><h2>Notes</h2>{r.notes.map((n, i) => <div key={i} className="rp-note" dangerouslySetInnerHTML={{ __html: renderNote(n) }} />)}</section>}

      <section className="rp-seal"><h2>Review and seal</h2>
        <ul className="rp-list" data-testid="report-reviewer">{s.review.map((line, i) => <li key={i}>{line}</li>)}</ul>
        <dl className="facts">
          {r.signature ? (
            <>
              <dt>Signature</dt>
              <dd data-testid="report-signature">{r.signature.signerName} ({r.signature.signerEmail}), {r.signature.signerRole} of the group, {formatTime(r.signature.signedAt)}; identity checked by {r.signature.method === "password" ? "password" : "a fresh institutional sign-in"}.<br />“{r.signature.statement}”</dd>
              <dt>Reviewer&apos;s note</dt><dd className="rp-note-text">{r.signature.note}</dd>
              {r.signature.acknowledgedThreads.length > 0 && <><dt>Open threads acknowledged</dt><dd>{r.signature.acknowledgedThreads.map((x) => `${x.openedBy}: “${x.excerpt}”`).join("; ")}</dd></>}
            </>
          ) : (
            <><dt>Signature</dt><dd className="muted">Sealed before approvals were signed: no statement of meaning or note was recorded.</dd></>
          )}
          <dt>Content hash (SHA-256)</dt><dd className="mono" data-testid="report-hash">{r.contentHash.replace(/(.{8})(?=.)/g, "$1 ")}</dd>
          <dt>Engine version</dt><dd>{r.engineVersion}</dd>
          <dt>Sealed</dt><dd>{formatTime(r.review.sealedAt)}</dd>
        </dl>
        <p className="small muted">Anyone in the group can check this hash on the analysis page (Verify): the snapshot is re-hashed, the original files re-checked and the engine re-run.</p>
      </section>
    </article>
  );
}
