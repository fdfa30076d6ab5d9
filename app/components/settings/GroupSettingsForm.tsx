"use client";
/** Owners: rename the group and allow or forbid approving one's own submission (PATCH /api/groups/<slug>). */
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { FieldError } from "@/app/components/FieldError";

export function GroupSettingsForm({ apiBase, name, allowSelfApproval }: { apiBase: string; name: string; allowSelfApproval: boolean }) {
  const router = useRouter();
  const [value, setValue] = useState(name);
  const [self, setSelf] = useState(allowSelfApproval);
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    const r = await callJson(apiBase, "PATCH", { name: value, allowSelfApproval: self });
    setBusy(false);
    setResult(r);
    if (r.ok) router.refresh();
  }

  return (
    <form className="stack narrow" onSubmit={submit} data-testid="group-settings">
      <div className="field">
        <label htmlFor="group-name">Name</label>
        <input id="group-name" type="text" value={value} onChange={(e) => setValue(e.target.value)} aria-invalid={!!errorFor(result, "name")} aria-describedby="group-name-error" />
        <FieldError id="group-name-error" message={errorFor(result, "name")} />
      </div>
      <label className="checkbox"><input type="checkbox" checked={self} onChange={(e) => setSelf(e.target.checked)} data-testid="allow-self-approval" /> Allow a reviewer to approve a revision they submitted themselves</label>
      <p className="small muted">Off by default: a second person looks at every number before it is sealed. Small groups with one reviewer may need it on.</p>
      {result && !result.ok && !result.field && <p className="form-error" role="alert">{result.error}</p>}
      {result?.ok && <p className="notice-ok" role="status">Saved.</p>}
      <div className="actions"><button type="submit" disabled={busy}>Save</button></div>
    </form>
  );
}
