import { describe, it, expect, beforeAll, afterAll, afterEach } from "vitest";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";
import { setFetch } from "../../lib/cli/commands/push";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "../server/fixtures";
import { makeAnalysis } from "../server/apiFixtures";
import { createSample } from "../../lib/server/samples";
import { createToken } from "../../lib/server/tokens";
import { createSeries } from "../../lib/server/series";
import { setApiLimiter, PgTokenBucketLimiter } from "../../lib/server/api";
import * as sampleMeasurements from "../../app/api/v1/samples/[id]/measurements/route";
import * as seriesOne from "../../app/api/v1/series/[id]/route";
import * as analysisOne from "../../app/api/v1/analyses/[id]/route";
import * as measurementOne from "../../app/api/v1/measurements/[id]/route";

const FILE = "# invented demo data\nTemp (K)\tHC (µJ/K)\tHC Err (µJ/K)\n2.0\t1.5\t0.01\n3.0\t3.75\t0.02\n";

function io(env: Record<string, string | undefined>, files: Record<string, string> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const cli: CliIo = { out: (t) => out.push(t), err: (t) => err.push(t), readFile: (p) => { if (!(p in files)) throw new Error(`no such file ${p}`); return new TextEncoder().encode(files[p]); }, env };
  return { cli, out, err };
}

const ENV = { HEATBOOK_URL: "http://heatbook.test/", HEATBOOK_TOKEN: "hb_abcdef_" + "x".repeat(43) };
let restore: typeof fetch | undefined;
afterEach(() => { if (restore) setFetch(restore); restore = undefined; });

describe("heatbook push (injected fetch)", () => {
  it("heatbook push sends the raw file with the bearer token and the column options as query", async () => {
    const seen: { url: string; init: RequestInit }[] = [];
    restore = setFetch(async (url, init) => {
      seen.push({ url: String(url), init: init! });
      return Response.json({ measurement: { id: "m1", pointCount: 2, tMinK: 2, tMaxK: 3, sha256: "ab", basis: "sample" } }, { status: 201 });
    });
    const { cli, out } = io(ENV, { "data/run1.txt": FILE });
    expect(await main(["push", "data/run1.txt", "--sample", "S1", "--unit", "µJ/K", "--t-col", "1", "--c-col", "C", "--sigma-col", "3", "--kind", "addenda"], cli)).toBe(0);
    const u = new URL(seen[0]!.url);
    expect(u.origin + u.pathname).toBe("http://heatbook.test/api/v1/samples/S1/measurements");
    expect(Object.fromEntries(u.searchParams)).toEqual({ fileName: "run1.txt", kind: "addenda", label: "run1.txt", unit: "µJ/K", tCol: "0", cCol: "C", sigmaCol: "2" });
    expect((seen[0]!.init.headers as Record<string, string>).authorization).toBe(`Bearer ${ENV.HEATBOOK_TOKEN}`);
    expect(new TextDecoder().decode(seen[0]!.init.body as Uint8Array)).toBe(FILE);
    expect(out[0]).toMatch(/stored measurement m1: 2 points/);
  });
  it("heatbook push counts columns from 1 like fit: --t-col 0 is refused before anything is sent", async () => {
    let sent = 0;
    restore = setFetch(async () => (sent++, Response.json({}, { status: 500 })));
    const { cli, err } = io(ENV, { f: FILE });
    expect(await main(["push", "f", "--sample", "S", "--t-col", "0"], cli)).toBe(2);
    expect(err[0]).toMatch(/--t-col 0: columns are counted from 1/);
    expect(sent).toBe(0);
  });
  it("heatbook push without HEATBOOK_TOKEN exits 2 naming the variable", async () => {
    const { cli, err } = io({ HEATBOOK_URL: "http://x" }, { f: FILE });
    expect(await main(["push", "f", "--sample", "S"], cli)).toBe(2);
    expect(err[0]).toMatch(/HEATBOOK_TOKEN/);
  });
  it("heatbook push exits 2 on the server's 422 (naming the field) and 1 on 401", async () => {
    restore = setFetch(async () => Response.json({ error: "no column named \"Tx\"", field: "tCol" }, { status: 422 }));
    const a = io(ENV, { f: FILE });
    expect(await main(["push", "f", "--sample", "S", "--t-col", "Tx"], a.cli)).toBe(2);
    expect(a.err[0]).toMatch(/422.*field tCol/);
    setFetch(async () => Response.json({ error: "invalid API token" }, { status: 401 }));
    const b = io(ENV, { f: FILE });
    expect(await main(["push", "f", "--sample", "S"], b.cli)).toBe(1);
    expect(b.err[0]).toMatch(/check HEATBOOK_TOKEN/);
  });
});

describe("heatbook push and pull against the v1 route handlers (integration)", () => {
  let t: TestDatabase;
  let A: GroupFixture;
  let token: string;
  beforeAll(async () => {
    t = await freshDatabase();
    process.env.DATABASE_URL = t.url;
    setApiLimiter(new PgTokenBucketLimiter(t.db, { capacity: 1000, refillPerSecond: 1000 }));
    A = await makeGroup(t.db, "CLI group");
    token = (await createToken(t.db, A.members.analyst, { name: "cli", scope: "read_write" })).token;
  });
  afterAll(() => t.drop());

  /** fetch → the route module that Next would pick for the path. */
  function dispatch(): typeof fetch {
    const table: [RegExp, Record<string, unknown>][] = [
      [/^\/api\/v1\/samples\/([^/]+)\/measurements$/, sampleMeasurements], [/^\/api\/v1\/series\/([^/]+)$/, seriesOne],
      [/^\/api\/v1\/analyses\/([^/]+)$/, analysisOne], [/^\/api\/v1\/measurements\/([^/]+)$/, measurementOne],
    ];
    return async (url, init) => {
      const req = new Request(String(url), init);
      const path = new URL(req.url).pathname;
      for (const [re, mod] of table) {
        const m = re.exec(path);
        const h = mod[req.method] as ((r: Request, c: object) => Promise<Response>) | undefined;
        if (m && h) return h(req, { params: Promise.resolve({ id: decodeURIComponent(m[1]!) }) });
      }
      return Response.json({ error: "no route" }, { status: 404 });
    };
  }

  it("push stores the file through POST /samples/{id}/measurements and the points read back exactly", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "Nb", formula: "Nb" });
    restore = setFetch(dispatch());
    const { cli, out } = io({ HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token }, { "nb.tsv": FILE });
    expect(await main(["push", "nb.tsv", "--sample", s.id, "--json"], cli)).toBe(0);
    const m = JSON.parse(out[0]!);
    expect(m.pointCount).toBe(2);
    expect(m.columnMapping).toEqual({ temperature: 0, heatCapacity: 1, sigma: 2 });
    const stored = await t.db.storedFile.findFirstOrThrow({ where: { measurements: { some: { id: m.id } } } });
    expect(new TextDecoder().decode(stored.bytes)).toBe(FILE);
  });
  it("pull series --csv and pull analysis --json round-trip a sealed result", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "=cmd|x", formula: "Nb", compositionValue: 0.25 });
    const a = await makeAnalysis(t.db, A.members.analyst, { sampleId: s.id, gamma: [7.8, 0.05], beta: [0.12, 0.002], state: "sealed" });
    const series = await createSeries(t.db, A.members.analyst, { name: "cli series", sampleIds: [s.id] });
    restore = setFetch(dispatch());
    const env = { HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token };
    const csv = io(env);
    expect(await main(["pull", "series", series.id, "--csv"], csv.cli)).toBe(0);
    const lines = csv.out[0]!.trimEnd().split("\r\n");
    expect(lines[1]!.startsWith("'=cmd|x,Nb,0.25,1,7.8,0.05,")).toBe(true);
    const table = io(env);
    expect(await main(["pull", "series", series.id], table.cli)).toBe(0);
    expect(table.out[0]).toMatch(/rev 1 sealed/);
    const js = io(env);
    expect(await main(["pull", "analysis", a.analysisId, "--json"], js.cli)).toBe(0);
    expect(JSON.parse(js.out[0]!).revisions[0].contentHash).toBe(a.contentHash);
    const missing = io(env);
    expect(await main(["pull", "analysis", "00000000-0000-0000-0000-000000000000", "--json"], missing.cli)).toBe(1);
    expect(missing.err[0]).toMatch(/404/);
  });
});
