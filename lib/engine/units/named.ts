/**
 * Named units of stored results: the trade units the derived quantities are computed in
 * (deriveAll works in them, as the literature writes them) and the SI unit each is stored in.
 * A step stores SI (toSI); screens, reports and tables convert back at the edge (toTrade).
 * A unit not listed is SI already (K, 1, m s⁻¹, m⁻³) or has no SI form here, and stays as it is.
 *
 *   SI value = trade value × factor
 */
import { ELECTRONVOLT_J } from "../constants";
import type { Quantity } from "../uncertainty/quantity";

const E = ELECTRONVOLT_J;

/** Trade unit → its SI unit and factor. */
export const TRADE_UNITS: Readonly<Record<string, { si: string; factor: number }>> = Object.freeze({
  "mJ mol^-1 K^-2": { si: "J mol^-1 K^-2", factor: 1e-3 },
  "mJ mol^-1 K^-4": { si: "J mol^-1 K^-4", factor: 1e-3 },
  "mJ mol^-1 K^-1": { si: "J mol^-1 K^-1", factor: 1e-3 },
  "eV": { si: "J", factor: E },
  "Å^-1": { si: "m^-1", factor: 1e10 },
  "states eV^-1 f.u.^-1": { si: "states J^-1 f.u.^-1", factor: 1 / E },
  "states eV^-1 atom^-1": { si: "states J^-1 atom^-1", factor: 1 / E },
  // μΩ cm = 10⁻⁸ Ω m; mJ⁻² = 10⁶ J⁻²
  "μΩ cm K^2 mol^2 mJ^-2": { si: "Ω m K^2 mol^2 J^-2", factor: 1e-2 },
});

const SI_TO_TRADE: Readonly<Record<string, { trade: string; factor: number }>> = Object.freeze(
  Object.fromEntries(Object.entries(TRADE_UNITS).map(([trade, { si, factor }]) => [si, { trade, factor }])),
);

function rescale<Q extends Quantity>(q: Q, factor: number, unit: string): Q {
  const k = Math.abs(factor);
  return {
    ...q, value: q.value * factor, unit,
    stdError: q.stdError === null ? null : q.stdError * k,
    ...(typeof q.systematicError === "number" ? { systematicError: q.systematicError * k } : {}),
  };
}

/** The quantity in SI (its unit named); a unit with no entry is returned as it is. */
export function toSI<Q extends Quantity>(q: Q): Q {
  const t = Object.hasOwn(TRADE_UNITS, q.unit) ? TRADE_UNITS[q.unit]! : null;
  return t ? rescale(q, t.factor, t.si) : q;
}

/** The quantity in the trade's unit for display (mJ mol⁻¹ K⁻², eV, Å⁻¹, states eV⁻¹ …); other units as they are. */
export function toTrade<Q extends Quantity>(q: Q): Q {
  const t = Object.hasOwn(SI_TO_TRADE, q.unit) ? SI_TO_TRADE[q.unit]! : null;
  return t ? rescale(q, 1 / t.factor, t.trade) : q;
}
