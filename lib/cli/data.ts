/**
 * Reading a C(T) file for the `heatbook` commands that take one (fit, transition, entropy):
 * columns, units, the basis (per mole, or per gram with a molar mass) and the weighting.
 *
 * Columns: by header guess (the shared importer), or named with --t-col, --c-col, --sigma-col
 * (name or 1-based number). A σ column is used only when it is named with --sigma-col, or when
 * neither --c-col nor --sigma-col is given and the importer recognises one; when --c-col is given,
 * a σ-looking column that was not named is reported, never used silently.
 *
 * Weighting (at most one): the σ column; --sigma-col none or --unweighted (no σ: ordinary least
 * squares); --relative-sigma P (σ_i = P % of |C_i|); --sigma V[UNIT] (the same absolute σ for every
 * point, in C's unit unless one is given). The last two build the σ column here (relativeSigma,
 * absoluteSigma): the engine's fit takes a σ array and nothing else.
 *
 * Basis: per mole formula unit (J/(mol K), mJ/(mol K), …) as is; per mass (J/(g K), J/(kg K))
 * with --formula F or --molar-mass M [g/mol]: C_mol = c · M (per mole formula unit).
 * Every bad input throws InputError naming the flag, the file and the line.
 */
import type { CliIo } from "./io";
import { getBoolean, getString, type FlagSpec, type ParsedArgs } from "./args";
import { InputError } from "../engine/errors";
import { parseDelimited, guessColumnRoles, extractPoints, type ParsedTable } from "../engine/importer";
import { heatCapacityBasis, toSI, siFactor } from "../engine/units";
import { parseFormula } from "../engine/chemistry";
import { specificToMolar } from "../engine/corrections";

export const DATA_FLAGS: Record<string, FlagSpec> = {
  "t-col": { kind: "string", meta: "NAME|N", help: "temperature column (name or 1-based number)" },
  "c-col": { kind: "string", meta: "NAME|N", help: "heat-capacity column (then σ comes only from --sigma-col)" },
  "sigma-col": { kind: "string", meta: "NAME|N|none", help: "column of standard uncertainties of C (same unit as C); none: unweighted" },
  unweighted: { kind: "boolean", help: "ignore any σ column: ordinary (unweighted) least squares" },
  "relative-sigma": { kind: "number", meta: "P", help: "σ of every point = P % of C (for files without σ)" },
  sigma: { kind: "string", meta: "V[UNIT]", help: 'the same σ for every point, e.g. "0.02 mJ/(mol*K)" (default unit: C\'s)' },
  "c-unit": { kind: "string", meta: "UNIT", help: 'heat-capacity unit, e.g. "mJ/(mol*K)" or "J/(g*K)" (default: header unit, else J/(mol*K))' },
  formula: { kind: "string", meta: "F", help: "chemical formula: molar mass for per-gram data (IUPAC 2021), and r" },
  "molar-mass": { kind: "number", meta: "G_PER_MOL", help: "molar mass [g/mol] of one formula unit, for per-gram data" },
};

export type Weighting =
  | { readonly kind: "column"; readonly column: string }
  | { readonly kind: "none"; readonly why: string }
  | { readonly kind: "relative"; readonly percent: number }
  | { readonly kind: "absolute"; readonly value: number; readonly unit: string };

export interface LoadedHeatCapacity {
  readonly file: string;
  /** Rows in file order, SI: T [K], C and σ [J mol⁻¹ K⁻¹] per mole formula unit. */
  readonly temperatureK: number[];
  readonly heatCapacity: number[];
  readonly sigma?: number[];
  /** 1-based source line of each row. */
  readonly lineNumbers: number[];
  readonly columns: { readonly T: string; readonly C: string; readonly sigma: string | null; readonly cUnit: string };
  readonly weighting: Weighting;
  /** How C was brought to per mole formula unit. */
  readonly basis: { readonly given: "molar" | "specific"; readonly molarMassGPerMol: number | null; readonly formula: string | null };
  /** Atoms per formula unit from --formula, if given. */
  readonly atomsPerFormulaUnit: number | null;
  /** Things the user should know (an unused σ-looking column, formula warnings). */
  readonly notes: string[];
}

/** The weighting in words, e.g. "weighted by σ from column \"dC\"" or "unweighted (no σ column)". */
export function describeWeighting(w: Weighting): string {
  switch (w.kind) {
    case "column":
      return `weighted by σ from column ${JSON.stringify(w.column)}`;
    case "none":
      return `unweighted (${w.why})`;
    case "relative":
      return `weighted by σ = ${w.percent} % of C (--relative-sigma)`;
    case "absolute":
      return `weighted by σ = ${w.value} ${w.unit} for every point (--sigma)`;
  }
}

/** Find a column by name (case-insensitive) or 1-based number; InputError naming the file otherwise. */
export function findColumn(table: ParsedTable, spec: string, flag: string): number {
  const n = Number(spec);
  if (Number.isInteger(n) && n >= 1 && n <= table.columns.length) return n - 1;
  const hit = table.columns.find((c) => c.name.toLowerCase() === spec.toLowerCase());
  if (!hit) {
    const numeric = Number.isInteger(n) ? ` (the file has ${table.columns.length} columns)` : "";
    throw new InputError(`--${flag} ${JSON.stringify(spec)}: no such column${numeric} (columns: ${table.columns.map((c) => c.name).join(", ")})`, { file: table.fileName, field: flag });
  }
  return hit.index;
}

/** Read and parse FILE through the shared importer. */
export function readTable(path: string, io: CliIo): ParsedTable {
  let bytes: Uint8Array;
  try {
    bytes = io.readFile(path);
  } catch (e) {
    throw new InputError(`cannot read ${path}: ${(e as Error).message}`, { file: path });
  }
  return parseDelimited(new TextDecoder().decode(bytes), { fileName: path });
}

/**
 * σ_i = (percent/100)·|C_i| for every point. Throws InputError for a percentage outside (0, 100]
 * or a point with C = 0 (a relative σ is zero there), naming the file and line.
 */
export function relativeSigma(heatCapacity: readonly number[], percent: number, where: { file?: string; lineNumbers?: readonly number[] } = {}): number[] {
  if (!(Number.isFinite(percent) && percent > 0 && percent <= 100)) throw new InputError(`invalid --relative-sigma: ${percent} (a percentage in (0, 100])`, { field: "relative-sigma" });
  return heatCapacity.map((c, i) => {
    const s = (Math.abs(c) * percent) / 100;
    if (!(s > 0)) throw new InputError(`--relative-sigma: C = 0, so σ = ${percent} % of C would be 0`, { file: where.file, line: where.lineNumbers?.[i], field: "relative-sigma" });
    return s;
  });
}

/** The same σ for each of n points. Throws InputError unless σ is finite and > 0. */
export function absoluteSigma(n: number, sigma: number): number[] {
  if (!(Number.isFinite(sigma) && sigma > 0)) throw new InputError(`invalid --sigma: ${sigma} (must be finite and > 0)`, { field: "sigma" });
  return new Array<number>(n).fill(sigma);
}

/** "0.02", "0.02 mJ/(mol*K)", "2e-5J/(mol*K)" → value and unit text (null: C's unit). */
export function parseSigmaFlag(text: string): { value: number; unit: string | null } {
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
  const value = m ? Number(m[1]) : NaN;
  if (!m || !Number.isFinite(value)) throw new InputError(`invalid --sigma: ${JSON.stringify(text)} (expected a number and an optional unit, e.g. "0.02 mJ/(mol*K)")`, { field: "sigma" });
  if (!(value > 0)) throw new InputError(`invalid --sigma: ${JSON.stringify(text)} (must be > 0)`, { field: "sigma" });
  return { value, unit: m[2] === "" ? null : m[2] };
}

function pickWeighting(args: ParsedArgs): "column" | "none" | "relative" | "absolute" | "auto" {
  const sigmaCol = getString(args, "sigma-col");
  const given: string[] = [];
  if (sigmaCol !== undefined) given.push(sigmaCol.toLowerCase() === "none" ? "--sigma-col none" : "--sigma-col");
  if (getBoolean(args, "unweighted")) given.push("--unweighted");
  if (args.flags["relative-sigma"] !== undefined) given.push("--relative-sigma");
  if (getString(args, "sigma") !== undefined) given.push("--sigma");
  const distinct = new Set(given.map((g) => (g === "--sigma-col none" ? "--unweighted" : g)));
  if (distinct.size > 1) throw new InputError(`choose one weighting: ${given.join(" and ")} contradict each other`, { field: given[1].slice(2).split(" ")[0] });
  if (given.length === 0) return "auto";
  const g = [...distinct][0];
  return g === "--sigma-col" ? "column" : g === "--unweighted" ? "none" : g === "--relative-sigma" ? "relative" : "absolute";
}

/** Molar mass [g/mol] and r from --formula / --molar-mass; null when neither is given. */
function molarMass(args: ParsedArgs): { molarMassGPerMol: number; formula: string | null; atoms: number | null; warnings: string[] } | null {
  const formula = getString(args, "formula");
  const m = args.flags["molar-mass"] as number | undefined;
  if (formula !== undefined && m !== undefined) throw new InputError("give either --formula or --molar-mass, not both", { field: "molar-mass" });
  if (m !== undefined) {
    if (!(m > 0)) throw new InputError(`invalid --molar-mass: ${m} (g/mol, must be > 0)`, { field: "molar-mass" });
    return { molarMassGPerMol: m, formula: null, atoms: null, warnings: [] };
  }
  if (formula === undefined) return null;
  let parsed;
  try {
    parsed = parseFormula(formula);
  } catch (e) {
    if (e instanceof InputError) throw new InputError(`invalid --formula ${JSON.stringify(formula)}: ${e.baseMessage}`, { field: "formula" });
    throw e;
  }
  return { molarMassGPerMol: parsed.molarMassGPerMol, formula: parsed.formula, atoms: parsed.atomsPerFormulaUnit, warnings: [...parsed.warnings] };
}

/**
 * Read FILE (positional 0) as C(T) per mole formula unit in SI, with σ as the flags say.
 * Rows stay in file order. Throws InputError (exit 2) for anything unusable.
 */
export function loadHeatCapacity(args: ParsedArgs, io: CliIo): LoadedHeatCapacity {
  const path = args.positionals[0];
  const table = readTable(path, io);
  const roles = guessColumnRoles(table.columns);
  const notes: string[] = [];
  const weighting = pickWeighting(args);
  const tGiven = getString(args, "t-col");
  const cGiven = getString(args, "c-col");
  const t = tGiven !== undefined ? findColumn(table, tGiven, "t-col") : roles.temperature?.index;
  const c = cGiven !== undefined ? findColumn(table, cGiven, "c-col") : roles.heatCapacity?.index;
  if (t === undefined || c === undefined) throw new InputError("cannot tell which columns hold T and C: name them with --t-col and --c-col", { file: path });
  if (t === c) throw new InputError(`T and C are the same column ${JSON.stringify(table.columns[t].name)}`, { file: path, field: cGiven !== undefined ? "c-col" : "t-col" });
  let s: number | undefined;
  if (weighting === "column") {
    s = findColumn(table, getString(args, "sigma-col")!, "sigma-col");
    if (s === t || s === c) throw new InputError(`--sigma-col ${JSON.stringify(getString(args, "sigma-col"))} is the ${s === t ? "T" : "C"} column`, { file: path, field: "sigma-col" });
  } else {
    const guess = roles.sigma?.index;
    const usable = guess !== undefined && guess !== t && guess !== c;
    if (weighting === "auto" && cGiven === undefined && usable) s = guess;
    else if (usable && weighting === "auto") notes.push(`column ${JSON.stringify(table.columns[guess].name)} looks like σ of C but is not used (--c-col was given): name it with --sigma-col to weight the fit`);
  }
  const points = extractPoints(table, { temperature: t, heatCapacity: c, ...(s !== undefined ? { sigma: s } : {}) });
  const cUnitFlag = getString(args, "c-unit");
  const cUnit = cUnitFlag ?? table.columns[c].unitText ?? "J/(mol*K)";
  const where = { file: path, field: cUnitFlag !== undefined ? "c-unit" : table.columns[c].name };
  const basis = heatCapacityBasis(cUnit, where);
  const mm = molarMass(args);
  if (basis === "sample") throw new InputError(`heat capacity in ${JSON.stringify(cUnit)} is per sample (J/K), not per mole or per gram: normalise to J/(mol*K) first (the notebook does it from the sample mass)`, where);
  if (basis === "specific" && !mm) throw new InputError(`heat capacity in ${JSON.stringify(cUnit)} is per mass: give --formula F or --molar-mass G_PER_MOL to convert it to per mole`, where);
  if (basis === "molar" && mm && mm.formula === null) throw new InputError(`--molar-mass applies to per-gram data only; ${JSON.stringify(cUnit)} is already per mole`, { field: "molar-mass" });
  if (mm) notes.push(...mm.warnings);
  const tUnit = table.columns[t].unitText ?? "K";
  const temperatureK = toSI(points.temperature, tUnit, "temperature", { file: path, field: table.columns[t].name });
  let heatCapacity = toSI(points.heatCapacity, cUnit, "heatCapacity", where);
  let sigma: number[] | undefined = points.sigma ? toSI(points.sigma, cUnit, "heatCapacity", where) : undefined;
  let w: Weighting;
  if (weighting === "relative") {
    const percent = args.flags["relative-sigma"] as number;
    sigma = relativeSigma(heatCapacity, percent, { file: path, lineNumbers: points.lineNumbers });
    w = { kind: "relative", percent };
  } else if (weighting === "absolute") {
    const { value, unit } = parseSigmaFlag(getString(args, "sigma")!);
    const sigmaUnit = unit ?? cUnit;
    const at = { field: "sigma" };
    if (heatCapacityBasis(sigmaUnit, at) !== basis) throw new InputError(`--sigma in ${JSON.stringify(sigmaUnit)} is not on the basis of C (${JSON.stringify(cUnit)})`, at);
    sigma = absoluteSigma(heatCapacity.length, value * siFactor(sigmaUnit, "heatCapacity", at));
    w = { kind: "absolute", value, unit: sigmaUnit };
  } else if (s !== undefined) {
    w = { kind: "column", column: table.columns[s].name };
  } else {
    w = { kind: "none", why: weighting === "none" ? (getBoolean(args, "unweighted") ? "--unweighted" : "--sigma-col none") : "no σ column" };
  }
  if (basis === "specific" && mm) {
    const molar = specificToMolar({ temperatureK, heatCapacityJPerKgK: heatCapacity, ...(sigma ? { sigma } : {}) }, { molarMassGPerMol: mm.molarMassGPerMol, per: "formula-unit" });
    heatCapacity = molar.heatCapacityJPerMolK;
    sigma = molar.sigma;
  }
  return {
    file: path,
    temperatureK,
    heatCapacity,
    ...(sigma ? { sigma } : {}),
    lineNumbers: points.lineNumbers,
    columns: { T: table.columns[t].name, C: table.columns[c].name, sigma: s !== undefined ? table.columns[s].name : null, cUnit },
    weighting: w,
    basis: { given: basis, molarMassGPerMol: mm?.molarMassGPerMol ?? null, formula: mm?.formula ?? null },
    atomsPerFormulaUnit: mm?.atoms ?? null,
    notes,
  };
}

/**
 * The rows sorted by increasing T (the integrals and the transition need that). Throws
 * InputError naming both lines when two rows share a temperature.
 */
export function sortedByTemperature(data: LoadedHeatCapacity): { temperatureK: number[]; heatCapacity: number[]; sigma?: number[]; lineNumbers: number[] } {
  const order = data.temperatureK.map((_, i) => i).sort((a, b) => data.temperatureK[a] - data.temperatureK[b] || a - b);
  for (let k = 1; k < order.length; k++) {
    const [a, b] = [order[k - 1], order[k]];
    if (data.temperatureK[a] === data.temperatureK[b]) {
      throw new InputError(`two rows at T = ${data.temperatureK[a]} K (lines ${data.lineNumbers[a]} and ${data.lineNumbers[b]}): average or remove one`, { file: data.file, line: data.lineNumbers[b] });
    }
  }
  const pick = (v: readonly number[]) => order.map((i) => v[i]);
  return { temperatureK: pick(data.temperatureK), heatCapacity: pick(data.heatCapacity), ...(data.sigma ? { sigma: pick(data.sigma) } : {}), lineNumbers: pick(data.lineNumbers) };
}
