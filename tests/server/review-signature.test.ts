/**
 * Approval is a signature, through the review route as Next calls it (next-auth's session
 * mocked with a real encrypted token): a wrong password seals nothing and records nothing, the
 * note and the meaning are required, an open discussion thread blocks until acknowledged, and
 * the signature (who, role, when, meaning, note, acknowledged threads) is sealed into the
 * snapshot, recorded in the audit event and carried by the report. Accounts without a password
 * sign with an institutional sign-in of the last few minutes. Data: the invented Cu-like curve.
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { SIGN, TEST_PASSWORD } from "./fixtures";
import { fullChain, makeAnalysis, makeReviewFixture, writeSteps, type ReviewFixture } from "./reviewFixtures";
import type { Role } from "../../lib/server/permissions";
import { buildReport, reviewTransition, FRESH_SIGN_IN_MINUTES, SIGNATURE_MEANINGS, type RevisionSnapshot } from "../../lib/server/review";
import { createThread, setThreadState } from "../../lib/server/notebook";

const session = vi.hoisted(() => ({ userId: null as string | null, claims: undefined as Record<string, unknown> | undefined }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as review from "../../app/api/groups/[slug]/analyses/[id]/review/route";
import * as preview from "../../app/api/groups/[slug]/analyses/[id]/review/preview/route";

let t: TestDatabase;
let f: ReviewFixture;

async function submitted(title: string) {
  const r = await makeAnalysis(t.db, f, f.sampleId, f.measurementId, title);
  await writeSteps(t.db, f.groupId, f.sampleId, r.revisionId, fullChain(f.measurementId));
  await reviewTransition(t.db, f.members.analyst, r.analysisId, r.revisionId, { action: "submit", version: 1 });
  return r;
}

async function post(as: Role, r: { analysisId: string; revisionId: string }, body: Record<string, unknown>) {
  session.userId = f.members[as].userId;
  const req = new Request("http://localhost/api/x", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ revisionId: r.revisionId, action: "approve", version: 2, ...body }) });
  const res = await review.POST(req, { params: Promise.resolve({ slug: f.slug, id: r.analysisId }) });
  return { status: res.status, body: (await res.json()) as any };
}

/** What a refused approval must leave as it was: state, version, seal, decisions, audit events. */
async function footprint(revisionId: string) {
  const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: revisionId }, include: { decisions: true } });
  return { state: rev.state, version: rev.version, contentHash: rev.contentHash, decisions: rev.decisions.length, audit: await t.db.auditEvent.count(), notices: await t.db.notice.count() };
}

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  f = await makeReviewFixture(t.db);
});
afterAll(async () => { await t.drop(); });

describe("POST review approve: what is refused changes nothing", () => {
  it("approve with a wrong password is 422 on field password and seals nothing, records no audit event", async () => {
    const r = await submitted("wrong password");
    const before = await footprint(r.revisionId);
    const res = await post("reviewer", r, { meaning: "internal", comment: "looks right", password: "not-the-password" });
    expect(res.status).toBe(422);
    expect(res.body).toMatchObject({ field: "password", error: expect.stringMatching(/password is wrong; nothing was sealed/) });
    expect(await footprint(r.revisionId)).toEqual(before);
  });

  it("approve without a password, without a note, or without a meaning is 422 naming the field and seals nothing", async () => {
    const r = await submitted("missing parts");
    const before = await footprint(r.revisionId);
    expect((await post("reviewer", r, { meaning: "internal", comment: "fine" })).body).toMatchObject({ field: "password" });
    expect((await post("reviewer", r, { meaning: "internal", password: TEST_PASSWORD })).body).toMatchObject({ field: "comment", error: expect.stringMatching(/write a note/) });
    expect((await post("reviewer", r, { meaning: "internal", comment: "   ", password: TEST_PASSWORD })).body).toMatchObject({ field: "comment" });
    expect((await post("reviewer", r, { comment: "fine", password: TEST_PASSWORD })).body).toMatchObject({ field: "meaning" });
    expect((await post("reviewer", r, { meaning: "for-my-cv", comment: "fine", password: TEST_PASSWORD })).status).toBe(422);
    expect(await footprint(r.revisionId)).toEqual(before);
  });

  it("an open discussion thread blocks approval (422 naming it) until it is acknowledged; a resolved one does not count", async () => {
    const r = await submitted("open thread");
    const open = await createThread(t.db, f.members.analyst, r.analysisId, { body: "Is the 5 K point an outlier?" });
    const done = await createThread(t.db, f.members.reviewer, r.analysisId, { body: "Addenda checked." });
    await setThreadState(t.db, f.members.reviewer, r.analysisId, done.threadId, { state: "resolved" });
    const before = await footprint(r.revisionId);
    const blocked = await post("reviewer", r, { ...SIGN, comment: "fit is fine" });
    expect(blocked.status).toBe(422);
    expect(blocked.body).toMatchObject({ field: "acknowledgedThreadIds", error: expect.stringMatching(/1 discussion thread is still open .*Is the 5 K point an outlier\?/) });
    expect(await footprint(r.revisionId)).toEqual(before);
    const ok = await post("reviewer", r, { ...SIGN, comment: "fit is fine; the 5 K point stays (within 2σ)", acknowledgedThreadIds: [open.threadId] });
    expect(ok.status).toBe(200);
    const snap = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).snapshot as unknown as RevisionSnapshot;
    expect(snap.signature!.acknowledgedThreads).toEqual([{ id: open.threadId, openedBy: "analyst", excerpt: "Is the 5 K point an outlier?" }]);
  });
});

describe("the signature is sealed, audited and reported", () => {
  let r: { analysisId: string; revisionId: string };
  beforeAll(async () => {
    r = await submitted("signed");
    const res = await post("reviewer", r, { meaning: "publication", comment: "Window 2–6 K, residuals flat.", password: TEST_PASSWORD });
    expect(res.status).toBe(200);
  });

  it("the snapshot carries who, role, when, meaning, statement, note and method, covered by the content hash", async () => {
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
    const s = rev.snapshot as unknown as RevisionSnapshot;
    expect(s.format).toBe("heatbook-seal/2");
    expect(s.signature).toEqual({
      signerId: f.members.reviewer.userId, signerName: "reviewer", signerEmail: expect.stringMatching(/^reviewer-/), signerRole: "reviewer", meaning: "publication",
      statement: SIGNATURE_MEANINGS.publication, note: "Window 2–6 K, residuals flat.", signedAt: rev.sealedAt!.toISOString(), method: "password", acknowledgedThreads: [],
    });
    expect(s.context!.sample).toMatchObject({ formula: "Cu", atomsPerFormulaUnit: 1, compositionValue: null });
  });

  it("the approval's audit event records the signature and the content hash, never the password", async () => {
    const ev = await t.db.auditEvent.findFirstOrThrow({ where: { action: "revision.approve", objectId: r.revisionId } });
    const rev = await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } });
    expect(ev.afterHash).toBe(rev.contentHash);
    expect(ev.detail).toMatchObject({ signature: { signerRole: "reviewer", meaning: "publication", note: "Window 2–6 K, residuals flat.", method: "password" } });
    expect(JSON.stringify(ev.detail)).not.toContain(TEST_PASSWORD);
    expect(JSON.stringify(rev.snapshot)).not.toContain(TEST_PASSWORD);
  });

  it("buildReport carries the signature for the page and the PDF", async () => {
    const rep = await buildReport(t.db, f.members.viewer, r.analysisId, r.revisionId);
    expect(rep.signature).toMatchObject({ signerName: "reviewer", signerRole: "reviewer", meaning: "publication", note: "Window 2–6 K, residuals flat." });
  });
});

describe("sealPreview and its route: what the confirmation shows", () => {
  it("GET review/preview gives the key numbers with σ, model, window, files with checksums, open threads and meanings", async () => {
    const r = await submitted("preview");
    const th = await createThread(t.db, f.members.reviewer, r.analysisId, { body: "Why no T⁵ term?" });
    session.userId = f.members.reviewer.userId;
    const res = await preview.GET(new Request(`http://localhost/api/x?revision=${r.revisionId}`), { params: Promise.resolve({ slug: f.slug, id: r.analysisId }) });
    expect(res.status).toBe(200);
    const p = (await res.json()).preview;
    expect(p.report.fits[0]).toMatchObject({ model: "sommerfeld", tMaxK: 6, parameters: expect.arrayContaining([expect.objectContaining({ name: "gamma", stdError: expect.any(Number) })]) });
    expect(p.report.provenance[0]).toMatchObject({ fileName: "invented.csv", sha256: expect.stringMatching(/^[0-9a-f]{64}$/) });
    expect(p.openThreads).toEqual([expect.objectContaining({ id: th.threadId, excerpt: "Why no T⁵ term?" })]);
    expect(p.meanings.map((m: any) => m.key)).toEqual(["publication", "internal"]);
    expect(p.identity).toBe("password");
    session.userId = f.members.analyst.userId;
    const other = await preview.GET(new Request(`http://localhost/api/x?revision=${r.revisionId}`), { params: Promise.resolve({ slug: f.slug, id: r.analysisId }) });
    expect(other.status).toBe(403);
  });
});

describe("accounts without a password sign with a fresh institutional sign-in", () => {
  async function passwordless(role: "reviewer") {
    await t.db.user.update({ where: { id: f.members[role].userId }, data: { passwordHash: null } });
  }
  afterAll(async () => {
    const bcrypt = (await import("bcryptjs")).default;
    await t.db.user.update({ where: { id: f.members.reviewer.userId }, data: { passwordHash: await bcrypt.hash(TEST_PASSWORD, 4) } });
  });

  it("reviewTransition approve without a password and without an institutional sign-in is refused (403) saying what to do", async () => {
    const r = await submitted("no password, no institution");
    await passwordless("reviewer");
    await expect(reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, meaning: "internal", comment: "ok" }))
      .rejects.toMatchObject({ name: "ForbiddenError", message: expect.stringMatching(/password-set link, or sign in with your institution; nothing was sealed/) });
  });

  it("an institutional sign-in older than the limit is refused; a fresh one (from the session cookie, through the route) signs", async () => {
    const r = await submitted("institution");
    await passwordless("reviewer");
    const stale = new Date(Date.now() - (FRESH_SIGN_IN_MINUTES + 1) * 60_000);
    await expect(reviewTransition(t.db, f.members.reviewer, r.analysisId, r.revisionId, { action: "approve", version: 2, meaning: "internal", comment: "ok" }, { institutionSignInAt: stale }))
      .rejects.toMatchObject({ name: "ForbiddenError", message: expect.stringMatching(/more than 10 minutes old/) });
    session.claims = { via: "institution", authAt: Math.floor(Date.now() / 1000) - 60 };
    try {
      const res = await post("reviewer", r, { meaning: "internal", comment: "signed after signing in again" });
      expect(res.status).toBe(200);
    } finally {
      session.claims = undefined;
    }
    const s = (await t.db.analysisRevision.findUniqueOrThrow({ where: { id: r.revisionId } })).snapshot as unknown as RevisionSnapshot;
    expect(s.signature!.method).toBe("institution-sign-in");
  });

  it("a password session of the same passwordless account does not count as an institutional sign-in", async () => {
    const r = await submitted("password session");
    await passwordless("reviewer");
    session.claims = { via: "password", authAt: Math.floor(Date.now() / 1000) };
    try {
      expect((await post("reviewer", r, { meaning: "internal", comment: "ok" })).status).toBe(403);
    } finally {
      session.claims = undefined;
    }
  });
});

