/**
 * Two app instances (two `next start` processes on two ports) on one PostgreSQL: a live update
 * made through one reaches an event stream opened on the other (LISTEN/NOTIFY), and two
 * concurrent saves of the same step version, one through each instance, end with exactly one
 * 200 and one 409 carrying the newer step; the refused edit, saved again on the newer version,
 * is kept — nothing is lost (config, version and audit trail all account for every accepted save).
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { opsDatabase, opsFixture, startApp, signIn, storeMeasurement, until, type OpsDatabase, type OpsFixture, type AppServer } from "./harness";
import { openEvents } from "./sse";
import { fullChain, writeSteps } from "../server/reviewFixtures";

let d: OpsDatabase;
let f: OpsFixture;
let a: AppServer;
let b: AppServer;
let analysisId: string;
let stepId: string;

beforeAll(async () => {
  d = await opsDatabase("instances");
  f = await opsFixture(d.db, "inst");
  const m = await storeMeasurement(d.db, f, 400);
  const an = await d.db.analysis.create({ data: { groupId: f.analyst.group.id, sampleId: f.sampleId, title: "two instances", createdById: f.analyst.userId } });
  const rev = await d.db.analysisRevision.create({ data: { analysisId: an.id, number: 1, createdById: f.analyst.userId } });
  await writeSteps(d.db, f.analyst.group.id, f.sampleId, rev.id, fullChain(m, 12));
  analysisId = an.id;
  stepId = (await d.db.step.findFirstOrThrow({ where: { revisionId: rev.id, kind: "fit" } })).id;
  [a, b] = await Promise.all([startApp(d.url), startApp(d.url)]);
});

afterAll(async () => {
  await Promise.all([a?.kill("SIGTERM"), b?.kill("SIGTERM")]);
  await d?.close();
});

async function save(app: AppServer, cookie: string, version: number, tMaxK: number) {
  const res = await fetch(`${app.base}/api/groups/${f.slug}/analyses/${analysisId}/steps/${stepId}`, {
    method: "PATCH", headers: { cookie, "content-type": "application/json", origin: app.base },
    body: JSON.stringify({ version, config: { model: "sommerfeld", tMaxK, compare: [] } }),
  });
  return { status: res.status, body: (await res.json()) as { version?: number; current?: { version: number; config: { tMaxK: number } } } };
}

const stepRow = () => d.db.step.findUniqueOrThrow({ where: { id: stepId } });

describe("two next start instances on one PostgreSQL", () => {
  it("an edit through instance A reaches an event stream open on instance B", async () => {
    expect(a.port).not.toBe(b.port);
    const [ca, cb] = [await signIn(a.base, f.analyst.email), await signIn(b.base, f.analyst.email)];
    const stream = await openEvents(`${b.base}/api/groups/${f.slug}/events?analysisId=${analysisId}`, cb.cookie);
    try {
      const v = (await stepRow()).version;
      expect((await save(a, ca.cookie, v, 11)).status).toBe(200);
      const seen = await until("the step event on instance B", async () => stream.events.find((e) => e.kind === "step" && e.stepId === stepId), 60);
      expect(seen.analysisId).toBe(analysisId);
    } finally {
      stream.close();
    }
  });

  it("concurrent saves of one step version through A and B: one 200, one 409, and the retried edit is kept", async () => {
    const [ca, cb] = [await signIn(a.base, f.analyst.email), await signIn(b.base, f.analyst.email)];
    const v = (await stepRow()).version;
    const auditBefore = await d.db.auditEvent.count({ where: { action: "step.update", objectId: stepId } });
    const [ra, rb] = await Promise.all([save(a, ca.cookie, v, 9), save(b, cb.cookie, v, 10)]);
    expect([ra.status, rb.status].sort()).toEqual([200, 409]);
    const [won, lost, wonT, lostT, lostApp, lostCookie] = ra.status === 200 ? [ra, rb, 9, 10, b, cb.cookie] as const : [rb, ra, 10, 9, a, ca.cookie] as const;
    expect(won.body.version).toBe(v + 1);
    expect(lost.body.current).toMatchObject({ version: v + 1, config: { tMaxK: wonT } });
    let row = await stepRow();
    expect(row.version).toBe(v + 1);
    expect((row.config as { tMaxK: number }).tMaxK).toBe(wonT);
    // The refused user saves again on the newer version: accepted, nothing lost.
    const retry = await save(lostApp, lostCookie, lost.body.current!.version, lostT);
    expect(retry.status).toBe(200);
    row = await stepRow();
    expect(row.version).toBe(v + 2);
    expect((row.config as { tMaxK: number }).tMaxK).toBe(lostT);
    expect(await d.db.auditEvent.count({ where: { action: "step.update", objectId: stepId } })).toBe(auditBefore + 2);
  });
});
