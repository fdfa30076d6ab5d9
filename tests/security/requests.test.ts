/**
 * Request bodies through the real route handlers (session mocked as the group's analyst, real
 * PostgreSQL): limits counted on the bytes as they arrive (a chunked body without Content-Length
 * is refused with 413 and read no further than the limit), JSON depth and size limits, NUL and
 * bidirectional control characters refused with 422 naming the field (a NUL in a label gave a 500).
 */
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "../server/fixtures";
import { createSample } from "../../lib/server/samples";
import { createAnalysis, openNotebook } from "../../lib/server/notebook";
import { assertJsonDepth, MAX_JSON_BYTES, readBodyLimited } from "../../lib/server/body";
import { MAX_UPLOAD_BYTES } from "../../lib/server/measurements";

const session = vi.hoisted(() => ({ userId: null as string | null }));
vi.mock("next/headers", async () => (await import("../helpers/session")).headersFor(session));

import * as samples from "../../app/api/groups/[slug]/samples/route";
import * as sample from "../../app/api/groups/[slug]/samples/[id]/route";
import * as step from "../../app/api/groups/[slug]/analyses/[id]/steps/[stepId]/route";
import * as measurements from "../../app/api/groups/[slug]/samples/[id]/measurements/route";

type H = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

let t: TestDatabase;
let g: GroupFixture;
let sampleId: string;

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  g = await makeGroup(t.db, "Requests group");
  sampleId = (await createSample(t.db, g.members.analyst, { label: "RQ-1", formula: "Cu", massMg: 12 })).id;
  session.userId = g.members.analyst.userId;
});
afterAll(async () => t.drop());

/** A body that arrives in `chunk`-byte pieces, `total` bytes in all, counting what was pulled. */
function chunked(total: number, chunk = 64 * 1024, fill = 0x20): { body: ReadableStream<Uint8Array>; pulled: () => number } {
  let sent = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(c) {
      if (sent >= total) return c.close();
      const n = Math.min(chunk, total - sent);
      sent += n;
      c.enqueue(new Uint8Array(n).fill(fill));
    },
  }, { highWaterMark: 0 });
  return { body, pulled: () => sent };
}

async function call(handler: unknown, path: string, params: Record<string, string>, init: RequestInit & { duplex?: "half" }) {
  const res = await (handler as H)(new Request(`http://localhost/api/groups/${g.slug}/${path}`, init), { params: Promise.resolve({ slug: g.slug, ...params }) });
  return { status: res.status, body: (await res.json()) as { error: string; field?: string } };
}

const json = (v: unknown) => ({ method: "POST", headers: { "content-type": "application/json" }, body: typeof v === "string" ? v : JSON.stringify(v) });

describe("bodies counted as they arrive", () => {
  it("readBodyLimited stops reading a chunked body at the limit and refuses it with 413", async () => {
    const s = chunked(200 * 1024 * 1024);
    const req = new Request("http://localhost/x", { method: "POST", body: s.body, duplex: "half" } as RequestInit);
    await expect(readBodyLimited(req, 1024 * 1024, "upload", "file")).rejects.toMatchObject({ name: "PayloadTooLargeError", message: "the upload is larger than 1 MiB", field: "file" });
    // Read up to the limit plus the chunk in flight — never the 200 MB.
    expect(s.pulled()).toBeLessThanOrEqual(1024 * 1024 + 3 * 64 * 1024);
  });

  it("POST measurements with a chunked multipart body over the upload limit answers 413 on field file", async () => {
    const s = chunked(MAX_UPLOAD_BYTES + 2 * 1024 * 1024);
    const r = await call(measurements.POST, `samples/${sampleId}/measurements`, { id: sampleId }, { method: "POST", body: s.body, duplex: "half", headers: { "content-type": "multipart/form-data; boundary=x" } });
    expect(r.status).toBe(413);
    expect(r.body).toMatchObject({ error: "the upload is larger than 20 MiB", field: "file" });
    expect(s.pulled()).toBeLessThan(MAX_UPLOAD_BYTES + 512 * 1024);
  });

  it("POST samples with a chunked JSON body over 1 MiB answers 413", async () => {
    const s = chunked(MAX_JSON_BYTES * 3);
    const r = await call(samples.POST, "samples", {}, { method: "POST", body: s.body, duplex: "half", headers: { "content-type": "application/json" } });
    expect(r.status).toBe(413);
    expect(r.body.error).toBe("the JSON body is larger than 1 MiB");
    expect(s.pulled()).toBeLessThan(MAX_JSON_BYTES + 256 * 1024);
  });
});

describe("JSON depth", () => {
  it("PATCH of a note step with a 100 000-level nested config is refused with 422 and stores nothing", async () => {
    const a = await createAnalysis(t.db, g.members.analyst, { sampleId, title: "deep" });
    const nb = await openNotebook(t.db, g.members.analyst, a.id);
    const target = nb.steps[0]!;
    const deep = '{"version":' + target.version + ',"config":' + "[".repeat(100_000) + "]".repeat(100_000) + "}";
    const r = await call(step.PATCH, `analyses/${a.id}/steps/${target.id}`, { id: a.id, stepId: target.id }, { ...json(deep), method: "PATCH" });
    expect(r.status).toBe(422);
    // The outer object is level 1, so the 64th bracket is the first one too deep.
    expect(r.body.error).toBe(`the JSON nests deeper than 64 levels (at line 1, column ${deep.indexOf("[") + 64})`);
    expect((await t.db.step.findUniqueOrThrow({ where: { id: target.id } })).version).toBe(target.version);
  });

  it("assertJsonDepth counts brackets outside strings only and names line and column", () => {
    expect(() => assertJsonDepth('{"a": "[[[[[[[[[["}', 2)).not.toThrow();
    expect(() => assertJsonDepth('{"a": "\\"[[[["}', 2)).not.toThrow();
    expect(() => assertJsonDepth('{\n "a": [[1]]}', 2)).toThrow("the JSON nests deeper than 2 levels (at line 2, column 8)");
  });
});

describe("control characters in names", () => {
  it("POST samples with a NUL in the label answers 422 naming the field (it was a 500)", async () => {
    const r = await call(samples.POST, "samples", {}, json({ label: "Cu\u0000-1", formula: "Cu", massMg: 1 }));
    expect(r.status).toBe(422);
    expect(r.body).toEqual({ error: "invalid label: contains a NUL character (U+0000) at character 3; remove it (field label)", field: "label" });
  });

  it("PATCH sample with a right-to-left override in the label answers 422 naming the field and changes nothing", async () => {
    const before = await t.db.sample.findUniqueOrThrow({ where: { id: sampleId } });
    const r = await call(sample.PATCH, `samples/${sampleId}`, { id: sampleId }, { ...json({ label: "RQ-\u202Egpj.exe", version: before.version }), method: "PATCH" });
    expect(r.status).toBe(422);
    expect(r.body).toEqual({ error: "invalid label: contains the bidirectional control character U+202E at character 4; remove it (field label)", field: "label" });
    expect((await t.db.sample.findUniqueOrThrow({ where: { id: sampleId } })).label).toBe("RQ-1");
  });

  it("a nested field with an isolate character is named by its path", async () => {
    const r = await call(samples.POST, "samples", {}, json({ label: "ok", formula: "Cu", valences: { "Cu\u2066": 1 } }));
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("valences.Cu\u2066");
    expect(r.body.error).toMatch(/U\+2066/);
  });

  it("a multipart upload with a bidi control in its options names options.label", async () => {
    const form = new FormData();
    form.set("file", new File(["T,C\n2,1e-6\n3,2e-6\n4,3e-6\n"], "x.csv"));
    form.set("options", JSON.stringify({ kind: "sample", label: "zero\u202Dfield", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "J/K" } }));
    const r = await call(measurements.POST, `samples/${sampleId}/measurements`, { id: sampleId }, { method: "POST", body: form });
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("options.label");
  });
});
