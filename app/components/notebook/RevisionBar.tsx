"use client";
/** The sticky bar above the chain: revision number and state in our words, other revisions, server time, live status. */
import Link from "next/link";
import { STATE_LABEL, num, when } from "./display";
import type { NotebookData } from "./types";

export function RevisionBar({ nb, live }: { nb: NotebookData; live: "connecting" | "live" | "offline" }) {
  const r = nb.revision;
  const base = `?`;
  return (
    <div className="nb-revbar" data-testid="revision-bar">
      <div className="nb-rev-main">
        <span className="nb-rev-no">Revision {r.number}</span>
        <span className={`nb-state nb-state-${r.state}`} data-testid="revision-state">{STATE_LABEL[r.state]}</span>
        {r.state === "sealed" && r.contentHash && <span className="small mono" title={r.contentHash}>content {r.contentHash.slice(0, 12)}…, sealed {when(r.sealedAt)}</span>}
        {!nb.editable && r.state !== "sealed" && <span className="small muted">read only</span>}
      </div>
      {nb.revisions.length > 1 && (
        <nav className="nb-revs small" aria-label="Revisions">
          {nb.revisions.map((x) => x.id === r.id
            ? <strong key={x.id}>r{x.number}</strong>
            : <Link key={x.id} href={`${base}revision=${x.id}`} title={STATE_LABEL[x.state]}>r{x.number}</Link>)}
        </nav>
      )}
      <span className="nb-rev-spacer" />
      <span className="small muted" data-testid="compute-millis">server {num(nb.computeMillis, 3)} ms</span>
      <span className={`small nb-live nb-live-${live}`} title="Changes by others appear without reloading">{live === "live" ? "● live" : live === "connecting" ? "○ connecting" : "○ offline — reload to catch up"}</span>
    </div>
  );
}
