/**
 * "value(stat)(syst)" notation: both uncertainties in units of the value's last digit, the
 * digits set by two significant digits of the smaller nonzero uncertainty (the concise
 * notation of formatUncertainty, units/format.ts, with a second parenthesis; common
 * practice). 3.00412 ± 0.0123 (stat) ± 0.0351 (syst) → "3.004(12)(35)";
 * 0.072104 ± 0.00012 ± 0.0003 → "0.07210(12)(30)"; a zero uncertainty prints as (0).
 * The exponent form "…e-5" is used when the largest of |value|, stat, syst is ≥ 1e6 or < 1e-3.
 * A null uncertainty gives the value with formatUncertainty's rules for the other one.
 */
import { formatUncertainty } from "../units/format";

const exponentOf = (v: number) => Math.floor(Math.log10(v));

export function formatStatSyst(value: number, stat: number | null, syst: number | null): string {
  if (!Number.isFinite(value)) return String(value);
  if (stat === null || syst === null || !Number.isFinite(stat) || !Number.isFinite(syst) || stat < 0 || syst < 0) {
    return formatUncertainty(value, stat !== null && Number.isFinite(stat) && stat >= 0 ? stat : null);
  }
  const top = Math.max(Math.abs(value), stat, syst);
  if (top === 0) return "0";
  const e = exponentOf(top);
  if (e >= 6 || e <= -4) {
    const scale = 10 ** e;
    const sup: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
    return `${formatStatSyst(value / scale, stat / scale, syst / scale)} × 10${String(e).replace(/./g, (c) => sup[c] ?? c)}`;
  }
  const positive = [stat, syst].filter((v) => v > 0);
  if (positive.length === 0) return `${formatUncertainty(value, null)}(0)(0)`;
  const small = Math.min(...positive);
  const decimals = Math.max(0, 1 - exponentOf(Number(small.toExponential(1))));
  const unit = 10 ** -decimals;
  const digits = (u: number) => String(Math.round(u / unit));
  const shown = decimals > 0 ? value.toFixed(decimals) : String(Math.round(value));
  return `${shown}(${digits(stat)})(${digits(syst)})`;
}
