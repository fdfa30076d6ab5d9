/**
 * `heatbook pull series ID [--csv]` and `heatbook pull analysis ID --json`: read a series view or
 * an analysis from the JSON API (HEATBOOK_URL, HEATBOOK_TOKEN). CSV comes from the server's safe
 * writer unchanged; the plain series output is a table of γ and Θ_D with σ and the status.
 * Exit 0 success, 2 bad usage or input, 1 other (including 401/403/404 from the server).
 */
import { writeFileSync } from "node:fs";
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getString, parseArgs, type FlagSpec } from "../args";
import { InputError } from "../../engine/errors";
import { formatUncertainty } from "../../engine/units";
import { apiRequest, reportApiFailure } from "./push";

const FLAGS: Record<string, FlagSpec> = {
  csv: { kind: "boolean", help: "series: CSV (units in the header, every value with σ)" },
  json: { kind: "boolean", help: "print the server's JSON" },
  drafts: { kind: "boolean", help: "series: include unsealed revisions (marked draft)" },
  axis: { kind: "string", meta: "x|ea", help: "series: composition axis (default x)" },
  revision: { kind: "string", meta: "N", help: "analysis: only revision N" },
  out: { kind: "string", meta: "FILE", help: "write to FILE instead of standard output" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = `usage: heatbook pull series ID [--csv] [--drafts] [--axis x|ea]\n       heatbook pull analysis ID --json [--revision N]\n(uses HEATBOOK_URL, HEATBOOK_TOKEN)\n\n${formatFlagHelp(FLAGS)}`;

type V = { value: number; stdError: number | null } | null;
interface Row {
  sample: { label: string }; axisValue: number | null; gamma: V; thetaD: V; draft: boolean; revision: { revisionNumber: number; state: string } | null;
  context?: { source: string; changedSinceSealing: string[]; note: string | null };
}

const show = (v: V) => (v ? formatUncertainty(v.value, v.stdError) : "—");

/** The plain table; sealed rows show the sealed context, and a footnote names what changed in the sample record since. */
function seriesTable(view: { series: { name: string }; axisLabel: string; rows: Row[] }): string {
  const head = `${view.series.name}: γ [mJ mol^-1 K^-2 per f.u.], Θ_D [K] against ${view.axisLabel} (sealed rows: values and sample context as sealed)`;
  const notes: string[] = [];
  const lines = view.rows.map((r) => {
    const changed = r.context?.changedSinceSealing ?? [];
    const mark = changed.length || r.context?.note ? ` [${notes.length + 1}]` : "";
    if (mark) notes.push(`[${notes.length + 1}] ${r.sample.label}: ${[changed.length ? `sample record changed since sealing: ${changed.join("; ")}` : null, r.context?.note ?? null].filter(Boolean).join("; ")}`);
    return [r.sample.label.padEnd(20), String(r.axisValue ?? "—").padEnd(8), show(r.gamma).padEnd(18), show(r.thetaD).padEnd(14), (r.revision ? `${r.draft ? "DRAFT " : ""}rev ${r.revision.revisionNumber} ${r.revision.state}` : "no analysis") + mark].join(" ");
  });
  return [head, ...lines, ...notes].join("\n");
}

function emit(io: CliIo, text: string, out: string | undefined): void {
  if (out) writeFileSync(out, text);
  else io.out(text);
}

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    const [what, id, ...rest] = args.positionals;
    if (rest.length || !id) throw new InputError("expected: pull series ID | pull analysis ID");
    const out = getString(args, "out");
    if (what === "series") {
      const q = new URLSearchParams({ axis: getString(args, "axis") ?? "x", ...(getBoolean(args, "drafts") ? { include: "drafts" } : {}), ...(getBoolean(args, "csv") ? { format: "csv" } : {}) });
      const res = await apiRequest(io, `/series/${encodeURIComponent(id)}?${q}`, getBoolean(args, "csv") ? { accept: "text/csv" } : {});
      if (getBoolean(args, "csv")) emit(io, await res.text(), out);
      else { const view = await res.json(); emit(io, getBoolean(args, "json") ? JSON.stringify(view, null, 2) : seriesTable(view), out); }
      return 0;
    }
    if (what === "analysis") {
      if (!getBoolean(args, "json")) throw new InputError("pull analysis prints JSON: add --json", { field: "json" });
      const rev = getString(args, "revision");
      const res = await apiRequest(io, `/analyses/${encodeURIComponent(id)}${rev ? `?revision=${encodeURIComponent(rev)}` : ""}`);
      emit(io, JSON.stringify(await res.json(), null, 2), out);
      return 0;
    }
    throw new InputError(`unknown kind ${JSON.stringify(what)}: pull series or pull analysis`);
  } catch (e) {
    return reportApiFailure(io, "pull", USAGE, e);
  }
}
