"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";
import { groupPaths } from "@/app/_lib/paths";

/** POST /api/invitations/<token>/accept, then open the group. */
export function AcceptInvitationButton({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function accept() {
    setBusy(true);
    const res = await callJson<{ group: { slug: string } }>(`/api/invitations/${encodeURIComponent(token)}/accept`, "POST");
    if (!res.ok || !res.data) {
      setBusy(false);
      return setError(res.error);
    }
    router.push(groupPaths(res.data.group.slug).home);
    router.refresh();
  }
  return (
    <div className="stack">
      <div className="actions">
        <button type="button" onClick={() => void accept()} disabled={busy}>{busy ? "Joining…" : "Accept invitation"}</button>
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
    </div>
  );
}
