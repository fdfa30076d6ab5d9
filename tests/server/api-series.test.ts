import { describe, it, expect, beforeAll, afterAll, beforeEach } from "vitest";
import { expectClose } from "../helpers/expectClose";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { makeAnalysis } from "./apiFixtures";
import { call } from "./apiHelpers";
import { createSample } from "../../lib/server/samples";
import { createToken } from "../../lib/server/tokens";
import { setApiLimiter, PgTokenBucketLimiter } from "../../lib/server/api";
import { addSeriesMembers, createSeries, latexFormula, latexNumber, latexText, removeSeriesMember, seriesCsv, seriesLatex, seriesView, updateSeries } from "../../lib/server/series";
import { formatValue } from "../../lib/display";
import { fitTrend } from "../../lib/engine/series";
import { thetaDFromBeta } from "../../lib/engine/derived";
import { ForbiddenError, NotFoundError, ConflictError } from "../../lib/engine/errors";
import * as seriesRoute from "../../app/api/v1/series/[id]/route";
import * as seriesList from "../../app/api/v1/series/route";

let t: TestDatabase;
let A: GroupFixture;
let B: GroupFixture;
let seriesId: string;
const ids: string[] = [];
// Invented demo series Nb(1-x)Mo(x): γ falls with x (test data only).
const XS = [0, 0.1, 0.2, 0.3, 0.4];
const GAMMAS: [number, number][] = [[7.8, 0.05], [7.1, 0.06], [6.5, 0.05], [5.7, 0.08], [5.1, 0.06]];
const BETA: [number, number] = [0.12, 0.002];

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  A = await makeGroup(t.db, "Series group");
  B = await makeGroup(t.db, "Other group");
  for (const [i, x] of XS.entries()) {
    const formula = x === 0 ? "Nb" : `Nb${(1 - x).toFixed(1)}Mo${x.toFixed(1)}`;
    const s = await createSample(t.db, A.members.analyst, { label: `NbMo x=${x}`, formula, compositionVariable: "x", compositionValue: x, densityGPerCm3: 8.57 + 1.6 * x });
    ids.push(s.id);
    await makeAnalysis(t.db, A.members.analyst, { sampleId: s.id, gamma: GAMMAS[i]!, beta: BETA, molarMass: 92.9, state: i === 4 ? "open" : "sealed" });
  }
  seriesId = (await createSeries(t.db, A.members.analyst, { name: "NbMo", sampleIds: ids.slice(0, 3) })).id;
  await addSeriesMembers(t.db, A.members.analyst, seriesId, { sampleIds: ids.slice(3) });
});
afterAll(() => t.drop());
beforeEach(() => setApiLimiter(new PgTokenBucketLimiter(t.db, { capacity: 1000, refillPerSecond: 1000 })));

describe("series records", () => {
  it("createSeries refuses a viewer, a duplicate name and another group's sample", async () => {
    await expect(createSeries(t.db, A.members.viewer, { name: "v" })).rejects.toThrow(ForbiddenError);
    await expect(createSeries(t.db, A.members.analyst, { name: "NbMo" })).rejects.toThrow(ConflictError);
    const other = await createSample(t.db, B.members.owner, { label: "b", formula: "Ta" });
    await expect(createSeries(t.db, A.members.analyst, { name: "mixed", sampleIds: [other.id] })).rejects.toThrow(/not found in this group/);
  });
  it("updateSeries renames and removeSeriesMember drops a member", async () => {
    const s = await createSeries(t.db, A.members.analyst, { name: "temp", sampleIds: ids.slice(0, 2) });
    expect((await updateSeries(t.db, A.members.analyst, s.id, { name: "renamed", compositionVariable: "y" })).compositionVariable).toBe("y");
    expect((await removeSeriesMember(t.db, A.members.analyst, s.id, ids[0]!)).memberIds).toEqual([ids[1]]);
    await expect(removeSeriesMember(t.db, A.members.analyst, s.id, ids[0]!)).rejects.toThrow(NotFoundError);
  });
});

describe("seriesView", () => {
  it("seriesView takes γ from sealed revisions only and marks the sample without one", async () => {
    const v = await seriesView(t.db, A.members.viewer, seriesId);
    expect(v.rows.map((r) => r.x)).toEqual(XS);
    for (const [i, r] of v.rows.slice(0, 4).entries()) {
      expect(r.draft).toBe(false);
      expect(r.revision!.state).toBe("sealed");
      expect(r.revision!.contentHash).toMatch(/^[0-9a-f]{64}$/);
      expectClose(r.gamma!.value, GAMMAS[i]![0], { rel: 1e-12 });
      expectClose(r.gamma!.stdError!, GAMMAS[i]![1], { rel: 1e-12 });
      expectClose(r.thetaD!.value, thetaDFromBeta(BETA[0] / 1e3, 1), { rel: 1e-12 });
    }
    expect(v.rows[4]!.revision).toBeNull();
    expect(v.rows[4]!.gamma).toBeNull();
  });
  it("seriesView's γ trend equals fitTrend on the sealed rows (independent re-fit)", async () => {
    const v = await seriesView(t.db, A.members.viewer, seriesId);
    const direct = fitTrend(XS.slice(0, 4).map((x, i) => ({ x, y: GAMMAS[i]![0], sigma: GAMMAS[i]![1] })), { degree: 1 });
    expect(v.trends.gamma.linear!.parameters).toEqual(direct.parameters);
    expect(v.trends.gamma.quadratic!.n).toBe(4);
    expect(v.trends.tc.linear).toBeNull();
  });
  it("seriesView with includeDrafts adds the open revision as a draft row, kept out of the trend", async () => {
    const v = await seriesView(t.db, A.members.viewer, seriesId, { includeDrafts: true });
    const draft = v.rows.filter((r) => r.draft);
    expect(draft.length).toBe(1);
    expect(draft[0]!.revision!.state).toBe("open");
    expectClose(draft[0]!.gamma!.value, GAMMAS[4]![0], { rel: 1e-12 });
    expect(v.trends.gamma.linear!.n).toBe(4);
    expect((await seriesView(t.db, A.members.viewer, seriesId, { includeDrafts: true, trendFrom: "shown" })).trends.gamma.linear!.n).toBe(5);
  });
  it("seriesView on the e/a axis uses valence electrons per atom (Nb 1, Mo 1 free-electron: all 1)", async () => {
    const v = await seriesView(t.db, A.members.viewer, seriesId, { axis: "ea" });
    expect(v.rows.every((r) => r.electronsPerAtom === 1)).toBe(true);
    expect(v.trends.gamma.linear!.ok).toBe(false);
    expect(v.rows[0]!.gammaFree).toBeGreaterThan(0);
  });
  it("seriesView of another group's series throws NotFoundError", async () => {
    await expect(seriesView(t.db, B.members.owner, seriesId)).rejects.toThrow(NotFoundError);
  });
  it("seriesCsv writes every row with σ columns and units in the header", async () => {
    const csv = seriesCsv(await seriesView(t.db, A.members.viewer, seriesId));
    const lines = csv.trimEnd().split("\r\n");
    expect(lines.length).toBe(6);
    expect(lines[0]).toContain("γ (mJ mol⁻¹ K⁻²),σ(γ) (mJ mol⁻¹ K⁻²)");
    expect(lines[0]).toContain("ΘD (K)");
    expect(lines[0]).not.toMatch(/\^|gammaFree|thetaD/);
    expect(lines[1]!.split(",")[4]).toBe("7.8");
  });
  it("seriesLatex writes a tabular with value(σ) columns, typeset heads and escaped labels", async () => {
    const view = await seriesView(t.db, A.members.viewer, seriesId);
    const tex = seriesLatex(view);
    expect(tex).toMatch(/\\begin\{tabular\}\{ll r( r){6}\}/);
    expect(tex).toContain("$\\gamma$ (mJ\\,mol$^{-1}$\\,K$^{-2}$)");
    const body = tex.split("\n").filter((l) => l.endsWith("\\\\")).slice(1);
    expect(body).toHaveLength(view.rows.length);
    const g = view.rows.find((r) => r.gamma && r.gamma.stdError)!.gamma!;
    expect(tex).toContain(formatValue(g.value, g.stdError, 4));
    expect(body.every((l) => l.split(" & ").length === 9)).toBe(true);
  });
  it("latexText, latexFormula and latexNumber escape text and typeset formulas and powers of ten", () => {
    expect(latexText("A&B_1 50% #2 {x}")).toBe("A\\&B\\_1 50\\% \\#2 \\{x\\}");
    expect(latexFormula("Nb3Sn")).toBe("Nb$_{3}$Sn");
    expect(latexFormula("Cu0.9Ni0.1")).toBe("Cu$_{0.9}$Ni$_{0.1}$");
    expect(latexNumber("1.2345(56) × 10⁻⁵")).toBe("1.2345(56)$\\times 10^{-5}$");
    expect(latexNumber("−4.213(25)")).toBe("$-$4.213(25)");
  });
});

describe("v1 series routes", () => {
  it("GET /series and GET /series/{id} answer the view; format=csv answers text/csv", async () => {
    const { token } = await createToken(t.db, A.members.viewer, { name: "s", scope: "read" });
    const list = await call(seriesList.GET, "/series", { token });
    expect(list.body.series.map((s: { id: string }) => s.id)).toContain(seriesId);
    const r = await call(seriesRoute.GET, `/series/${seriesId}?include=drafts`, { token, params: { id: seriesId } });
    expect(r.status).toBe(200);
    expect(r.body.rows.filter((x: { draft: boolean }) => x.draft).length).toBe(1);
    const csv = await call(seriesRoute.GET, `/series/${seriesId}?format=csv`, { token, params: { id: seriesId } });
    expect(csv.headers.get("content-type")).toMatch(/text\/csv/);
    expect(csv.text.split("\r\n")[0]).toMatch(/^sample,formula,x,e\/a,γ /);
  });
  it("GET /series/{id} with another group's token answers 404", async () => {
    const { token } = await createToken(t.db, B.members.owner, { name: "b", scope: "read" });
    expect((await call(seriesRoute.GET, `/series/${seriesId}`, { token, params: { id: seriesId } })).status).toBe(404);
  });
});

describe("v1 analyses routes", () => {
  it("GET /analyses?sampleId= lists that sample's analysis with its sealed revision and hash", async () => {
    const { GET } = await import("../../app/api/v1/analyses/route");
    const { token } = await createToken(t.db, A.members.viewer, { name: "a", scope: "read" });
    const r = await call(GET, `/analyses?sampleId=${ids[0]}`, { token });
    expect(r.status).toBe(200);
    expect(r.body.analyses.length).toBe(1);
    expect(r.body.analyses[0].revisions[0].state).toBe("sealed");
    expect(r.body.nextCursor).toBeNull();
  });
  it("GET /analyses/{id} returns revisions with steps and their stored outputs; 404 across groups", async () => {
    const { GET } = await import("../../app/api/v1/analyses/[id]/route");
    const a = await t.db.analysis.findFirstOrThrow({ where: { sampleId: ids[1] } });
    const { token } = await createToken(t.db, A.members.viewer, { name: "a2", scope: "read" });
    const r = await call(GET, `/analyses/${a.id}`, { token, params: { id: a.id } });
    const derive = r.body.revisions[0].steps.find((s: { kind: string }) => s.kind === "derive");
    expect(derive.output.result.quantities.find((q: { name: string }) => q.name === "gamma").value).toBeCloseTo(GAMMAS[1]![0], 12);
    expect(r.body.revisions[0].contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect((await call(GET, `/analyses/${a.id}?revision=9`, { token, params: { id: a.id } })).status).toBe(404);
    const { token: other } = await createToken(t.db, B.members.owner, { name: "b2", scope: "read" });
    expect((await call(GET, `/analyses/${a.id}`, { token: other, params: { id: a.id } })).status).toBe(404);
  });
});
