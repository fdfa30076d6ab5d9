"use client";
/** Personal access tokens: create (name, scope, lifetime) — the secret is shown once with a copy button —, list with prefix, last use and expiry, renew, revoke. */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError } from "@/app/components/FieldError";
import type { TokenInfo } from "@/lib/server/tokens";
import { when } from "@/app/components/review/labels";

const LIFETIMES = [30, 90, 180, 365] as const;

export function TokenPanel({ apiBase, tokens, now, defaultDays }: { apiBase: string; tokens: TokenInfo[]; now: string; defaultDays: number }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [scope, setScope] = useState<"read" | "read_write">("read");
  const [days, setDays] = useState<number>(defaultDays);
  const [secret, setSecret] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);

  async function create(e: FormEvent) {
    e.preventDefault();
    const r = await callJson<{ token: string }>(`${apiBase}/tokens`, "POST", { name, scope, days });
    setResult(r);
    if (r.ok && r.data) { setSecret(r.data.token); setCopied(false); setName(""); router.refresh(); }
  }
  async function revoke(t: TokenInfo) {
    if (!window.confirm(`Revoke "${t.name}" (${t.prefix}…)? Scripts using it stop working at once.`)) return;
    const r = await callJson(`${apiBase}/tokens/${t.id}`, "DELETE");
    setResult(r);
    router.refresh();
  }
  async function renew(t: TokenInfo) {
    const r = await callJson(`${apiBase}/tokens/${t.id}/renew`, "POST", {});
    setResult(r);
    router.refresh();
  }
  async function copy() {
    if (!secret) return;
    try { await navigator.clipboard.writeText(secret); setCopied(true); } catch { setCopied(false); }
  }

  return (
    <div className="stack">
      <form className="inline-form" onSubmit={create} data-testid="token-create">
        <div className="field"><label htmlFor="token-name">Name</label><input id="token-name" type="text" value={name} onChange={(e) => setName(e.target.value)} placeholder="e.g. fitting laptop" aria-invalid={!!errorFor(result, "name")} aria-describedby="token-name-error" /></div>
        <div className="field"><label htmlFor="token-scope">Access</label>
          <select id="token-scope" value={scope} onChange={(e) => setScope(e.target.value as "read" | "read_write")}><option value="read">read</option><option value="read_write">read and write</option></select>
        </div>
        <div className="field"><label htmlFor="token-days">Expires after</label>
          <select id="token-days" value={days} onChange={(e) => setDays(Number(e.target.value))}>{[...new Set([...LIFETIMES, defaultDays])].sort((a, b) => a - b).map((d) => <option key={d} value={d}>{d} days</option>)}</select>
        </div>
        <button type="submit" disabled={!name.trim()}>Create token</button>
      </form>
      <FieldError id="token-name-error" message={errorFor(result, "name")} />
      {result && !result.ok && !result.field && <p className="form-error" role="alert">{result.error}</p>}
      {secret && (
        <div className="notice-info" data-testid="token-secret">
          <p><strong>Copy this token now.</strong> It will not be shown again.</p>
          <div className="linkbox"><input type="text" readOnly value={secret} aria-label="New token" onFocus={(e) => e.currentTarget.select()} /><button type="button" className="quiet small" onClick={copy}>{copied ? "Copied" : "Copy"}</button></div>
        </div>
      )}
      {tokens.length === 0 ? <p className="muted">No tokens yet.</p> : (
        <table data-testid="tokens">
          <thead><tr><th>Name</th><th>Starts with</th><th>Access</th><th>Created</th><th>Last used</th><th>Expires</th><th /></tr></thead>
          <tbody>
            {tokens.map((t) => {
              const expired = !t.revokedAt && t.expiresAt <= now;
              return (
                <tr key={t.id} className={t.revokedAt || expired ? "muted" : undefined}>
                  <td>{t.name}</td><td className="mono">{t.prefix}…</td><td>{t.scope === "read" ? "read" : "read and write"}</td>
                  <td className="small">{when(t.createdAt)}</td><td className="small">{t.lastUsedAt ? when(t.lastUsedAt) : "never"}</td>
                  <td className="small" data-testid="token-expiry">{t.revokedAt ? "—" : `${expired ? "expired " : ""}${when(t.expiresAt)}`}</td>
                  <td>
                    {t.revokedAt ? <span className="small">revoked {when(t.revokedAt)}</span> : (
                      <span className="actions">
                        <button type="button" className="quiet small" onClick={() => renew(t)} title={`Expires ${defaultDays} days from now`}>Renew</button>
                        <button type="button" className="danger small" onClick={() => revoke(t)}>Revoke</button>
                      </span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </div>
  );
}
