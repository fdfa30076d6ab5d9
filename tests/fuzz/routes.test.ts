/**
 * Fuzzing write routes end to end (route handlers on a real PostgreSQL, next-auth's session
 * mocked as the group's analyst) with random JSON bodies, seeded and bounded: no handler
 * answers 500, every refusal is a JSON { error } with a 4xx status, and a refused request
 * writes nothing (rows of every table it could touch and the audit trail counted before/after).
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import fc from "fast-check";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeSeriesFixture, type SeriesFixture } from "../server/jobsFixtures";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as samples from "../../app/api/groups/[slug]/samples/route";
import * as sample from "../../app/api/groups/[slug]/samples/[id]/route";
import * as analyses from "../../app/api/groups/[slug]/analyses/route";
import * as analysis from "../../app/api/groups/[slug]/analyses/[id]/route";
import * as steps from "../../app/api/groups/[slug]/analyses/[id]/steps/route";
import * as step from "../../app/api/groups/[slug]/analyses/[id]/steps/[stepId]/route";
import * as review from "../../app/api/groups/[slug]/analyses/[id]/review/route";
import * as threads from "../../app/api/groups/[slug]/analyses/[id]/threads/route";
import * as series from "../../app/api/groups/[slug]/series/route";
import * as jobs from "../../app/api/groups/[slug]/jobs/route";

const SEED = 20261202;
let t: TestDatabase;
let f: SeriesFixture;

type H = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

async function counts() {
  const db = t.db;
  const [a, b, c, d, e, g, h, i] = await Promise.all([db.auditEvent.count(), db.sample.count(), db.analysis.count(), db.step.count(), db.series.count(), db.thread.count(), db.analysisRevision.count(), db.$queryRaw<{ n: bigint }[]>`SELECT count(*) AS n FROM "JobRun"`]);
  return { audit: a, samples: b, analyses: c, steps: d, series: e, threads: g, revisions: h, jobs: Number(i[0]!.n) };
}

const body = fc.oneof(
  { weight: 3, arbitrary: fc.dictionary(fc.constantFrom("label", "formula", "title", "sampleId", "kind", "version", "config", "position", "action", "revisionId", "name", "sampleIds", "seriesId", "markdown", "anchor", "massMg", "x"), fc.jsonValue({ maxDepth: 3 }), { maxKeys: 6 }) },
  fc.jsonValue({ maxDepth: 3 }),
);

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeSeriesFixture(t.db, { samples: 1 });
  session.userId = f.members.analyst.userId;
}, 120_000);
afterAll(async () => t.drop());

describe("write routes under fuzzed JSON bodies", () => {
  it("no route answers 500 and a refused request writes nothing", async () => {
    const a = f.analyses[0]!;
    const stepId = (await t.db.step.findFirstOrThrow({ where: { revisionId: a.revisionId, kind: "fit" } })).id;
    const targets: [string, string, H, Record<string, string>][] = [
      ["POST", "samples", samples.POST as H, {}],
      ["PATCH", "samples/id", sample.PATCH as H, { id: a.sampleId }],
      ["POST", "analyses", analyses.POST as H, {}],
      ["PATCH", "analyses/id", analysis.PATCH as H, { id: a.analysisId }],
      ["POST", "analyses/id", analysis.POST as H, { id: a.analysisId }],
      ["POST", "steps", steps.POST as H, { id: a.analysisId }],
      ["PATCH", "steps/id", step.PATCH as H, { id: a.analysisId, stepId }],
      ["POST", "review", review.POST as H, { id: a.analysisId }],
      ["POST", "threads", threads.POST as H, { id: a.analysisId }],
      ["POST", "series", series.POST as H, {}],
      ["POST", "jobs", jobs.POST as H, {}],
    ].filter(([, , h]) => typeof h === "function") as [string, string, H, Record<string, string>][];
    expect(targets.length).toBe(11);
    const failures: string[] = [];
    for (const [method, name, handler, params] of targets) {
      await fc.assert(fc.asyncProperty(body, async (value) => {
        const before = await counts();
        const res = await handler(new Request(`http://localhost/api/groups/${f.slug}/${name}`, { method, headers: { "content-type": "application/json" }, body: JSON.stringify(value) }), { params: Promise.resolve({ slug: f.slug, ...params }) });
        const json = (await res.json().catch(() => null)) as { error?: string } | null;
        if (res.status >= 500) failures.push(`${method} ${name} ${JSON.stringify(value)} → ${res.status} ${json?.error}`);
        if (res.status >= 400) {
          expect(typeof json?.error).toBe("string");
          expect(await counts()).toEqual(before);
        }
      }), { seed: SEED, numRuns: 40 });
    }
    expect(failures).toEqual([]);
  }, 240_000);
});
