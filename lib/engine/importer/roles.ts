/**
 * guessColumnRoles: which columns hold temperature, heat capacity, its uncertainty and the
 * magnetic field, from names and unit text. A heuristic (common practice for instrument
 * exports), so every guess carries a confidence in [0, 1] and a reason; the user confirms.
 */
import type { ColumnInfo } from "./types";

export type ColumnRole = "temperature" | "heatCapacity" | "sigma" | "field";

export interface RoleGuess {
  index: number;
  confidence: number;
  reason: string;
}

export type RoleGuesses = Record<ColumnRole, RoleGuess | null>;

const ROLES: readonly ColumnRole[] = ["temperature", "heatCapacity", "sigma", "field"];
const UNCERTAINTY = /(^|[^a-z])(err|error|errors|sigma|sd|std|stdev|stddev|uncert\w*|dev\w*|dc|δc|σ\w*)([^a-z]|$)/i;
const TEMPERATURE_UNIT = /^(m?K|[Kk]elvin)$/;
const FIELD_UNIT = /^(k?Oe|m?T|k?G|[Tt]esla|[Gg]auss|[Oo]ersted)$/;
const ENERGY_PER_K = /j.*k/i;
const PER_K2 = /k\s*(\^?\s*-?2|²|⁻²)|k\s*\^?\s*2/i;

function normal(text: string): string {
  return text.toLowerCase().replace(/[_\-.:]+/g, " ").replace(/\s+/g, " ").trim();
}

function score(role: ColumnRole, column: ColumnInfo): [number, string] {
  const name = normal(column.name);
  const unit = (column.unitText ?? "").trim();
  const isErr = UNCERTAINTY.test(name);
  const jk = ENERGY_PER_K.test(unit) && !PER_K2.test(unit);
  switch (role) {
    case "temperature": {
      if (FIELD_UNIT.test(unit)) return [0, ""];
      let s = /^(t|ts|temp|temperature|t sample|sample temp|sample temperature)$/.test(name) ? 0.6 : /temp/.test(name) ? 0.45 : 0;
      if (/puck|system|bath|block|platform|stage|probe/.test(name)) s -= 0.2;
      if (TEMPERATURE_UNIT.test(unit)) s += 0.4;
      return [s, `name "${column.name}"${unit ? `, unit "${unit}"` : ""}`];
    }
    case "heatCapacity": {
      if (isErr || /\/\s*t\b/.test(name) || PER_K2.test(unit)) return [0, ""];
      let s = /^(c|cp|c p|hc|cs|c sample|heat capacity|specific heat|sample hc|samp hc|total hc)$/.test(name) ? 0.6
        : /heat cap|specific heat|\bhc\b|\bcp\b/.test(name) ? 0.5 : 0;
      if (/addend|puck|empty|platform/.test(name)) s -= 0.2;
      if (jk) s += 0.4;
      return [s, `name "${column.name}"${unit ? `, unit "${unit}"` : ""}`];
    }
    case "sigma": {
      if (!isErr) return [0, ""];
      let s = 0.6 + (/hc|heat|\bc\b|cp|dc|δc/.test(name) ? 0.1 : 0);
      if (/temp/.test(name) && !/hc|heat/.test(name)) s -= 0.4;
      if (jk) s += 0.3;
      return [s, `uncertainty name "${column.name}"`];
    }
    case "field": {
      let s = /^(h|b|field|mu0h|μ0h|magnetic field|h field|b field|applied field)$/.test(name) ? 0.6 : /field/.test(name) ? 0.5 : 0;
      if (FIELD_UNIT.test(unit)) s += 0.4;
      return [s, `name "${column.name}"${unit ? `, unit "${unit}"` : ""}`];
    }
  }
}

/**
 * Guess column roles. Each column takes at most one role, assigned greedily by score
 * (name pattern ≈ 0.6, matching unit ≈ 0.4). Without any recognisable header, columns 1
 * and 2 are offered as temperature and heat capacity with confidence 0.2 (position only).
 * A role with no candidate scoring at least 0.3 is null.
 */
export function guessColumnRoles(columns: readonly ColumnInfo[]): RoleGuesses {
  const candidates: { role: ColumnRole; index: number; s: number; reason: string }[] = [];
  for (const column of columns) {
    for (const role of ROLES) {
      const [s, reason] = score(role, column);
      if (s >= 0.3) candidates.push({ role, index: column.index, s, reason });
    }
  }
  candidates.sort((a, b) => b.s - a.s || a.index - b.index);
  const result: RoleGuesses = { temperature: null, heatCapacity: null, sigma: null, field: null };
  const used = new Set<number>();
  for (const c of candidates) {
    if (result[c.role] || used.has(c.index)) continue;
    result[c.role] = { index: c.index, confidence: Math.min(1, Math.round(c.s * 100) / 100), reason: c.reason };
    used.add(c.index);
  }
  if (!result.temperature && !result.heatCapacity && columns.length >= 2 && !used.has(0) && !used.has(1)) {
    result.temperature = { index: 0, confidence: 0.2, reason: "first column (no recognisable header)" };
    result.heatCapacity = { index: 1, confidence: 0.2, reason: "second column (no recognisable header)" };
  }
  return result;
}
