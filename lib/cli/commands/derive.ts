/**
 * `heatbook derive`: Θ_D, D(E_F), the free-electron comparison, λ and McMillan T_c, Wilson and
 * Kadowaki–Woods ratios from γ and β given on the command line. γ in mJ mol⁻¹ K⁻², β in
 * mJ mol⁻¹ K⁻⁴, per mole formula unit; a value may carry its standard error as V±S or V+-S.
 * Exit 0 success, 2 bad usage or input (the message names the flag), 1 anything else.
 */
import type { CliIo } from "../io";
import { formatFlagHelp, getAssignments, getBoolean, getNumber, getString, parseArgs, parseMeasured, type FlagSpec, type ParsedArgs } from "../args";
import { InputError } from "../../engine/errors";
import { parseFormula, electronsPerFormulaUnit } from "../../engine/chemistry";
import { deriveAll, type DeriveInput, type Measured, type LatticeSpec, type MolarSusceptibilityUnit } from "../../engine/derived";
import { formatUncertainty } from "../../engine/units";
import { prettyUnit } from "../format";

const FLAGS: Record<string, FlagSpec> = {
  gamma: { kind: "string", meta: "V[±S]", help: "Sommerfeld γ [mJ mol^-1 K^-2] per mole formula unit (required)" },
  beta: { kind: "string", meta: "V[±S]", help: "lattice β [mJ mol^-1 K^-4] per mole formula unit (required)" },
  formula: { kind: "string", meta: "F", help: "chemical formula, e.g. Cu or Nb0.75Mo0.25 (required)" },
  corr: { kind: "number", meta: "RHO", help: "correlation of γ and β from the fit (default 0)" },
  density: { kind: "number", meta: "G_PER_CM3", help: "mass density [g/cm^3] for the free-electron comparison" },
  structure: { kind: "string", meta: "sc|bcc|fcc|hcp", help: "lattice type (with --a) for the free-electron comparison" },
  a: { kind: "number", meta: "ANGSTROM", help: "conventional-cell edge a [Å]" },
  "c-over-a": { kind: "number", meta: "C/A", help: "c/a for hcp" },
  valence: { kind: "assignments", meta: "El=z,...", help: "conduction electrons per atom, overriding the defaults" },
  per: { kind: "string", meta: "atom|formula-unit", help: "display basis (default formula-unit)" },
  "band-gamma": { kind: "string", meta: "V[±S]", help: "band-structure γ [mJ mol^-1 K^-2] per f.u., for λ" },
  "mu-star": { kind: "number", meta: "V", help: "Coulomb pseudopotential μ* for McMillan (e.g. 0.13)" },
  tc: { kind: "number", meta: "K", help: "measured T_c [K], for λ from McMillan's formula" },
  chi: { kind: "string", meta: "V[±S]", help: "molar Pauli susceptibility per f.u., unit from --chi-unit" },
  "chi-unit": { kind: "string", meta: "emu/mol|m3/mol", help: "unit of --chi (default emu/mol)" },
  "kw-a": { kind: "string", meta: "V[±S]", help: "resistivity T² coefficient A [μΩ cm K^-2]" },
  json: { kind: "boolean", help: "print one JSON object" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = `usage: heatbook derive --gamma V[±S] --beta V[±S] --formula F [options]\n\n${formatFlagHelp(FLAGS)}`;

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    if (args.positionals.length) throw new InputError(`unexpected argument ${JSON.stringify(args.positionals[0])}`);
    const { input, formulaWarnings } = buildInput(args);
    const result = deriveAll(input);
    const warnings = [...formulaWarnings, ...result.warnings];
    if (getBoolean(args, "json")) io.out(JSON.stringify({ formula: input.formula, basis: result.basis, quantities: result.quantities, warnings }, null, 2));
    else io.out(table(input, result.basis, result.quantities, warnings));
    return 0;
  } catch (e) {
    if (e instanceof InputError) {
      io.err(`heatbook derive: ${e.message}\n${USAGE}`);
      return 2;
    }
    io.err(`heatbook derive: ${(e as Error).message}`);
    return 1;
  }
}

export { parseMeasured };

function required(args: ParsedArgs, flag: string): string {
  const v = getString(args, flag);
  if (v === undefined) throw new InputError(`missing --${flag}`, { field: flag });
  return v;
}

function optionalMeasured(args: ParsedArgs, flag: string, factor: number): Measured | undefined {
  const v = getString(args, flag);
  return v === undefined ? undefined : parseMeasured(v, flag, factor);
}

function buildInput(args: ParsedArgs): { input: DeriveInput; formulaWarnings: string[] } {
  const gamma = parseMeasured(required(args, "gamma"), "gamma", 1e-3);
  const beta = parseMeasured(required(args, "beta"), "beta", 1e-3);
  const parsed = parseFormula(required(args, "formula"));
  const valences = getAssignments(args, "valence") ?? {};
  for (const el of Object.keys(valences)) {
    if (!parsed.elements.some((e) => e.symbol === el)) throw new InputError(`invalid --valence: ${el} is not in the formula ${parsed.formula}`, { field: "valence" });
  }
  const per = getString(args, "per") ?? "formula-unit";
  if (per !== "atom" && per !== "formula-unit") throw new InputError(`invalid --per: ${JSON.stringify(per)} (expected atom or formula-unit)`, { field: "per" });
  const corr = getNumber(args, "corr");
  if (corr !== undefined && Math.abs(corr) > 1) throw new InputError(`invalid --corr: ${corr} (must be in [-1, 1])`, { field: "corr" });
  const chiUnit = getString(args, "chi-unit") ?? "emu/mol";
  if (chiUnit !== "emu/mol" && chiUnit !== "m3/mol") throw new InputError(`invalid --chi-unit: ${JSON.stringify(chiUnit)} (expected emu/mol or m3/mol)`, { field: "chi-unit" });
  const chi = optionalMeasured(args, "chi", 1);
  const input: DeriveInput = {
    gamma,
    beta,
    covGammaBeta: corr === undefined ? undefined : corr * (gamma.stdError ?? 0) * (beta.stdError ?? 0),
    formula: { atomsPerFormulaUnit: parsed.atomsPerFormulaUnit, molarMassGPerMol: parsed.molarMassGPerMol, electronsPerFormulaUnit: electronsPerFormulaUnit(parsed.elements, valences), label: parsed.formula },
    basis: per,
    free: { densityGPerCm3: getNumber(args, "density"), lattice: lattice(args) },
    gammaBand: optionalMeasured(args, "band-gamma", 1e-3),
    muStar: getNumber(args, "mu-star"),
    tcK: getNumber(args, "tc"),
    chi: chi && { ...chi, unit: chiUnit as MolarSusceptibilityUnit },
    kwA: optionalMeasured(args, "kw-a", 1),
  };
  return { input, formulaWarnings: parsed.warnings };
}

function lattice(args: ParsedArgs): LatticeSpec | undefined {
  const structure = getString(args, "structure");
  const a = getNumber(args, "a");
  if (structure === undefined && a === undefined) return undefined;
  if (structure === undefined) throw new InputError("missing --structure (needed with --a)", { field: "structure" });
  if (a === undefined) throw new InputError("missing --a (needed with --structure)", { field: "a" });
  if (!["sc", "bcc", "fcc", "hcp"].includes(structure)) throw new InputError(`invalid --structure: ${JSON.stringify(structure)} (expected sc, bcc, fcc or hcp)`, { field: "structure" });
  return { structure: structure as LatticeSpec["structure"], aAngstrom: a, cOverA: getNumber(args, "c-over-a") };
}

function table(input: DeriveInput, basis: string, quantities: ReturnType<typeof deriveAll>["quantities"], warnings: string[]): string {
  const f = input.formula;
  const head = `${f.label}: r = ${f.atomsPerFormulaUnit} atoms/f.u., M = ${f.molarMassGPerMol.toFixed(4)} g/mol, z = ${f.electronsPerFormulaUnit} e/f.u.; per ${basis === "atom" ? "mole of atoms" : "mole formula unit"}`;
  const rows = quantities.map((q) => {
    const shown = formatUncertainty(q.value, q.stdError, { plainDigits: 4 });
    return `  ${q.symbol.padEnd(22)} ${shown.padStart(16)}  ${prettyUnit(q.unit)}`.trimEnd();
  });
  const warn = warnings.map((w) => `warning: ${w}`);
  return [head, ...rows, ...warn].join("\n");
}
