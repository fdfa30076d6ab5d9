"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { callJson, errorFor, type ApiResult } from "@/app/_lib/api";
import { groupPaths } from "@/app/_lib/paths";
import { FieldError, invalidProps } from "./FieldError";

/** POST /api/groups {name}; on success go to the new group's home. */
export function CreateGroupForm() {
  const router = useRouter();
  const [result, setResult] = useState<ApiResult<unknown> | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const name = String(new FormData(e.currentTarget).get("name") ?? "");
    setBusy(true);
    const res = await callJson<{ group: { slug: string } }>("/api/groups", "POST", { name });
    setBusy(false);
    if (!res.ok || !res.data) return setResult(res);
    router.push(groupPaths(res.data.group.slug).home);
    router.refresh();
  }

  const nameError = errorFor(result, "name") ?? (result && !result.ok && !result.field ? result.error : null);
  return (
    <form className="stack" onSubmit={submit} noValidate>
      <div className="field">
        <label htmlFor="group-name">Group name</label>
        <input id="group-name" name="name" type="text" required maxLength={80} {...invalidProps("group-name", nameError)} />
        <FieldError id="group-name-error" message={nameError} />
      </div>
      <div className="actions">
        <button type="submit" disabled={busy}>{busy ? "Creating…" : "Create group"}</button>
      </div>
    </form>
  );
}
