"use client";
import { signOut } from "next-auth/react";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";

/** Ends every session of the account (POST /api/account/sessions/end-all), then clears this browser's cookie. */
export function SignOutEverywhereButton() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function run() {
    if (!window.confirm("Sign out on every browser and device where you are signed in, this one included?")) return;
    setBusy(true);
    const r = await callJson<{ ended: number }>("/api/account/sessions/end-all", "POST");
    if (!r.ok) {
      setBusy(false);
      setError(r.error);
      return;
    }
    await signOut({ callbackUrl: "/signin" });
  }
  return (
    <div className="stack">
      <div className="actions">
        <button type="button" className="danger" disabled={busy} onClick={run}>{busy ? "Signing out…" : "Sign out everywhere"}</button>
      </div>
      {error && <p className="form-error" role="alert">{error}</p>}
    </div>
  );
}
