/**
 * Display formatting only (no physics): numbers to significant figures, dates in UTC so the
 * server-rendered and client-rendered text agree, file sizes.
 */

/** A number with `sig` significant figures; exponent form outside 1e-3 … 1e5; "—" for null. */
export function fmtNumber(value: number | null | undefined, sig = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs < 1e-3 || abs >= 1e5) {
    const [mantissa, exponent] = value.toExponential(sig - 1).split("e") as [string, string];
    return `${mantissa} × 10${superscript(String(Number(exponent)))}`;
  }
  return Number(value.toPrecision(sig)).toString();
}

const SUP: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

function superscript(text: string): string {
  return [...text].map((c) => SUP[c] ?? c).join("");
}

/** ISO time → "2025-03-02 14:05 UTC". */
export function fmtDate(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toISOString().slice(0, 16).replace("T", " ") + " UTC";
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
