import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { listAuditEvents } from "@/lib/server/review";
import { auditKey } from "@/lib/server/auditKey";
import { verifyGroup } from "@/lib/server/integrity";
import { can } from "@/lib/server/permissions";
import { auditObjectNames, OBJECT_KIND_WORD } from "@/lib/server/auditNames";
import { when } from "@/app/components/review/labels";
import "@/app/components/review/review.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Audit trail" };

const short = (h: string | null) => (h ? `${h.slice(0, 10)}…` : "—");

/** Owners: the group's append-only audit trail, newest first (?before=ID pages on), and the verification of its own chain (and the other integrity checks) naming every problem. */
export default async function AuditPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ before?: string }> }) {
  const { slug } = await params;
  const { before } = await searchParams;
  const home = `/g/${encodeURIComponent(slug)}`;
  const { db, member } = await pageMember(slug, `${home}/audit`);
  if (!can(member.role, "audit.read")) return (<><h1>Audit trail</h1><p className="notice-info">Only the group&apos;s owners read the audit trail.</p></>);
  const beforeId = before && /^\d{1,19}$/.test(before) ? before : undefined;
  const [events, verification] = await Promise.all([listAuditEvents(db, member, { take: 100, ...(beforeId ? { before: beforeId } : {}) }), verifyGroup(db, member.group.id, auditKey())]);
  const chain = verification.chain;
  const broken = new Set(chain.problems.map((p) => p.eventId).filter((x): x is string => x !== null));
  const names = await auditObjectNames(db, member, events);
  return (
    <>
      <h1>Audit trail</h1>
      <p className="lede">Every state change, seal, role change, import and deletion, in an append-only table. The group&apos;s events form a chain of their own: each is numbered, names the one before it, and is signed with a key the database does not hold, so an event edited, inserted, reordered or removed after the fact is named here. Removal of the newest events shows against a checkpoint kept outside the database (<span className="mono">heatbook audit checkpoint</span>).</p>
      <div className={chain.ok ? "notice-ok" : "form-error"} data-testid="audit-chain" role="status">
        {chain.ok
          ? <>Chain intact: all {chain.checked} events of this group are in order, linked and correctly signed.</>
          : <>Chain broken: {chain.problems.length} problem{chain.problems.length === 1 ? "" : "s"} among this group&apos;s {chain.checked} events.</>}
        {!chain.ok && <ul>{chain.problems.slice(0, 20).map((p, i) => <li key={i}>{p.message}</li>)}</ul>}
      </div>
      {verification.rechained.map((u) => (
        <p key={u.belowId} className="muted small">Events before #{u.belowId} were written before each group had its own signed chain; they were checked and re-chained when this server was upgraded ({when(u.at)}).</p>
      ))}
      {verification.findings.filter((f) => f.check !== "audit chains").map((f) => (
        <div key={f.check} className={f.ok ? "notice-ok" : "form-error"} role="status">
          {f.summary}
          {!f.ok && <ul>{f.problems.slice(0, 20).map((p, i) => <li key={i}>{p.where}: {p.message}</li>)}</ul>}
        </div>
      ))}
      <section className="sheet">
        <table data-testid="audit-events">
          <thead><tr><th className="num">#</th><th>When</th><th>Who</th><th>Action</th><th>Object</th><th>Before → after</th><th>Signature</th></tr></thead>
          <tbody>
            {events.map((e) => (
              <tr key={e.id} className={broken.has(e.id) ? "rv-bad" : undefined}>
                <td className="num mono">{e.id}</td>
                <td className="small">{when(e.at)}</td>
                <td>{e.actorName ?? <span className="muted">system</span>}</td>
                <td className="mono small">{e.action}</td>
                <td className="small" data-testid="audit-object">
                  {(() => {
                    const n = names.get(`${e.objectType}:${e.objectId}`);
                    if (!n) return <>{OBJECT_KIND_WORD[e.objectType] ?? "record"} <span className="muted">(no longer in the group)</span> <span className="mono muted" title={e.objectId}>{e.objectId.slice(0, 8)}</span></>;
                    return n.href ? <Link href={n.href}>{n.label}</Link> : n.label;
                  })()}
                </td>
                <td className="mono small">{short(e.beforeHash)} → {short(e.afterHash)}</td>
                <td className="mono small" title={`previous ${e.prevHash}\nthis ${e.hash}`}>{short(e.hash)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {events.length === 100 && <p><Link href={`${home}/audit?before=${events[events.length - 1]!.id}`}>Older events →</Link></p>}
      </section>
    </>
  );
}
