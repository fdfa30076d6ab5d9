/**
 * Figure exports for a manuscript: a fit step's chart and a sealed report's figure as PDF one
 * journal column wide (8.5 or 17.5 cm) with the font embedded, or as SVG with the font inside;
 * bad choices answer 422 naming the field; another group's analysis answers 404.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { SIGN } from "./fixtures";
import { reviewTransition } from "../../lib/server/review";
import { pdfText } from "../helpers/pdfText";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));
import * as stepFigure from "../../app/api/groups/[slug]/analyses/[id]/steps/[stepId]/figure/route";
import * as reportFigure from "../../app/api/groups/[slug]/analyses/[id]/figures/[figure]/route";

let t: TestDatabase;
let f: ReviewFixture;
let r: { analysisId: string; revisionId: string };
let fitStepId: string;
const CM = 72 / 2.54;

async function call(handler: (req: Request, ctx: never) => Promise<Response>, query: string, params: Record<string, string>, userId: string | null = f.members.viewer.userId) {
  session.userId = userId;
  return handler(new Request(`http://localhost/x?${query}`), { params: Promise.resolve({ slug: f.slug, id: r.analysisId, ...params }) } as never);
}

const mediaWidth = async (res: Response) => Number(/\/MediaBox \[0 0 ([\d.]+)/.exec(new TextDecoder("latin1").decode(new Uint8Array(await res.clone().arrayBuffer())))![1]);

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeReviewFixture(t.db);
  r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "figures");
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  fitStepId = (await t.db.step.findFirstOrThrow({ where: { revisionId: r.revisionId, kind: "fit" } })).id;
}, 120_000);
afterAll(async () => { await t.drop(); });

describe("GET steps/[stepId]/figure", () => {
  it("answers the fit chart as a PDF 8.5 cm wide with its axis titles as text", async () => {
    const res = await call(stepFigure.GET, "chart=fit&format=pdf&column=single", { stepId: fitStepId });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(await mediaWidth(res)).toBeCloseTo(8.5 * CM, 1);
    const text = (await pdfText(new Uint8Array(await res.arrayBuffer()))).text;
    expect(text).toContain("C/T (mJ mol⁻¹ K⁻²)");
    expect(text).toContain("T² (K²)");
  });

  it("answers 17.5 cm for a double column and SVG with the font inside", async () => {
    expect(await mediaWidth(await call(stepFigure.GET, "chart=fit&format=pdf&column=double", { stepId: fitStepId }))).toBeCloseTo(17.5 * CM, 1);
    const svg = await (await call(stepFigure.GET, "chart=fit&format=svg&column=single", { stepId: fitStepId })).text();
    expect(svg).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(svg).toContain("@font-face{font-family:\"DejaVu Sans\";src:url(data:font/ttf;base64,");
    expect(svg).toContain(">C/T (mJ mol⁻¹ K⁻²)</text>");
  });

  it("refuses a bad column with 422, a scan the step never ran with 409, another group with 404", async () => {
    expect((await call(stepFigure.GET, "chart=fit&column=wide", { stepId: fitStepId })).status).toBe(422);
    expect((await call(stepFigure.GET, "chart=scan", { stepId: fitStepId })).status).toBe(409);
    const other = await makeReviewFixture(t.db);
    expect((await call(stepFigure.GET, "chart=fit", { stepId: fitStepId }, other.members.owner.userId)).status).toBe(404);
  });
});

describe("GET figures/[figure] of a sealed report", () => {
  it("answers the report's fit figure once the revision is sealed, 404 before (no sealed revision)", async () => {
    expect((await call(reportFigure.GET, "format=pdf&column=single", { figure: "fit-3" })).status).toBe(404);
    await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: 1 });
    await reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, comment: "window checked", ...SIGN });
    const res = await call(reportFigure.GET, "format=pdf&column=single", { figure: "fit-3" });
    expect(res.status).toBe(200);
    expect(await mediaWidth(res)).toBeCloseTo(8.5 * CM, 1);
    expect((await call(reportFigure.GET, "format=pdf", { figure: "scan-9" })).status).toBe(404);
  });
});
