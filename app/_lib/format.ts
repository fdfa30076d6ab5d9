/**
 * Display formatting only (no physics): numbers to significant figures, dates in UTC so the
 * server-rendered and client-rendered text agree, file sizes.
 */
import { formatNumber, formatTime } from "@/lib/display";

/** A number with `sig` significant figures; "× 10ⁿ" outside 10⁻³ … 10⁵; "—" for null (the display rule, lib/display). */
export function fmtNumber(value: number | null | undefined, sig = 4): string {
  return formatNumber(value, sig);
}

/** ISO time → "2025-03-02 14:05 UTC". */
export function fmtDate(iso: string): string {
  return formatTime(iso);
}

/** ISO time → "2025-03-02". */
export function fmtDay(iso: string): string {
  return iso.slice(0, 10);
}

export function fmtBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / 1024 / 1024).toFixed(2)} MiB`;
}

/** Roles as shown to people. */
export const ROLE_LABEL: Record<string, string> = {
  owner: "owner",
  analyst: "analyst",
  reviewer: "reviewer",
  viewer: "viewer",
};
