"use client";
/** Notices with read/unread toggles and "mark all read"; the top bar's count follows (router.refresh). */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";
import type { NoticeView } from "@/lib/server/review";
import { when } from "./labels";

const KIND: Record<string, string> = {
  "review.requested": "review asked", "review.withdrawn": "withdrawn", "review.returned": "changes requested", "review.approved": "approved",
};

export function NoticeList({ apiBase, notices, unread }: { apiBase: string; notices: NoticeView[]; unread: number }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function mark(id: string, read: boolean) {
    const r = await callJson(`${apiBase}/notices/${id}`, "PATCH", { read });
    if (!r.ok) setError(r.error);
    router.refresh();
  }
  async function markAll() {
    setBusy(true);
    const r = await callJson(`${apiBase}/notices`, "POST", { action: "read-all" });
    setBusy(false);
    if (!r.ok) setError(r.error);
    router.refresh();
  }

  return (
    <section className="sheet" aria-label="Notices">
      <div className="actions">
        <span data-testid="unread-count">{unread} unread of {notices.length}</span>
        <button type="button" className="quiet small" disabled={busy || unread === 0} onClick={markAll} data-testid="mark-all-read">Mark all read</button>
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
      {notices.length === 0 ? <p className="muted">No notices yet.</p> : (
        <ul className="rv-queue" data-testid="notices">
          {notices.map((n) => (
            <li key={n.id} className={n.read ? "muted" : undefined} data-read={n.read}>
              {!n.read && <strong aria-label="unread">● </strong>}
              <span className="tag">{KIND[n.kind] ?? n.kind.replace(/^\w+\./, "")}</span>
              <Link href={n.link} onClick={() => { if (!n.read) void callJson(`${apiBase}/notices/${n.id}`, "PATCH", { read: true }); }}>{n.message}</Link>
              <div className="small">{when(n.createdAt)} · <button type="button" className="quiet small" onClick={() => mark(n.id, !n.read)}>{n.read ? "Mark unread" : "Mark read"}</button></div>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
