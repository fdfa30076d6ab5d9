"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { callJson } from "@/app/_lib/api";

/** Archive or restore a sample (POST {archived}); samples are never deleted. */
export function ArchiveSampleButton({ apiUrl, archived }: { apiUrl: string; archived: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function toggle() {
    setBusy(true);
    const res = await callJson(apiUrl, "POST", { archived: !archived });
    setBusy(false);
    if (!res.ok) return setError(res.error);
    setError(null);
    router.refresh();
  }
  return (
    <>
      <button type="button" className="quiet" onClick={() => void toggle()} disabled={busy}>
        {archived ? "Restore sample" : "Archive sample"}
      </button>
      {error && <p className="form-error" role="alert">{error}</p>}
    </>
  );
}
