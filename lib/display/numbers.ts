/**
 * The one rule for numbers people read (screens, report, PDF, figure labels):
 *  - a value with a standard error in the compact form value(σ), two significant digits of σ
 *    (lib/engine/units/format.ts: formatUncertainty, the concise notation of JCGM 100:2008
 *    §7.2.2), and a power of ten written "× 10⁻⁵" with real superscripts — never "e-5";
 *  - a value without σ to `sig` significant digits (default 4; 6 for stored sample facts),
 *    trailing zeros dropped, "× 10ⁿ" outside 10⁻³ … 10⁵;
 *  - units with superscript exponents ("mJ mol⁻¹ K⁻²"), no unit for dimensionless values;
 *  - times as "2026-12-04 14:52 UTC".
 * Rounding happens only here; stored values keep full precision.
 */
import { formatUncertainty } from "../engine/units/format";
import { unicodeShift } from "./typeset";

const superscript = (s: string) => unicodeShift(s, "sup") ?? s;

/** "1.2345(56)e-5" (the engine's compact form) → "1.2345(56) × 10⁻⁵". */
function timesTen(text: string): string {
  return text.replace(/^(.*?)e([+-]?\d+)$/, (_, body: string, e: string) => `${body} × 10${superscript(String(Number(e)))}`);
}

/** A number to `sig` significant digits: "48.7895", "8.147 × 10⁻⁸", "—" for null or non-finite. */
export function formatNumber(value: number | null | undefined, sig = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs < 1e-3 || abs >= 1e5) {
    const [mantissa, exponent] = value.toExponential(sig - 1).split("e") as [string, string];
    const m = mantissa.includes(".") ? mantissa.replace(/0+$/, "").replace(/\.$/, "") : mantissa;
    return `${m.replace("-", "−")} × 10${superscript(String(Number(exponent)))}`;
  }
  return String(Number(value.toPrecision(sig))).replace("-", "−");
}

/**
 * value(σ): "4.483(17)", "1.2345(56) × 10⁻⁵", "1234(56)"; without σ the value to `sig`
 * significant digits. A minus sign is the typographic "−".
 */
export function formatValue(value: number, stdError: number | null | undefined, sig = 4): string {
  if (!Number.isFinite(value)) return "—";
  if (stdError === null || stdError === undefined || stdError === 0 || !Number.isFinite(stdError)) return formatNumber(value, sig);
  return timesTen(formatUncertainty(value, Math.abs(stdError))).replace(/^-/, "−");
}

/**
 * A unit as typeset text: "mJ mol^-1 K^-2" and "J/(mol*K^2)" → "mJ mol⁻¹ K⁻²"; "m s^-1" →
 * "m s⁻¹"; "1" or "" → "" (dimensionless values carry no unit).
 */
export function formatUnit(unit: string | null | undefined): string {
  if (!unit || unit.trim() === "1") return "";
  let u = unit.trim();
  // "A/(B*C^2)" → "A B^-1 C^-2"
  u = u.replace(/\/\(([^()]*)\)/g, (_, inner: string) => " " + inner.split(/[*\s]+/).filter(Boolean).map(invert).join(" "));
  u = u.replace(/\/([\p{L}µΩÅ]+(?:\^-?[\d.]+)?)/gu, (_, one: string) => " " + invert(one));
  u = u.replace(/\*/g, " ").replace(/\s+/g, " ").trim();
  return u.replace(/\^(-?[\d.]+)/g, (_, e: string) => superscript(e));
}

function invert(factor: string): string {
  const m = /^(.+?)(?:\^(-?[\d.]+))?$/.exec(factor)!;
  const e = m[2] === undefined ? 1 : Number(m[2]);
  return `${m[1]}^${-e}`;
}

/** "4.483(17) mJ mol⁻¹ K⁻²"; no trailing unit for dimensionless values. */
export function formatQuantity(value: number, stdError: number | null | undefined, unit: string | null | undefined, sig = 4): string {
  const u = formatUnit(unit);
  return u ? `${formatValue(value, stdError, sig)} ${u}` : formatValue(value, stdError, sig);
}

/** "2026-12-04 14:52 UTC" from an ISO string or a Date; "—" for none; the input for unparsable text. */
export function formatTime(at: string | Date | null | undefined): string {
  if (at === null || at === undefined) return "—";
  const d = at instanceof Date ? at : new Date(at);
  if (Number.isNaN(d.getTime())) return String(at);
  return d.toISOString().slice(0, 16).replace("T", " ") + " UTC";
}

/** "1 point", "4 points"; `plural` for irregular nouns ("1 atom per formula unit"). */
export function formatCount(n: number, noun: string, plural = `${noun}s`): string {
  return `${n} ${n === 1 ? noun : plural}`;
}

/** A temperature window "1.8–7.505 K" with the same digits as everywhere (4 significant). */
export function formatRange(lo: number, hi: number, unit: string, sig = 4): string {
  return `${formatNumber(lo, sig)}–${formatNumber(hi, sig)}${unit ? ` ${formatUnit(unit)}` : ""}`;
}

/**
 * An engine sentence made fit to read without changing what sealed outputs hold (a sealed note
 * must stay byte-identical for Verify): numbers carrying a floating-point artefact
 * ("5.800000000000001", 13 or more significant digits) are shown to 12 digits ("5.8"), and
 * "1 atoms" / "1 electrons" agree in number.
 */
export function cleanText(text: string): string {
  return text
    .replace(/-?\d+\.\d+/g, (m) => (m.replace(/^-?0*\.?0*/, "").replace(".", "").length >= 13 ? String(Number(Number(m).toPrecision(12))) : m))
    .replace(/(^|[^\d.])1 (atom|electron|point|conduction electron)s\b/g, "$11 $2");
}
