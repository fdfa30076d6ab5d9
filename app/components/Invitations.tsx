"use client";
/** Create an invitation (the link is shown once, with a copy button) and revoke open ones. */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError, invalidProps } from "./FieldError";

interface Created {
  link: string;
  invitation: { email: string; role: string };
}

export function InviteForm({ apiBase }: { apiBase: string }) {
  const router = useRouter();
  const [result, setResult] = useState<ApiResult<Created> | null>(null);
  const [copied, setCopied] = useState(false);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const form = new FormData(formEl);
    setBusy(true);
    setCopied(false);
    const res = await callJson<Created>(`${apiBase}/invitations`, "POST", { email: String(form.get("email") ?? ""), role: String(form.get("role") ?? "") });
    setBusy(false);
    setResult(res);
    if (res.ok) {
      formEl.reset();
      router.refresh();
    }
  }

  async function copy(link: string) {
    try {
      await navigator.clipboard.writeText(link);
      setCopied(true);
    } catch {
      setCopied(false);
    }
  }

  const emailError = errorFor(result, "email") ?? (result && !result.ok && !result.field ? result.error : null);
  const roleError = errorFor(result, "role");
  const created = result?.ok ? result.data : null;
  return (
    <>
      <form className="stack" onSubmit={submit} noValidate>
        <div className="field">
          <label htmlFor="invite-email">E-mail</label>
          <input id="invite-email" name="email" type="email" required {...invalidProps("invite-email", emailError)} />
          <FieldError id="invite-email-error" message={emailError} />
        </div>
        <div className="field">
          <label htmlFor="invite-role">Role</label>
          <select id="invite-role" name="role" defaultValue="analyst" {...invalidProps("invite-role", roleError)}>
            <option value="analyst">analyst</option>
            <option value="reviewer">reviewer</option>
            <option value="viewer">viewer</option>
            <option value="owner">owner</option>
          </select>
          <FieldError id="invite-role-error" message={roleError} />
        </div>
        <div className="actions">
          <button type="submit" disabled={busy}>{busy ? "Creating…" : "Create invitation link"}</button>
        </div>
      </form>
      {created && (
        <div className="notice-ok" role="status" style={{ marginTop: "0.8rem" }}>
          <p style={{ marginTop: 0 }}>Invitation for {created.invitation.email} as {created.invitation.role}. Copy the link now; it is not shown again.</p>
          <div className="linkbox">
            <label htmlFor="invite-link" className="sr-only">Invitation link</label>
            <input id="invite-link" data-testid="invite-link" type="text" readOnly value={created.link} onFocus={(e) => e.currentTarget.select()} />
            <button type="button" className="quiet small" onClick={() => void copy(created.link)}>{copied ? "Copied" : "Copy link"}</button>
          </div>
        </div>
      )}
    </>
  );
}

export function RevokeInvitationButton({ apiBase, invitationId, email }: { apiBase: string; invitationId: string; email: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function revoke() {
    const res = await callJson(`${apiBase}/invitations/${invitationId}`, "DELETE");
    if (!res.ok) return setError(res.error);
    router.refresh();
  }
  return (
    <>
      <button type="button" className="danger small" onClick={() => void revoke()}>Revoke<span className="sr-only"> invitation for {email}</span></button>
      {error && <p className="field-error" role="alert">{error}</p>}
    </>
  );
}
