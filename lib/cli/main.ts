/**
 * The `heatbook` command: dispatches to one module per subcommand.
 * Exit codes: 0 success, 1 a fit or computation failed (with the reason), 2 bad usage or input.
 */
import type { CliIo } from "./io";
import { defaultIo } from "./io";

type Command = (argv: string[], io: CliIo) => Promise<number>;

const COMMANDS: Record<string, () => Promise<{ run: Command }>> = {
  fit: () => import("./commands/fit"),
  regress: () => import("./commands/regress"),
  derive: () => import("./commands/derive"),
  transition: () => import("./commands/transition"),
  entropy: () => import("./commands/entropy"),
  model: () => import("./commands/model"),
  push: () => import("./commands/push"),
  pull: () => import("./commands/pull"),
  backup: () => import("./commands/backup"),
  audit: () => import("./commands/audit"),
};

const USAGE = `usage: heatbook <command> [options]

commands:
  fit FILE         fit a heat-capacity model to a delimited C(T) file
  regress FILE     weighted least squares of any expression y = f(x; parameters)
  derive           Θ_D, D(E_F), free-electron comparison from γ and β
  transition FILE  superconducting transition: T_c, ΔC/(γ_n T_c), entropy balance, residual γ
  entropy FILE     entropy S(T) and enthalpy H(T) − H(0), with the low-T extrapolation from a fit
  model NAME       evaluate a registered heat-capacity model
  push FILE        upload a measurement file to a sample (HEATBOOK_URL, HEATBOOK_TOKEN)
  pull             pull series ID [--csv] | pull analysis ID --json (HEATBOOK_URL, HEATBOOK_TOKEN)
  backup           backup export --group SLUG --out FILE | backup restore FILE (DATABASE_URL)
  audit verify     check the audit trail's hash chain and name the first broken row (DATABASE_URL)

Run 'heatbook <command> --help' for the options of one command.`;

export async function main(argv: string[], io: CliIo = defaultIo): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === "--help" || name === "-h") {
    io.out(USAGE);
    return name ? 0 : 2;
  }
  const load = COMMANDS[name];
  if (!load) {
    io.err(`heatbook: unknown command ${JSON.stringify(name)}\n${USAGE}`);
    return 2;
  }
  const mod = await load();
  return mod.run(rest, io);
}
