/**
 * Choices offered by the import panel and the pre-selection of units from a column's unit text.
 * The heat-capacity units are passed in from the server (lib/server/measurements.ts
 * HEAT_CAPACITY_UNITS) so the two lists cannot drift apart.
 */

export const TEMPERATURE_UNITS = ["K", "mK"] as const;
export const FIELD_UNITS = ["T", "Oe"] as const;

export const DELIMITER_NAMES: Record<string, string> = { ",": "comma", ";": "semicolon", "\t": "tab", whitespace: "spaces or tabs" };

const TOKEN = /(uj|mj|j|mol|g|k|mk|t|oe)(\^?-1|⁻¹)?/g;

/**
 * Reduce unit text to a comparable key, or null when it holds anything we do not offer:
 * "J/(mol·K)", "J mol^-1 K^-1", "J/mol-K", "J/K/mol" all → "j/k.mol"; "mJ/K^2" → null.
 */
function key(text: string): string | null {
  const s = text.trim().toLowerCase().replace(/[µμ]/g, "u");
  const num: string[] = [];
  const den: string[] = [];
  let rest = "";
  s.split("/").forEach((part, i) => {
    rest += part.replace(TOKEN, (_, unit: string, inverse?: string) => {
      (i === 0 && !inverse ? num : den).push(unit);
      return "";
    });
  });
  if (rest.replace(/[\s()[\]·⋅*.\-]/g, "") !== "") return null;
  return `${num.sort().join(".")}/${den.sort().join(".")}`;
}

/** The offered unit whose spelling matches `unitText`, or null when nothing matches. */
export function matchUnit(unitText: string | null, offered: readonly string[]): string | null {
  if (!unitText) return null;
  const k = key(unitText);
  return k === null ? null : offered.find((u) => key(u) === k) ?? null;
}
