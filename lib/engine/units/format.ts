/**
 * Display helpers: the compact value(uncertainty) notation and values with units.
 * Rounding happens here and only here; the engine keeps full precision.
 */
import { invalid } from "../errors";
import { unitMath } from "./mathjs";

export interface UncertaintyFormat {
  /** "e": 1.234(56)e-5 (default); "times": 1.234(56)×10⁻⁵. */
  exponent?: "e" | "times";
  /** Significant digits of the value when there is no uncertainty (default 6). */
  plainDigits?: number;
}

const SUPER: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

function exponentOf(x: number): number {
  return Number(Math.abs(x).toExponential(1).split("e")[1]);
}

function plain(value: number, digits: number): string {
  const e = exponentOf(value);
  if (value !== 0 && (e >= 6 || e <= -4)) return value.toExponential(digits - 1).replace(/\.?0+e/, "e").replace("e+", "e");
  return String(Number(value.toPrecision(digits)));
}

function withExponent(body: string, e: number, style: "e" | "times"): string {
  return style === "e" ? `${body}e${e}` : `${body}×10${String(e).replace(/./g, (c) => SUPER[c])}`;
}

/**
 * Compact uncertainty notation with two significant digits of the standard error (common
 * practice; cf. the concise notation of the GUM, JCGM 100:2008 §7.2.2):
 *   4.2134 ± 0.0246 → "4.213(25)";  1234.4 ± 56 → "1234(56)";  12.34 ± 1.5 → "12.3(1.5)";
 *   −4.2134 ± 0.0246 → "-4.213(25)"; 1.2345e-5 ± 5.6e-8 → "1.2345(56)e-5".
 * The exponent form is used when the larger of |value| and σ is ≥ 1e6 or < 1e-3.
 * A null, undefined or zero standard error gives the value alone (plainDigits significant
 * digits); a non-finite value is shown as is. Throws InputError for a negative or non-finite σ.
 */
export function formatUncertainty(value: number, stdError: number | null | undefined, format: UncertaintyFormat = {}): string {
  const style = format.exponent ?? "e";
  if (!Number.isFinite(value)) return String(value);
  if (stdError === null || stdError === undefined || stdError === 0) return plain(value, format.plainDigits ?? 6);
  if (!Number.isFinite(stdError) || stdError < 0) throw invalid("stdError", stdError, "must be a finite number ≥ 0");
  const e = exponentOf(Math.max(Math.abs(value), stdError));
  if (e >= 6 || e <= -4) {
    const scale = 10 ** e;
    return withExponent(formatUncertainty(value / scale, stdError / scale, { ...format, exponent: style }), e, style);
  }
  const [mantissa, exp] = stdError.toExponential(1).split("e");
  const se = Number(exp);
  const decimals = 1 - se;
  if (decimals > 0) {
    const shown = se >= 0 ? mantissa : mantissa.replace(".", "");
    return `${value.toFixed(decimals)}(${shown})`;
  }
  const step = 10 ** (se - 1);
  return `${(Math.round(value / step) * step).toFixed(0)}(${Number(stdError.toExponential(1)).toFixed(0)})`;
}

export interface DisplayUnit {
  /** SI unit the engine stores. */
  si: string;
  /** mathjs unit shown. */
  display: string;
  /** Typographic form of `display`. */
  label: string;
}

/** Units in which results are shown (DESIGN: γ in mJ mol⁻¹ K⁻², β in mJ mol⁻¹ K⁻⁴). */
export const DISPLAY_UNITS = Object.freeze({
  gamma: { si: "J/(mol K^2)", display: "mJ/(mol K^2)", label: "mJ mol⁻¹ K⁻²" },
  beta: { si: "J/(mol K^4)", display: "mJ/(mol K^4)", label: "mJ mol⁻¹ K⁻⁴" },
  delta: { si: "J/(mol K^6)", display: "mJ/(mol K^6)", label: "mJ mol⁻¹ K⁻⁶" },
  molarHeatCapacity: { si: "J/(mol K)", display: "mJ/(mol K)", label: "mJ mol⁻¹ K⁻¹" },
  temperature: { si: "K", display: "K", label: "K" },
  field: { si: "T", display: "T", label: "T" },
} satisfies Record<string, DisplayUnit>);

const BASIS_NOTE = { "formula-unit": "per mole formula unit", atom: "per mole of atoms" } as const;

/**
 * Convert an SI value (and its standard error) to a display unit with mathjs and format it as
 * "value(σ) label", e.g. formatWithUnit(1.234e-3, 1.2e-5, DISPLAY_UNITS.gamma) → "1.234(12) mJ mol⁻¹ K⁻²".
 * With `per`, the mole is named: "… mJ mol⁻¹ K⁻² (per mole formula unit)". Throws InputError for
 * a unit pair mathjs cannot convert.
 */
export function formatWithUnit(
  valueSI: number, stdErrorSI: number | null | undefined, unit: DisplayUnit,
  options: UncertaintyFormat & { per?: "formula-unit" | "atom" } = {},
): string {
  const factor = displayFactor(unit);
  const sigma = stdErrorSI === null || stdErrorSI === undefined ? stdErrorSI : stdErrorSI * factor;
  const text = `${formatUncertainty(valueSI * factor, sigma, options)} ${unit.label}`;
  return options.per ? `${text} (${BASIS_NOTE[options.per]})` : text;
}

/** Factor from SI to the display unit, by mathjs conversion. */
export function displayFactor(unit: DisplayUnit): number {
  try {
    return unitMath.unit(1, unit.si).toNumber(unit.display);
  } catch (e) {
    throw invalid("unit", `${unit.si} → ${unit.display}`, (e as Error).message);
  }
}

/** γ from J mol⁻¹ K⁻² to "value(σ) mJ mol⁻¹ K⁻²". */
export function formatGamma(gammaJPerMolK2: number, stdError?: number | null, per?: "formula-unit" | "atom"): string {
  return formatWithUnit(gammaJPerMolK2, stdError, DISPLAY_UNITS.gamma, per ? { per } : {});
}

/** β from J mol⁻¹ K⁻⁴ to "value(σ) mJ mol⁻¹ K⁻⁴". */
export function formatBeta(betaJPerMolK4: number, stdError?: number | null, per?: "formula-unit" | "atom"): string {
  return formatWithUnit(betaJPerMolK4, stdError, DISPLAY_UNITS.beta, per ? { per } : {});
}
