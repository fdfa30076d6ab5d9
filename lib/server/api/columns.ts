/**
 * Column choice for uploads without a mapping (raw API uploads, `heatbook push`): a column named
 * by 0-based index or by header name (case-insensitive), or guessed from the header by the
 * engine's guessColumnRoles; the heat-capacity unit defaults to the unit text in its header.
 * Pure (engine only), shared by the server and the CLI.
 */
import { InputError } from "../../engine/errors";
import { guessColumnRoles, parseDelimited, type ColumnInfo, type Delimiter } from "../../engine/importer";

export interface ColumnChoice {
  tCol?: string;
  cCol?: string;
  sigmaCol?: string;
  unit?: string;
  tUnit?: string;
  delimiter?: "," | ";" | "tab" | "whitespace" | "auto";
}

export interface ResolvedMapping {
  mapping: { temperature: number; heatCapacity: number; sigma?: number };
  units: { temperature: string; heatCapacity: string };
  parse: { delimiter: Delimiter | "auto" };
  columns: ColumnInfo[];
}

function pick(columns: ColumnInfo[], text: string, flag: string): number {
  const t = text.trim();
  if (/^\d+$/.test(t)) {
    const i = Number(t);
    if (i >= columns.length) throw new InputError(`column ${i} does not exist: the file has ${columns.length} columns (0-based)`, { field: flag });
    return i;
  }
  const hit = columns.find((c) => c.name.trim().toLowerCase() === t.toLowerCase());
  if (!hit) throw new InputError(`no column named ${JSON.stringify(t)}; columns are ${columns.map((c) => JSON.stringify(c.name)).join(", ")}`, { field: flag });
  return hit.index;
}

/** Resolve the mapping and units for `text` (the decoded file). Throws InputError naming the option. */
export function resolveColumns(text: string, fileName: string, choice: ColumnChoice): ResolvedMapping {
  const delimiter = choice.delimiter === "tab" ? "\t" : (choice.delimiter ?? "auto");
  const table = parseDelimited(text, { fileName, delimiter });
  const guesses = guessColumnRoles(table.columns);
  const t = choice.tCol !== undefined ? pick(table.columns, choice.tCol, "tCol") : guesses.temperature?.index;
  const c = choice.cCol !== undefined ? pick(table.columns, choice.cCol, "cCol") : guesses.heatCapacity?.index;
  if (t === undefined) throw new InputError("could not tell which column is the temperature: name it (tCol / --t-col)", { field: "tCol" });
  if (c === undefined) throw new InputError("could not tell which column is the heat capacity: name it (cCol / --c-col)", { field: "cCol" });
  const s = choice.sigmaCol !== undefined ? pick(table.columns, choice.sigmaCol, "sigmaCol") : guesses.sigma?.index;
  const unit = choice.unit ?? table.columns[c]!.unitText;
  if (!unit) throw new InputError(`the heat-capacity column ${JSON.stringify(table.columns[c]!.name)} names no unit: give one (unit / --unit, e.g. "µJ/K")`, { field: "unit" });
  const tUnit = choice.tUnit ?? table.columns[t]!.unitText ?? "K";
  return {
    mapping: { temperature: t, heatCapacity: c, ...(s !== undefined && s !== t && s !== c ? { sigma: s } : {}) },
    units: { temperature: tUnit, heatCapacity: unit },
    parse: { delimiter },
    columns: table.columns,
  };
}
