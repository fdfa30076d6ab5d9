/**
 * Crash safety: `next start` is killed with SIGKILL while PostgreSQL holds the open transaction
 * of (1) a 100 000-row import and (2) an approval that seals a revision of a 100 000-point
 * measurement. The kill is timed by watching pg_stat_activity for the app's open transaction,
 * so it lands mid-transaction (the test says so if a commit won the race, and tries again).
 * After a restart: no partial rows (every stored file belongs to a measurement, every audit
 * row to a record, point counts whole) and no half-locked revision (sealed ⇔ snapshot, hash,
 * sealedAt and the measurement locks all present); the interrupted action then succeeds.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import pg from "pg";
import { PASSWORD, opsDatabase, opsFixture, startApp, signIn, inventedCsv, IMPORT_OPTIONS, storeMeasurement, until, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { fullChain, writeSteps } from "../server/reviewFixtures";
import { reviewTransition } from "../../lib/server/review";

let d: OpsDatabase;
let f: OpsFixture;
let app: AppServer | null = null;
let watcher: pg.Client;

/**
 * SIGKILL the app as soon as one of its backends holds a transaction that has written (it has
 * a transaction id: backend_xid), i.e. mid-transaction, before its commit; returns false if the
 * request finished first.
 */
async function killMidTransaction(request: Promise<unknown>): Promise<boolean> {
  let settled = false;
  void request.catch(() => undefined).finally(() => (settled = true));
  for (;;) {
    const { rows } = await watcher.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid() AND backend_type = 'client backend' AND backend_xid IS NOT NULL AND application_name NOT LIKE 'heatbook-%'`);
    if (rows[0].n > 0) {
      await app!.kill("SIGKILL");
      return true;
    }
    if (settled) {
      await app!.kill("SIGKILL");
      return false;
    }
  }
}

/** Wait until PostgreSQL has rolled back the dead server's transactions. */
async function settledDatabase(): Promise<void> {
  await until("the dead server's backends to end", async () => {
    const { rows } = await watcher.query(`SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid() AND backend_type = 'client backend' AND xact_start IS NOT NULL`);
    return rows[0].n === 0;
  });
}

async function consistency() {
  const q = async (sql: string) => (await watcher.query(sql)).rows[0].n as number;
  return {
    orphanFiles: await q(`SELECT count(*)::int AS n FROM "StoredFile" s WHERE NOT EXISTS (SELECT 1 FROM "Measurement" m WHERE m."fileId" = s."id")`),
    importAuditWithoutRecord: await q(`SELECT count(*)::int AS n FROM "AuditEvent" a WHERE a."action" = 'measurement.import' AND NOT EXISTS (SELECT 1 FROM "Measurement" m WHERE m."id"::text = a."objectId")`),
    partialPoints: await q(`SELECT count(*)::int AS n FROM "Measurement" WHERE length("temperatureK") <> 8 * "pointCount" OR length("heatCapacity") <> 8 * "pointCount"`),
    halfSealed: await q(`SELECT count(*)::int AS n FROM "AnalysisRevision" WHERE ("state" = 'sealed') <> ("snapshot" IS NOT NULL AND "contentHash" IS NOT NULL AND "sealedAt" IS NOT NULL AND "sealedById" IS NOT NULL)`),
    locksWithoutSeal: await q(`SELECT count(*)::int AS n FROM "RevisionMeasurement" rm JOIN "AnalysisRevision" r ON r."id" = rm."revisionId" WHERE r."state" NOT IN ('sealed', 'replaced')`),
    sealWithoutLocks: await q(`SELECT count(*)::int AS n FROM "AnalysisRevision" r WHERE r."state" = 'sealed' AND NOT EXISTS (SELECT 1 FROM "RevisionMeasurement" rm WHERE rm."revisionId" = r."id")`),
    approvalsWithoutSeal: await q(`SELECT count(*)::int AS n FROM "ReviewDecision" d JOIN "AnalysisRevision" r ON r."id" = d."revisionId" WHERE d."decision" = 'approved' AND r."state" NOT IN ('sealed', 'replaced')`),
  };
}

const CLEAN = { orphanFiles: 0, importAuditWithoutRecord: 0, partialPoints: 0, halfSealed: 0, locksWithoutSeal: 0, sealWithoutLocks: 0, approvalsWithoutSeal: 0 };

beforeAll(async () => {
  d = await opsDatabase("crash");
  f = await opsFixture(d.db, "crash");
  watcher = new pg.Client({ connectionString: d.url, application_name: "heatbook-ops-watcher" });
  await watcher.connect();
});

afterAll(async () => {
  await app?.kill("SIGKILL");
  await watcher?.end();
  await d?.close();
});

function importForm(rows: number): FormData {
  const form = new FormData();
  form.set("file", new File([inventedCsv(rows)], "invented-100k.csv", { type: "text/csv" }));
  form.set("options", JSON.stringify(IMPORT_OPTIONS));
  return form;
}

describe("SIGKILL of next start in the middle of a write", () => {
  it("a 100 000-row import killed mid-transaction leaves no partial rows, and succeeds after a restart", async () => {
    let landed = false;
    for (let attempt = 0; attempt < 3 && !landed; attempt++) {
      app = await startApp(d.url);
      const { cookie } = await signIn(app.base, f.analyst.email);
      const before = await d.db.measurement.count({ where: { sampleId: f.sampleId } });
      const request = fetch(`${app.base}/api/groups/${f.slug}/samples/${f.sampleId}/measurements`, { method: "POST", headers: { cookie }, body: importForm(100_000) });
      landed = await killMidTransaction(request);
      await settledDatabase();
      const after = await d.db.measurement.count({ where: { sampleId: f.sampleId } });
      expect(await consistency()).toEqual(CLEAN);
      if (landed) expect(after).toBe(before);
      else console.log(`import attempt ${attempt + 1}: the commit came before the kill; trying again`);
    }
    expect(landed).toBe(true);
    app = await startApp(d.url);
    const { cookie } = await signIn(app.base, f.analyst.email);
    const res = await fetch(`${app.base}/api/groups/${f.slug}/samples/${f.sampleId}/measurements`, { method: "POST", headers: { cookie }, body: importForm(100_000) });
    expect(res.status).toBe(201);
    const body = (await res.json()) as { measurement: { pointCount: number } };
    expect(body.measurement.pointCount).toBe(100_000);
    expect(await consistency()).toEqual(CLEAN);
    await app.kill("SIGTERM");
    app = null;
  });

  it("an approval killed mid-transaction leaves the revision in review, unlocked, and approves after a restart", async () => {
    const measurementId = await storeMeasurement(d.db, f, 100_000);
    let landed = false;
    let target: { analysisId: string; revisionId: string } | null = null;
    for (let attempt = 0; attempt < 3 && !landed; attempt++) {
      const a = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title: `crash approval ${attempt}`, createdById: f.analyst.userId } });
      const rev = await d.db.analysisRevision.create({ data: { analysisId: a.id, number: 1, createdById: f.analyst.userId } });
      await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(measurementId, 12));
      await reviewTransition(d.db, f.analyst, a.id, rev.id, { action: "submit", version: 1 });
      target = { analysisId: a.id, revisionId: rev.id };
      app = await startApp(d.url);
      const { cookie } = await signIn(app.base, f.reviewer.email);
      const request = fetch(`${app.base}/api/groups/${f.slug}/analyses/${a.id}/review`, { method: "POST", headers: { cookie, "content-type": "application/json" }, body: JSON.stringify({ revisionId: rev.id, action: "approve", version: 2, meaning: "internal", comment: "checked after the restart", password: PASSWORD }) });
      landed = await killMidTransaction(request);
      await settledDatabase();
      expect(await consistency()).toEqual(CLEAN);
      const state = (await d.db.analysisRevision.findUniqueOrThrow({ where: { id: rev.id } })).state;
      if (landed) expect(state).toBe("in_review");
      else console.log(`approval attempt ${attempt + 1}: the commit came before the kill (${state}); trying again`);
    }
    expect(landed).toBe(true);
    app = await startApp(d.url);
    const { cookie } = await signIn(app.base, f.reviewer.email);
    const res = await fetch(`${app.base}/api/groups/${f.slug}/analyses/${target!.analysisId}/review`, { method: "POST", headers: { cookie, "content-type": "application/json" }, body: JSON.stringify({ revisionId: target!.revisionId, action: "approve", version: 2, meaning: "internal", comment: "checked after the restart", password: PASSWORD }) });
    expect(res.status).toBe(200);
    const rev = await d.db.analysisRevision.findUniqueOrThrow({ where: { id: target!.revisionId } });
    expect(rev.state).toBe("sealed");
    const verify = await fetch(`${app.base}/api/groups/${f.slug}/analyses/${target!.analysisId}/review/verify?revision=${target!.revisionId}`, { headers: { cookie } });
    expect(verify.status).toBe(200);
    expect(((await verify.json()) as { verification: { ok: boolean } }).verification.ok).toBe(true);
    expect(await consistency()).toEqual(CLEAN);
    await app.kill("SIGTERM");
    app = null;
  });
});
