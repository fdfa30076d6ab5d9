"use client";
/** Owner controls on the members page (role change, removal) and everyone's "leave group". */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";

const ROLES = ["owner", "analyst", "reviewer", "viewer"] as const;

export function MemberRoleSelect({ apiBase, userId, name, role }: { apiBase: string; userId: string; name: string; role: string }) {
  const router = useRouter();
  const [value, setValue] = useState(role);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const id = `role-${userId}`;
  async function change(next: string) {
    setValue(next);
    setBusy(true);
    setError(null);
    const res = await callJson(`${apiBase}/members/${userId}`, "PATCH", { role: next });
    setBusy(false);
    if (!res.ok) {
      setValue(role);
      setError(res.error);
      return;
    }
    router.refresh();
  }
  return (
    <div className="field">
      <label htmlFor={id} className="sr-only">Role of {name}</label>
      <select id={id} value={value} disabled={busy} onChange={(e) => void change(e.target.value)} aria-describedby={error ? `${id}-error` : undefined}>
        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
      </select>
      {error && <p className="field-error" id={`${id}-error`} role="alert">{error}</p>}
    </div>
  );
}

export function RemoveMemberButton({ apiBase, userId, name }: { apiBase: string; userId: string; name: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function remove() {
    if (!window.confirm(`Remove ${name} from the group?`)) return;
    const res = await callJson(`${apiBase}/members/${userId}`, "DELETE");
    if (!res.ok) return setError(res.error);
    router.refresh();
  }
  return (
    <>
      <button type="button" className="danger small" onClick={() => void remove()}>Remove<span className="sr-only"> {name}</span></button>
      {error && <p className="field-error" role="alert">{error}</p>}
    </>
  );
}

export function LeaveGroupButton({ apiBase, groupName }: { apiBase: string; groupName: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function leave() {
    if (!window.confirm(`Leave ${groupName}? You lose access to its data until someone invites you again.`)) return;
    const res = await callJson(`${apiBase}/members/me`, "DELETE");
    if (!res.ok) return setError(res.error);
    router.push("/groups");
    router.refresh();
  }
  return (
    <>
      <button type="button" className="quiet" onClick={() => void leave()}>Leave this group</button>
      {error && <p className="form-error" role="alert">{error}</p>}
    </>
  );
}
