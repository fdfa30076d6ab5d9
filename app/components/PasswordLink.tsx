"use client";
/**
 * Password-set links: the owner's button on the members page (for members without a password;
 * the link is shown once), and the form on the link's page.
 */
import { useState } from "react";
import Link from "next/link";
import { callJson } from "@/app/_lib/api";

export function IssuePasswordLinkButton({ apiBase, userId, name }: { apiBase: string; userId: string; name: string }) {
  const [link, setLink] = useState<{ path: string; expiresAt: string } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function issue() {
    setBusy(true);
    setError(null);
    const r = await callJson<{ link: { path: string; expiresAt: string } }>(`${apiBase}/members/${userId}/password-link`, "POST");
    setBusy(false);
    if (r.ok) setLink(r.data!.link);
    else setError(r.error);
  }
  if (link) {
    const url = `${window.location.origin}${link.path}`;
    return (
      <div className="small" data-testid="password-link">
        <p>Link for {name} (shown once; works once, until {link.expiresAt.slice(0, 16).replace("T", " ")} UTC):</p>
        <code className="rv-hash" style={{ wordBreak: "break-all" }}>{url}</code>
      </div>
    );
  }
  return (
    <div>
      <button type="button" className="quiet small" onClick={issue} disabled={busy} data-testid="issue-password-link">Password-set link…</button>
      {error && <p className="field-error" role="alert">{error}</p>}
    </div>
  );
}

export function SetPasswordForm({ token, email }: { token: string; email: string }) {
  const [password, setPassword] = useState("");
  const [again, setAgain] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [busy, setBusy] = useState(false);
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (password !== again) { setError("the two passwords differ"); return; }
    setBusy(true);
    setError(null);
    const r = await callJson(`/api/password-links/${encodeURIComponent(token)}`, "POST", { password });
    setBusy(false);
    if (r.ok) setDone(true);
    else setError(r.error);
  }
  if (done) return <p className="notice-ok" data-testid="password-set">Password set for {email}. <Link href="/signin">Sign in</Link>.</p>;
  return (
    <form className="sheet" onSubmit={submit}>
      <div className="field"><label htmlFor="pw">New password (at least 10 characters)</label><input id="pw" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} required /></div>
      <div className="field"><label htmlFor="pw2">The same again</label><input id="pw2" type="password" autoComplete="new-password" value={again} onChange={(e) => setAgain(e.target.value)} required /></div>
      {error && <p className="form-error" role="alert">{error}</p>}
      <div className="actions"><button type="submit" disabled={busy}>Set the password</button></div>
    </form>
  );
}
