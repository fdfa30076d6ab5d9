/**
 * The report of a sealed revision: built from the snapshot alone, with provenance checksums,
 * fit window and model, compact uncertainties, derived Θ_D, reviewer, time, content hash and the
 * expert-review sentence; and the PDF download route.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import { buildReport, renderReportPdf, reviewTransition, SAFETY_SENTENCE } from "../../lib/server/review";
import { expectClose } from "../helpers/expectClose";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));
import * as pdfRoute from "../../app/api/groups/[slug]/analyses/[id]/report.pdf/route";

let t: TestDatabase;
let f: ReviewFixture;
let r: { analysisId: string; revisionId: string };

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeReviewFixture(t.db);
  r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "report me");
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: 1 });
  await reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, ...SIGN, comment: "Checked the window scan and the residuals." });
});
afterAll(async () => { await t.drop(); });

describe("buildReport", () => {
  it("buildReport gives sample, provenance with the file checksum, the fit window and model, reviewer and hash", async () => {
    const rep = await buildReport(t.db, f.members.viewer, r.analysisId);
    const file = await t.db.storedFile.findUniqueOrThrow({ where: { id: f.fileId } });
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
    expect(rep.sample).toMatchObject({ label: "RV-1", formula: "Cu", atomsPerFormulaUnit: 1 });
    expect(rep.provenance).toEqual([expect.objectContaining({ fileName: "invented.csv", sha256: file.sha256, pointCount: 12, tMinK: 2, tMaxK: 7.5 })]);
    expect(rep.corrections.map((c) => c.kind)).toEqual(["data", "normalise"]);
    expect(rep.fits).toHaveLength(1);
    expect(rep.fits[0]).toMatchObject({ model: "sommerfeld", tMinK: 2, tMaxK: 6, nPoints: 9, weighted: true });
    expect(rep.review.sealedBy).toBe("reviewer");
    expect(rep.review.submittedBy).toBe("analyst");
    expect(rep.review.sealedAt).toBe(rev.sealedAt!.toISOString());
    expect(rep.contentHash).toBe(rev.contentHash);
    expect(rep.safetyNote).toBe("These results need expert review under local practice before use in any safety-relevant decision.");
    expect(SAFETY_SENTENCE).toBe(rep.safetyNote);
  });

  it("buildReport shows γ in compact notation and Θ_D = (12π⁴R/(5β))^(1/3) for the invented β", async () => {
    const rep = await buildReport(t.db, f.members.viewer, r.analysisId, r.revisionId);
    const gamma = rep.fits[0]!.parameters.find((p) => p.name === "gamma")!;
    expect(gamma.compact).toMatch(/^1\.3\d*\(\d+\) mJ mol⁻¹ K⁻²$/);
    const beta = rep.fits[0]!.parameters.find((p) => p.name === "beta")!;
    // R = N_A k_B, exact in CODATA 2018 (8.314462618… J mol⁻¹ K⁻¹); Debye T³ law, r = 1 for Cu
    const R = 6.02214076e23 * 1.380649e-23;
    const theta = rep.derived.find((q) => q.name === "thetaD")!;
    expect(beta.unit).toBe("mJ mol⁻¹ K⁻⁴"); // report values are in their display unit
    expectClose(theta.value, Math.cbrt((12 * Math.PI ** 4 * R) / (5 * beta.value * 1e-3)), { rel: 1e-10 });
    expectClose(theta.value, 338.8, { rel: 2e-3 }); // invented β = 0.05 mJ mol⁻¹ K⁻⁴
    expect(theta.compact).toMatch(/K$/);
  });

  it("buildReport of a revision that is not sealed is refused", async () => {
    const open = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, "open");
    await expect(buildReport(t.db, f.members.viewer, open.analysisId, open.revisionId)).rejects.toMatchObject({ name: "ConflictError" });
    await expect(buildReport(t.db, f.members.viewer, open.analysisId)).rejects.toMatchObject({ name: "NotFoundError" });
  });
});

describe("report PDF", () => {
  it("renderReportPdf writes a complete PDF document", async () => {
    const pdf = await renderReportPdf(await buildReport(t.db, f.members.viewer, r.analysisId));
    const text = new TextDecoder("latin1").decode(pdf);
    expect(text.startsWith("%PDF-")).toBe(true);
    expect(text.trimEnd().endsWith("%%EOF")).toBe(true);
    expect(pdf.length).toBeGreaterThan(2000);
  });

  it("GET report.pdf downloads the sealed revision's PDF for a viewer, 404 for another group, 401 signed out", async () => {
    const call = async (userId: string | null, query = "") => {
      session.userId = userId;
      return pdfRoute.GET(new Request(`http://localhost/x${query}`), { params: Promise.resolve({ slug: f.slug, id: r.analysisId }) });
    };
    const res = await call(f.members.viewer.userId, `?revision=${r.revisionId}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="RV-1-r1-[0-9a-f]{8}\.pdf"/);
    expect(new TextDecoder("latin1").decode(new Uint8Array(await res.arrayBuffer())).slice(0, 5)).toBe("%PDF-");
    const other = await makeReviewFixture(t.db);
    expect((await call(other.members.owner.userId)).status).toBe(404);
    expect((await call(null)).status).toBe(401);
  });
});
