/**
 * Upload limits through the real code paths (sign-in throttling: tests/server/auth-signin.test.ts):
 * the import routes refuse a file over MAX_UPLOAD_BYTES (20 MiB) with 413 naming the field
 * "file" — declared by Content-Length or not — and store nothing (tests/security/requests.test.ts:
 * bodies counted as they arrive).
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "../server/fixtures";
import { createSample } from "../../lib/server/samples";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import { MAX_UPLOAD_BYTES } from "../../lib/server/measurements";
import * as measurements from "../../app/api/groups/[slug]/samples/[id]/measurements/route";
import * as imports from "../../app/api/groups/[slug]/samples/[id]/imports/route";

let t: TestDatabase;
let g: GroupFixture;
let sampleId: string;

beforeAll(async () => {
  process.env.HEATBOOK_BCRYPT_COST ??= "4";
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db, "Limits group");
  sampleId = (await createSample(t.db, g.members.analyst, { label: "L-1", formula: "Cu", massMg: 12 })).id;
  session.userId = g.members.analyst.userId;
});
afterAll(async () => t.drop());

function bigForm(bytes: number): FormData {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes).fill(0x31)], "big.csv"));
  form.set("options", JSON.stringify({ mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "J/K" }, kind: "sample", label: "big" }));
  return form;
}

async function post(handler: typeof measurements.POST, body: BodyInit, headers: Record<string, string> = {}) {
  const res = await handler(new Request(`http://localhost/api/groups/${g.slug}/samples/${sampleId}/measurements`, { method: "POST", body, headers }), { params: Promise.resolve({ slug: g.slug, id: sampleId }) });
  return { status: res.status, body: (await res.json()) as { error: string; field?: string } };
}

describe("upload size limit", () => {
  it("POST measurements with a declared Content-Length over the limit answers 413 on field file", async () => {
    const r = await post(measurements.POST, "x", { "content-length": String(MAX_UPLOAD_BYTES + 1024 * 1024), "content-type": "multipart/form-data; boundary=x" });
    expect(r.status).toBe(413);
    expect(r.body.field).toBe("file");
  });

  it("POST measurements with a 21 MiB file and no declared length answers 413 and stores nothing", async () => {
    const before = await t.db.storedFile.count();
    const r = await post(measurements.POST, bigForm(MAX_UPLOAD_BYTES + 1024 * 1024));
    expect(r.status).toBe(413);
    expect(r.body.error).toMatch(/larger than 20 MiB/);
    expect(await t.db.storedFile.count()).toBe(before);
    const p = await post(imports.POST as typeof measurements.POST, bigForm(MAX_UPLOAD_BYTES + 1));
    expect(p.status).toBe(413);
  }, 60_000);
});
