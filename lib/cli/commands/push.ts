/**
 * `heatbook push FILE --sample ID`: upload a measurement file to the sample through the JSON API
 * (POST /api/v1/samples/{id}/measurements, raw body + query), using HEATBOOK_URL and HEATBOOK_TOKEN.
 * Columns by header name or 1-based number (as in `fit`; sent to the API 0-based); omitted ones
 * (and the unit) are taken from the header on the server. Also holds the small API client the
 * pull command shares.
 * Exit 0 stored, 2 bad usage or input (including the server's 422, whose field is named), 1 other.
 */
import { basename } from "node:path";
import type { CliIo } from "../io";
import { formatFlagHelp, getBoolean, getNumber, getString, parseArgs, type FlagSpec } from "../args";
import { InputError } from "../../engine/errors";

type Fetch = typeof globalThis.fetch;
let fetchImpl: Fetch = (...a) => globalThis.fetch(...a);

/** Replace the fetch the API commands use (tests); returns the previous one. */
export function setFetch(f: Fetch): Fetch {
  const prev = fetchImpl;
  fetchImpl = f;
  return prev;
}

/** An API answer that was not 2xx: its status and the server's `{error, field}`. */
export class ApiFailure extends Error {
  constructor(readonly status: number, message: string, readonly field?: string) {
    super(message);
  }
}

/** GET/POST against HEATBOOK_URL/api/v1 with the bearer token; throws InputError when either is unset. */
export async function apiRequest(io: CliIo, path: string, init: { method?: string; body?: BodyInit; contentType?: string; accept?: string } = {}): Promise<Response> {
  const base = io.env.HEATBOOK_URL?.replace(/\/+$/, "");
  const token = io.env.HEATBOOK_TOKEN;
  if (!base) throw new InputError("set HEATBOOK_URL to the server, e.g. http://localhost:3000", { field: "HEATBOOK_URL" });
  if (!token) throw new InputError("set HEATBOOK_TOKEN to an API token (Settings → API tokens)", { field: "HEATBOOK_TOKEN" });
  const headers: Record<string, string> = { authorization: `Bearer ${token}`, accept: init.accept ?? "application/json" };
  if (init.contentType) headers["content-type"] = init.contentType;
  const res = await fetchImpl(`${base}/api/v1${path}`, { method: init.method ?? "GET", headers, ...(init.body !== undefined ? { body: init.body } : {}) });
  if (!res.ok) {
    let body: { error?: string; field?: string } = {};
    try { body = (await res.json()) as typeof body; } catch { /* not JSON */ }
    throw new ApiFailure(res.status, body.error ?? `HTTP ${res.status}`, body.field);
  }
  return res;
}

/** Report an error of an API command and return its exit code. */
export function reportApiFailure(io: CliIo, command: string, usage: string, e: unknown): number {
  if (e instanceof InputError) {
    io.err(`heatbook ${command}: ${e.message}\n${usage}`);
    return 2;
  }
  if (e instanceof ApiFailure) {
    const hint = e.status === 401 ? " (check HEATBOOK_TOKEN)" : e.status === 429 ? " (rate limited; wait and retry)" : "";
    io.err(`heatbook ${command}: server answered ${e.status}: ${e.message}${e.field ? ` [field ${e.field}]` : ""}${hint}`);
    return e.status === 422 || e.status === 400 ? 2 : 1;
  }
  io.err(`heatbook ${command}: ${(e as Error).message}`);
  return 1;
}

const FLAGS: Record<string, FlagSpec> = {
  sample: { kind: "string", meta: "ID", help: "sample id (required)" },
  unit: { kind: "string", meta: "U", help: "heat-capacity unit, e.g. µJ/K or mJ/(mol K) (default: from the header)" },
  "t-unit": { kind: "string", meta: "U", help: "temperature unit (default: from the header, else K)" },
  "t-col": { kind: "string", meta: "NAME|N", help: "temperature column: header name or 1-based number (as in fit)" },
  "c-col": { kind: "string", meta: "NAME|N", help: "heat-capacity column: header name or 1-based number" },
  "sigma-col": { kind: "string", meta: "NAME|N", help: "standard-error column of C: header name or 1-based number" },
  kind: { kind: "string", meta: "sample|addenda", help: "what was measured (default sample)" },
  label: { kind: "string", meta: "L", help: "label (default: the file name)" },
  field: { kind: "number", meta: "TESLA", help: "applied field μ0H [T] (default 0)" },
  delimiter: { kind: "string", meta: ",|;|tab|whitespace|auto", help: "cell delimiter (default auto)" },
  json: { kind: "boolean", help: "print the stored measurement as JSON" },
  help: { kind: "boolean", help: "show this help" },
};

const USAGE = `usage: heatbook push FILE --sample ID [options]   (uses HEATBOOK_URL, HEATBOOK_TOKEN)\n\n${formatFlagHelp(FLAGS)}`;

/**
 * A column flag as the upload API wants it: the CLI counts columns from 1 (as `fit` and
 * `regress` do), the API's tCol/cCol/sigmaCol from 0; a header name passes through.
 */
export function apiColumn(spec: string, flag: string): string {
  if (!/^\s*\d+\s*$/.test(spec)) return spec;
  const n = Number(spec);
  if (n < 1) throw new InputError(`--${flag} ${spec}: columns are counted from 1`, { field: flag });
  return String(n - 1);
}

function query(file: string, args: ReturnType<typeof parseArgs>): string {
  const kind = getString(args, "kind") ?? "sample";
  if (kind !== "sample" && kind !== "addenda") throw new InputError(`invalid --kind: ${JSON.stringify(kind)} (sample or addenda)`, { field: "kind" });
  const q = new URLSearchParams({ fileName: basename(file), kind, label: getString(args, "label") ?? basename(file) });
  const map: Record<string, string> = { unit: "unit", "t-unit": "tUnit", "t-col": "tCol", "c-col": "cCol", "sigma-col": "sigmaCol", delimiter: "delimiter" };
  for (const [flag, param] of Object.entries(map)) {
    const v = getString(args, flag);
    if (v !== undefined) q.set(param, flag.endsWith("-col") ? apiColumn(v, flag) : v);
  }
  const field = getNumber(args, "field");
  if (field !== undefined) q.set("fieldT", String(field));
  return q.toString();
}

/** Run the command; see the module comment for exit codes. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  try {
    const args = parseArgs(argv, FLAGS);
    if (getBoolean(args, "help")) {
      io.out(USAGE);
      return 0;
    }
    if (args.positionals.length !== 1) throw new InputError("give exactly one FILE to push");
    const sample = getString(args, "sample");
    if (!sample) throw new InputError("missing --sample", { field: "sample" });
    const file = args.positionals[0]!;
    const bytes = io.readFile(file);
    const res = await apiRequest(io, `/samples/${encodeURIComponent(sample)}/measurements?${query(file, args)}`, { method: "POST", body: new Uint8Array(bytes), contentType: "text/plain" });
    const { measurement: m } = (await res.json()) as { measurement: { id: string; pointCount: number; tMinK: number; tMaxK: number; sha256: string; basis: string } };
    io.out(getBoolean(args, "json") ? JSON.stringify(m, null, 2) : `stored measurement ${m.id}: ${m.pointCount} points, ${m.tMinK}–${m.tMaxK} K, basis ${m.basis}, sha256 ${m.sha256}`);
    return 0;
  } catch (e) {
    return reportApiFailure(io, "push", USAGE, e);
  }
}
