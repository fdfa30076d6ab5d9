"use client";
/**
 * The seal of a sealed (or superseded) revision: content hash (monospace, copyable), who sealed
 * it and when, "Verify" (the server re-hashes the snapshot, checks the original files and re-runs
 * the engine; the per-step answer is shown), the report page and the PDF.
 */
import Link from "next/link";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";
import type { SealSignature, VerifyReport } from "@/lib/server/review";
import { groupedHash, when } from "./labels";

interface Props {
  apiBase: string;
  pageBase: string;
  revision: { id: string; number: number; state: string; seal: { contentHash: string; sealedBy: { name: string } | null; sealedAt: string; signature: SealSignature | null; contextNote: string | null } };
}

const ROLE_TEXT: Record<string, string> = { owner: "group owner", reviewer: "reviewer", analyst: "analyst", viewer: "viewer" };

const OUTCOME: Record<string, string> = { identical: "reproduced exactly", "within-tolerance": "reproduced within tolerance", differs: "does not reproduce" };

export function LockPanel({ apiBase, pageBase, revision }: Props) {
  const seal = revision.seal;
  const [copied, setCopied] = useState(false);
  const [busy, setBusy] = useState(false);
  const [report, setReport] = useState<VerifyReport | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function copy() {
    try {
      await navigator.clipboard.writeText(seal.contentHash);
      setCopied(true);
      setTimeout(() => setCopied(false), 1500);
    } catch {
      setError("the browser did not allow copying; select the hash and copy it by hand");
    }
  }

  async function verify() {
    setBusy(true);
    setError(null);
    const r = await callJson<{ verification: VerifyReport }>(`${apiBase}/review/verify?revision=${encodeURIComponent(revision.id)}`, "GET");
    setBusy(false);
    if (r.ok) setReport(r.data!.verification);
    else setError(r.error);
  }

  const q = `?revision=${encodeURIComponent(revision.id)}`;
  return (
    <section className="rv-lock" data-testid="lock-panel" aria-label={`Seal of revision ${revision.number}`}>
      <div className="rv-lock-head">
        <span className="rv-lock-glyph" aria-hidden="true">⬢</span>
        <strong>Revision {revision.number} is {revision.state === "replaced" ? "superseded (still sealed)" : "sealed"}</strong>
      </div>
      <dl className="rv-lock-facts">
        <dt>Content hash</dt>
        <dd>
          <code className="rv-hash" data-testid="content-hash" title="SHA-256 of the canonical snapshot">{groupedHash(seal.contentHash)}</code>{" "}
          <button type="button" className="quiet small" onClick={copy} data-testid="copy-hash">{copied ? "Copied" : "Copy"}</button>
        </dd>
        <dt>Sealed by</dt>
        <dd data-testid="sealed-by">{seal.sealedBy?.name ?? "—"}</dd>
        <dt>Sealed at</dt>
        <dd data-testid="sealed-at">{when(seal.sealedAt)}</dd>
        {seal.signature ? (
          <>
            <dt>Signature</dt>
            <dd data-testid="seal-signature">
              {seal.signature.signerName} ({ROLE_TEXT[seal.signature.signerRole] ?? seal.signature.signerRole}), {when(seal.signature.signedAt)}, identity checked by {seal.signature.method === "password" ? "password" : "a fresh institutional sign-in"}:
              <blockquote className="rv-statement">“{seal.signature.statement}”</blockquote>
            </dd>
            <dt>Note</dt>
            <dd data-testid="seal-note" className="rv-note">{seal.signature.note}</dd>
            {seal.signature.acknowledgedThreads.length > 0 && (
              <>
                <dt>Open threads acknowledged</dt>
                <dd><ul className="rv-checks small">{seal.signature.acknowledgedThreads.map((t) => <li key={t.id}>{t.openedBy}: “{t.excerpt}”</li>)}</ul></dd>
              </>
            )}
          </>
        ) : (
          <><dt>Signature</dt><dd className="small muted">Sealed before approvals were signed: no statement of meaning or note was recorded.</dd></>
        )}
        {seal.contextNote && <><dt>Sample context</dt><dd className="small">{seal.contextNote}</dd></>}
      </dl>
      <div className="actions">
        <button type="button" className="quiet small" onClick={verify} disabled={busy} data-testid="verify">{busy ? "Verifying…" : "Verify"}</button>
        <Link className="button quiet small" href={`${pageBase}/report${q}`} data-testid="report-link">Report</Link>
        <a className="button quiet small" href={`${apiBase}/report.pdf${q}`} download data-testid="pdf-link">Download PDF</a>
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
      {report && <VerifyResult report={report} />}
    </section>
  );
}

const fmt = (v: unknown) => (v === null || v === undefined ? "—" : typeof v === "object" ? JSON.stringify(v) : String(v));

function VerifyResult({ report }: { report: VerifyReport }) {
  return (
    <div className="rv-verify" data-testid="verify-report">
      <p className={report.ok ? "notice-ok" : "form-error"} data-testid="verify-summary">
        {report.ok ? "Verified: " : "Not verified: "}{report.summary}
      </p>
      {report.mismatches.length > 0 && (
        <ul className="rv-checks small" data-testid="verify-mismatches">
          {report.mismatches.map((m, i) => <li key={i}>✕ {m.what}</li>)}
        </ul>
      )}
      {report.contextChanges.length > 0 && <p className="small notice-info" data-testid="verify-context">Sample record changed since sealing: {report.contextChanges.map((c) => `${c.label} ${fmt(c.sealed)} → ${fmt(c.now)}`).join("; ")}. The sealed numbers and the sealed context are unchanged.</p>}
      <ul className="rv-checks small">
        <li>{report.hashMatches ? "✓" : "✕"} stored snapshot hashes to its content hash</li>
        <li>{report.mismatches.some((m) => m.check !== "content-hash" && m.check !== "engine" && m.check !== "file") ? "✕" : "✓"} stored steps, measurements and the seal's audit event agree with the snapshot</li>
        {report.files.map((f) => (
          <li key={f.fileId}>{f.matches ? "✓" : "✕"} original file of measurement <span className="mono">{f.measurementId.slice(0, 8)}</span> still has SHA-256 <span className="mono">{f.sha256.slice(0, 12)}…</span></li>
        ))}
        <li>engine {report.sealedEngineVersion} at sealing, {report.currentEngineVersion} now{report.tolerance ? `; numbers compared to ${report.tolerance} relative` : "; numbers compared exactly"}</li>
      </ul>
      <table className="rv-steps">
        <thead><tr><th>Step</th><th>Kind</th><th>Inputs</th><th>Outputs</th><th className="num">Largest rel. difference</th></tr></thead>
        <tbody>
          {report.steps.map((s) => (
            <tr key={s.stepId} className={s.outcome === "differs" ? "rv-bad" : undefined}>
              <td>{s.position + 1}</td>
              <td>{s.kind}</td>
              <td>{s.inputHashReproduced ? "✓ same input hash" : "✕ input hash differs"}</td>
              <td>{OUTCOME[s.outcome] ?? s.outcome}{s.firstDifference ? <span className="small muted"> at {s.firstDifference}</span> : null}</td>
              <td className="num">{s.maxRelDiff === null ? "—" : s.maxRelDiff === 0 ? "0" : s.maxRelDiff.toExponential(1)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
