/**
 * A small shared flag parser for the `heatbook` subcommands.
 *
 * Accepts `--name value`, `--name=value` and boolean `--name`; everything else is a
 * positional argument (a lone `--` ends flag parsing). Unknown flags, a missing value,
 * a repeated flag or a number that does not parse throw InputError naming the flag,
 * which commands report with exit code 2.
 */
import { InputError } from "../engine/errors";

export type FlagKind = "string" | "number" | "boolean" | "list" | "assignments";

export interface FlagSpec {
  readonly kind: FlagKind;
  /** One line of help text. */
  readonly help: string;
  /** Placeholder shown in help, e.g. "K" or "NAME". */
  readonly meta?: string;
}

export type FlagValue = string | number | boolean | number[] | Record<string, number>;

export interface ParsedArgs {
  readonly positionals: string[];
  readonly flags: Readonly<Record<string, FlagValue | undefined>>;
}

function parseNumber(flag: string, text: string): number {
  const v = text.trim() === "" ? NaN : Number(text);
  if (!Number.isFinite(v)) throw new InputError(`invalid --${flag}: ${JSON.stringify(text)} (not a finite number)`, { field: flag });
  return v;
}

/** `--T 5,10,20` → [5, 10, 20]. */
function parseList(flag: string, text: string): number[] {
  return text.split(",").map((part) => parseNumber(flag, part));
}

/** `--set thetaD=300,r=2` → { thetaD: 300, r: 2 }. */
function parseAssignments(flag: string, text: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const part of text.split(",")) {
    const eq = part.indexOf("=");
    const name = part.slice(0, eq).trim();
    // name, or name#k for one measurement of a joint fit
    if (eq <= 0 || !/^[A-Za-z_][A-Za-z0-9_]*(#[1-9][0-9]*)?$/.test(name)) {
      throw new InputError(`invalid --${flag}: ${JSON.stringify(part)} (expected name=value)`, { field: flag });
    }
    if (name in out) throw new InputError(`invalid --${flag}: ${name} given twice`, { field: flag });
    out[name] = parseNumber(flag, part.slice(eq + 1));
  }
  return out;
}

function convert(flag: string, kind: FlagKind, text: string): FlagValue {
  switch (kind) {
    case "number":
      return parseNumber(flag, text);
    case "list":
      return parseList(flag, text);
    case "assignments":
      return parseAssignments(flag, text);
    default:
      return text;
  }
}

/**
 * Parse argv against a flag table. Returns positionals in order and flag values
 * converted to their kind. Throws InputError for unknown/repeated flags or bad values.
 */
export function parseArgs(argv: readonly string[], spec: Readonly<Record<string, FlagSpec>>): ParsedArgs {
  const positionals: string[] = [];
  const flags: Record<string, FlagValue | undefined> = {};
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === "--") {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (!arg.startsWith("--") || arg.length === 2) {
      positionals.push(arg);
      continue;
    }
    const eq = arg.indexOf("=");
    const name = eq > 0 ? arg.slice(2, eq) : arg.slice(2);
    const def = spec[name];
    if (!def) throw new InputError(`unknown option --${name}`, { field: name });
    if (name in flags) throw new InputError(`option --${name} given twice`, { field: name });
    if (def.kind === "boolean") {
      if (eq > 0) throw new InputError(`option --${name} takes no value`, { field: name });
      flags[name] = true;
      continue;
    }
    const text: string | undefined = eq > 0 ? arg.slice(eq + 1) : argv[i + 1];
    if (eq < 0) i++;
    if (text === undefined) throw new InputError(`option --${name} needs a value`, { field: name });
    flags[name] = convert(name, def.kind, text);
  }
  return { positionals, flags };
}

/** Help text for a flag table, one flag per line. */
export function formatFlagHelp(spec: Readonly<Record<string, FlagSpec>>): string {
  const rows = Object.entries(spec).map(([name, def]) => {
    const left = `--${name}${def.kind === "boolean" ? "" : ` ${def.meta ?? def.kind.toUpperCase()}`}`;
    return `  ${left.padEnd(24)} ${def.help}`;
  });
  return rows.join("\n");
}

/** Typed getters: undefined when absent; throw if the stored kind differs (a programming error). */
export function getString(args: ParsedArgs, name: string): string | undefined {
  const v = args.flags[name];
  return typeof v === "string" ? v : undefined;
}
export function getNumber(args: ParsedArgs, name: string): number | undefined {
  const v = args.flags[name];
  return typeof v === "number" ? v : undefined;
}
export function getBoolean(args: ParsedArgs, name: string): boolean {
  return args.flags[name] === true;
}
export function getList(args: ParsedArgs, name: string): number[] | undefined {
  const v = args.flags[name];
  return Array.isArray(v) ? v : undefined;
}
export function getAssignments(args: ParsedArgs, name: string): Record<string, number> | undefined {
  const v = args.flags[name];
  return v && typeof v === "object" && !Array.isArray(v) ? v : undefined;
}

/**
 * The exit code for an error thrown by a command, after telling the user: bad usage or input
 * (InputError) → 2 with a pointer to `--help`; anything else → 1 with its message.
 */
export function reportFailure(command: string, e: unknown, err: (text: string) => void): number {
  if (e instanceof InputError) {
    err(`heatbook ${command}: ${e.message}\nrun 'heatbook ${command} --help' for the options`);
    return 2;
  }
  err(`heatbook ${command}: ${(e as Error).message}`);
  return 1;
}

/** "1.2±0.1", "1.2+-0.1", "1.2+/-0.1" or "1.2" → value and standard error in the flag's unit × factor. */
export function parseMeasured(text: string, flag: string, factor: number): { value: number; stdError: number | null } {
  const m = /^\s*([^±]+?)\s*(?:(?:±|\+-|\+\/-)\s*(.+?))?\s*$/.exec(text);
  const value = m ? Number(m[1]) : NaN;
  const sigma = m?.[2] === undefined ? null : Number(m[2]);
  if (!Number.isFinite(value) || (sigma !== null && !(Number.isFinite(sigma) && sigma >= 0))) {
    throw new InputError(`invalid --${flag}: ${JSON.stringify(text)} (expected V or V±S with S ≥ 0)`, { field: flag });
  }
  return { value: value * factor, stdError: sigma === null ? null : sigma * factor };
}
