import type { Metadata } from "next";
import Link from "next/link";
import { pageMember } from "@/app/_server/guard";
import { listAuditEvents } from "@/lib/server/review";
import { verifyAuditChain } from "@/lib/server/audit";
import { can } from "@/lib/server/permissions";
import { auditObjectNames, OBJECT_KIND_WORD } from "@/lib/server/auditNames";
import { when } from "@/app/components/review/labels";
import "@/app/components/review/review.css";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Audit trail" };

const short = (h: string | null) => (h ? `${h.slice(0, 10)}…` : "—");

/** Owners: the group's append-only audit trail, newest first (?before=ID pages on), and the hash-chain check naming the first broken row. */
export default async function AuditPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ before?: string }> }) {
  const { slug } = await params;
  const { before } = await searchParams;
  const home = `/g/${encodeURIComponent(slug)}`;
  const { db, member } = await pageMember(slug, `${home}/audit`);
  if (!can(member.role, "audit.read")) return (<><h1>Audit trail</h1><p className="notice-info">Only the group&apos;s owners read the audit trail.</p></>);
  const beforeId = before && /^\d{1,19}$/.test(before) ? before : undefined;
  const [events, chain] = await Promise.all([listAuditEvents(db, member, { take: 100, ...(beforeId ? { before: beforeId } : {}) }), verifyAuditChain(db)]);
  const names = await auditObjectNames(db, member, events);
  return (
    <>
      <h1>Audit trail</h1>
      <p className="lede">Every state change, seal, role change, import and deletion, in an append-only table. Each row&apos;s hash covers the previous row&apos;s hash, so a change after the fact breaks the chain at that row.</p>
      <div className={chain.ok ? "notice-ok" : "form-error"} data-testid="audit-chain" role="status">
        {chain.ok
          ? <>Chain intact: all {chain.checked} rows (every group on this server) link up and match their hashes.</>
          : <>Chain broken at row <strong className="mono">#{chain.firstBrokenId}</strong>: {chain.reason}. {chain.checked} rows before it check out.</>}
      </div>
      <section className="sheet">
        <table data-testid="audit-events">
          <thead><tr><th className="num">#</th><th>When</th><th>Who</th><th>Action</th><th>Object</th><th>Before → after</th><th>Row hash</th></tr></thead>
          <tbody>
            {events.map((e) => (
              <tr key={e.id} className={chain.firstBrokenId === e.id ? "rv-bad" : undefined}>
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
