/**
 * One truth for sealed numbers, under attack: as the database owner with the triggers switched
 * off (SET LOCAL session_replication_role = replica), a sealed revision's fit step output is
 * changed (γ → γ + 2 mJ mol⁻¹ K⁻²), then the snapshot itself, then the sample's formula. The
 * JSON API, `heatbook pull`, the series view and its CSV serve the sealed value or refuse with a
 * clear error; Verify and verifySealedRevisions name the step; a backup carrying the change
 * fails verification on restore. Data: the invented Cu-like curve of reviewFixtures.
 */
import { describe, it, expect, beforeAll, afterAll, afterEach } from "vitest";
import pg from "pg";
import { gunzipSync, gzipSync } from "node:zlib";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { reviewTransition, verifyRevision, verifySealedRevisions, type RevisionSnapshot } from "../../lib/server/review";
import { createSeries, seriesCsv, seriesView } from "../../lib/server/series";
import { getApiAnalysis, setApiLimiter, PgTokenBucketLimiter } from "../../lib/server/api";
import { createToken } from "../../lib/server/tokens";
import { exportGroup, restoreGroup } from "../../lib/server/backup";
import { updateSample } from "../../lib/server/samples";
import { renameAnalysis, setAnalysisArchived } from "../../lib/server/notebook";
import { contextChanges, pinnedContext } from "../../lib/server/review";
import { main } from "../../lib/cli/main";
import type { CliIo } from "../../lib/cli/io";
import { setFetch } from "../../lib/cli/commands/push";
import * as seriesOne from "../../app/api/v1/series/[id]/route";
import * as analysisOne from "../../app/api/v1/analyses/[id]/route";

let t: TestDatabase;
let f: ReviewFixture;
let r: { analysisId: string; revisionId: string };
let seriesId: string;
let sealedGamma: number;
let cleanArchive: Uint8Array;
let token: string;
let restoreFetch: typeof fetch | undefined;
afterEach(() => { if (restoreFetch) setFetch(restoreFetch); restoreFetch = undefined; });

/** Run SQL as the database owner with every trigger switched off (the attack). */
async function asOwnerWithoutTriggers(sql: string, values: unknown[]): Promise<number> {
  const c = new pg.Client({ connectionString: t.ownerUrl }); // the owner: the runtime role may not switch triggers off
  await c.connect();
  try {
    await c.query("BEGIN");
    await c.query("SET LOCAL session_replication_role = replica");
    const res = await c.query(sql, values);
    await c.query("COMMIT");
    return res.rowCount ?? 0;
  } finally {
    await c.end();
  }
}

function cliIo(env: Record<string, string>) {
  const out: string[] = [];
  const err: string[] = [];
  const cli: CliIo = { out: (x) => out.push(x), err: (x) => err.push(x), readFile: () => { throw new Error("no files"); }, env };
  return { cli, out, err };
}

/** fetch → the v1 route modules, as Next would dispatch them. */
function dispatch(): typeof fetch {
  const table: [RegExp, Record<string, unknown>][] = [[/^\/api\/v1\/series\/([^/]+)$/, seriesOne], [/^\/api\/v1\/analyses\/([^/]+)$/, analysisOne]];
  return async (url, init) => {
    const req = new Request(String(url), init);
    const path = new URL(req.url).pathname;
    for (const [re, mod] of table) {
      const m = re.exec(path);
      const h = mod[req.method] as ((q: Request, c: object) => Promise<Response>) | undefined;
      if (m && h) return h(req, { params: Promise.resolve({ id: decodeURIComponent(m[1]!) }) });
    }
    return Response.json({ error: "no route" }, { status: 404 });
  };
}

const fitGamma = (output: any) => output.result.fit.parameters.find((p: any) => p.name === "gamma").value as number;

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  setApiLimiter(new PgTokenBucketLimiter(t.db, { capacity: 1000, refillPerSecond: 1000 }));
  f = await makeReviewFixture(t.db);
  r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "tamper target");
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: 1 });
  await reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, ...SIGN, comment: "window scan flat" });
  seriesId = (await createSeries(t.db, f.members.analyst, { name: "tamper series", sampleIds: [f.sampleId] })).id;
  const snap = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).snapshot as unknown as RevisionSnapshot;
  sealedGamma = fitGamma(snap.outputs.steps.find((s) => s.kind === "fit")!.output);
  cleanArchive = (await exportGroup(t.db, f.slug)).archive;
  token = (await createToken(t.db, f.members.viewer, { name: "pull", scope: "read" })).token;
});
afterAll(async () => { await t.drop(); });

describe("before any tampering", () => {
  it("verifyRevision of an untouched seal is ok and verifySealedRevisions finds nothing", async () => {
    expect((await verifyRevision(t.db, f.members.viewer, r.analysisId, r.revisionId)).ok).toBe(true);
    expect(await verifySealedRevisions(t.db, { groupId: f.groupId })).toMatchObject({ ok: true, checked: 1, mismatches: [] });
  });
});

describe("a sealed fit step's stored output changed behind the triggers", () => {
  beforeAll(async () => {
    const n = await asOwnerWithoutTriggers(
      `UPDATE "Step" SET output = jsonb_set(output::jsonb, '{result,fit,parameters,0,value}', to_jsonb((output::jsonb #>> '{result,fit,parameters,0,value}')::float8 + 0.002))::json
       WHERE "revisionId" = $1 AND kind = 'fit'`, [r.revisionId]);
    expect(n).toBe(1);
    const row = await t.db.step.findFirstOrThrow({ where: { revisionId: r.revisionId, kind: "fit" } });
    expect(fitGamma(row.output)).toBeCloseTo(sealedGamma + 0.002, 12);
  });

  it("getApiAnalysis serves the sealed γ from the snapshot, not the changed row", async () => {
    const a = await getApiAnalysis(t.db, f.members.viewer, r.analysisId);
    expect(fitGamma(a.revisions[0]!.steps.find((s) => s.kind === "fit")!.output)).toBe(sealedGamma);
  });

  it("heatbook pull analysis --json prints the sealed γ", async () => {
    restoreFetch = setFetch(dispatch());
    const { cli, out } = cliIo({ HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token });
    expect(await main(["pull", "analysis", r.analysisId, "--json"], cli)).toBe(0);
    expect(fitGamma(JSON.parse(out[0]!).revisions[0].steps.find((s: any) => s.kind === "fit").output)).toBe(sealedGamma);
  });

  it("seriesView and seriesCsv show the sealed γ (per f.u., mJ) and heatbook pull series --csv the same", async () => {
    const view = await seriesView(t.db, f.members.viewer, seriesId);
    const row = view.rows.find((x) => x.revision?.revisionId === r.revisionId)!;
    expect(row.gamma!.value).toBeCloseTo(sealedGamma * 1e3, 9);
    const csv = seriesCsv(view);
    restoreFetch = setFetch(dispatch());
    const { cli, out } = cliIo({ HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token });
    expect(await main(["pull", "series", seriesId, "--csv"], cli)).toBe(0);
    expect(out[0]).toBe(csv);
    const gammaCol = csv.split("\r\n")[0]!.split(",").findIndex((h) => h.startsWith("γ ("));
    expect(Number(csv.split("\r\n")[1]!.split(",")[gammaCol])).toBeCloseTo(sealedGamma * 1e3, 9);
  });

  it("verifyRevision fails naming step 3 (fit) and the changed path", async () => {
    const v = await verifyRevision(t.db, f.members.viewer, r.analysisId, r.revisionId);
    expect(v.ok).toBe(false);
    expect(v.hashMatches).toBe(true);
    expect(v.mismatches[0]).toMatchObject({ check: "step-row", what: expect.stringMatching(/^step 3 \(fit\): stored output differs from the sealed snapshot at result\.fit\.parameters\[0\]\.value/) });
    expect(v.summary).toMatch(/first: step 3 \(fit\)/);
  });

  it("verifySealedRevisions (what heatbook audit verify runs) names the step; heatbook audit verify exits 1 saying so", async () => {
    const all = await verifySealedRevisions(t.db);
    expect(all.ok).toBe(false);
    expect(all.mismatches.map((m) => m.what)).toEqual([expect.stringMatching(/^step 3 \(fit\): stored output differs/)]);
    const { cli, out, err } = cliIo({ HEATBOOK_AUDIT_KEY: process.env.HEATBOOK_AUDIT_KEY! });
    expect(await main(["audit", "verify", "--url", t.ownerUrl], cli)).toBe(1);
    expect([...out, ...err].join("\n")).toMatch(/sealed revisions NOT verified: 1 mismatch.*step 3 \(fit\)/);
  });

  it("exportGroup refuses to back up a group whose rows disagree with a seal, naming it", async () => {
    await expect(exportGroup(t.db, f.slug)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/not exported.*step 3 \(fit\)/) });
  });

  it("restoreGroup of a backup carrying the changed step fails verification naming the step", async () => {
    const lines = gunzipSync(cleanArchive).toString("utf8").trimEnd().split("\n");
    const edited = lines.map((l) => {
      const rec = JSON.parse(l);
      if (rec.table !== "Step" || rec.row.kind !== "fit" || rec.row.revisionId !== r.revisionId) return l;
      rec.row.output.result.fit.parameters[0].value += 0.002;
      return JSON.stringify(rec);
    });
    expect(edited).not.toEqual(lines);
    const dst = await freshDatabase();
    try {
      const report = await restoreGroup(dst.owner(), gzipSync(Buffer.from(edited.join("\n") + "\n")));
      expect(report.ok).toBe(false);
      expect(report.seals.problems.join("\n")).toMatch(/step 3 \(fit\): stored output differs from the sealed snapshot/);
    } finally {
      await dst.drop();
    }
  });
});

describe("the sample record edited after sealing", () => {
  beforeAll(async () => {
    const s = await t.db.sample.findUniqueOrThrow({ where: { id: f.sampleId } });
    await updateSample(t.db, f.members.analyst, f.sampleId, { formula: "Ag", version: s.version });
  });

  it("seriesView keeps the sealed formula and marks the row sample record changed since sealing", async () => {
    const row = (await seriesView(t.db, f.members.viewer, seriesId)).rows.find((x) => x.revision?.revisionId === r.revisionId)!;
    expect(row.sample.formula).toBe("Cu");
    expect(row.context).toMatchObject({ source: "sealed", changedSinceSealing: expect.arrayContaining([expect.stringMatching(/^formula Cu → Ag$/)]) });
    expect(row.warnings.join("\n")).toMatch(/sample record changed since sealing: .*formula Cu → Ag/);
    expect(seriesCsv(await seriesView(t.db, f.members.viewer, seriesId))).toMatch(/formula Cu → Ag/);
    restoreFetch = setFetch(dispatch());
    const { cli, out } = cliIo({ HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token });
    expect(await main(["pull", "series", seriesId], cli)).toBe(0);
    expect(out[0]).toMatch(/rev 1 sealed \[1\]\n\[1\] RV-1: sample record changed since sealing: .*formula Cu → Ag/);
  });

  it("getApiAnalysis lists the change beside the sealed context; verifyRevision names it in its summary", async () => {
    const a = await getApiAnalysis(t.db, f.members.viewer, r.analysisId);
    expect(a.revisions[0]!.sealedContext).toMatchObject({ pinned: "full", sample: { formula: "Cu" }, changedSinceSealing: expect.arrayContaining([expect.objectContaining({ field: "formula", sealed: "Cu", now: "Ag" })]) });
    const v = await verifyRevision(t.db, f.members.viewer, r.analysisId, r.revisionId);
    expect(v.contextChanges.map((c) => c.field)).toContain("formula");
    expect(v.summary).toMatch(/sample record changed since sealing: .*formula Cu → Ag/);
  });
});

describe("renaming and archiving an analysis with a sealed revision", () => {
  it("renameAnalysis and setAnalysisArchived are allowed and audited; the series still shows the sealed row, marked", async () => {
    await renameAnalysis(t.db, f.members.analyst, r.analysisId, { title: "tamper target (renamed)" });
    await setAnalysisArchived(t.db, f.members.analyst, r.analysisId, true);
    const actions = (await t.db.auditEvent.findMany({ where: { objectId: r.analysisId }, orderBy: { id: "asc" } })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["analysis.rename", "analysis.archive"]));
    const row = (await seriesView(t.db, f.members.viewer, seriesId)).rows.find((x) => x.revision?.revisionId === r.revisionId)!;
    expect(row.revision).toMatchObject({ analysisTitle: "tamper target (renamed)", analysisArchived: true, state: "sealed" });
    expect(row.gamma!.value).toBeCloseTo(sealedGamma * 1e3, 9);
    await setAnalysisArchived(t.db, f.members.analyst, r.analysisId, false);
  });
});

describe("the sample record changed behind the app's back", () => {
  it("verifySealedRevisions names a sample formula changed by SQL as a context mismatch, where an audited edit is only a note", async () => {
    const before = await verifySealedRevisions(t.db);
    expect(before.mismatches.filter((m) => m.check === "context")).toEqual([]);
    await asOwnerWithoutTriggers(`UPDATE "Sample" SET formula = 'Au' WHERE id = $1`, [f.sampleId]);
    const after = await verifySealedRevisions(t.db);
    expect(after.mismatches.find((m) => m.check === "context")?.what).toMatch(/formula Cu → Au.*differs from what its last audited edit recorded/);
    await asOwnerWithoutTriggers(`UPDATE "Sample" SET formula = 'Ag' WHERE id = $1`, [f.sampleId]);
  });
});

describe("pinnedContext of a snapshot sealed before composition was pinned (format 1)", () => {
  it("pinnedContext keeps the chain's fields, leaves composition unknown and says so; contextChanges compares only what was pinned", async () => {
    const snap = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).snapshot as unknown as RevisionSnapshot;
    const { context: _c, signature: _s, ...v1 } = { ...snap, format: "heatbook-seal/1" as const };
    const ctx = pinnedContext(v1);
    expect(ctx).toMatchObject({ pinned: "chain", sample: { formula: "Cu", compositionValue: null }, note: expect.stringMatching(/^composition x not pinned: sealed before composition was part of the seal/) });
    const changes = contextChanges(ctx, { formula: "Cu", molarMassGPerMol: snap.inputs.sample.molarMassGPerMol, atomsPerFormulaUnit: 1, massMg: snap.inputs.sample.massMg, densityGPerCm3: null, valences: {}, compositionVariable: "x", compositionValue: 0.3 });
    expect(changes).toEqual([]);
  });
});

describe("the sealed snapshot itself changed behind the triggers", () => {
  beforeAll(async () => {
    await asOwnerWithoutTriggers(`UPDATE "AnalysisRevision" SET snapshot = jsonb_set(snapshot, '{analysis,title}', '"renamed in the dark"') WHERE id = $1`, [r.revisionId]);
  });

  it("getApiAnalysis and heatbook pull refuse with 409 naming the content hash", async () => {
    await expect(getApiAnalysis(t.db, f.members.viewer, r.analysisId)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/revision 1 .* no longer matches its content hash/) });
    restoreFetch = setFetch(dispatch());
    const { cli, err } = cliIo({ HEATBOOK_URL: "http://local", HEATBOOK_TOKEN: token });
    expect(await main(["pull", "analysis", r.analysisId, "--json"], cli)).toBe(1);
    expect(err.join("\n")).toMatch(/409.*no longer matches its content hash/);
  });

  it("seriesView refuses naming the revision instead of serving its numbers", async () => {
    await expect(seriesView(t.db, f.members.viewer, seriesId)).rejects.toMatchObject({ name: "ConflictError", message: expect.stringMatching(/revision 1 of “tamper target \(renamed\)” .* content hash/) });
  });
});
