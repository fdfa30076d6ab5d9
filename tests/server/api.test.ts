import { describe, it, expect, beforeAll, afterAll, beforeEach } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { createToken, revokeToken } from "../../lib/server/tokens";
import { setApiLimiter, PgTokenBucketLimiter } from "../../lib/server/api";
import { createSample } from "../../lib/server/samples";
import { call } from "./apiHelpers";
import * as samples from "../../app/api/v1/samples/route";
import * as sample from "../../app/api/v1/samples/[id]/route";
import * as sampleMeasurements from "../../app/api/v1/samples/[id]/measurements/route";
import * as measurement from "../../app/api/v1/measurements/[id]/route";

let t: TestDatabase;
let A: GroupFixture;
let B: GroupFixture;
const tok: Record<string, string> = {};

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  A = await makeGroup(t.db, "Alloys A");
  B = await makeGroup(t.db, "Group B");
  tok.rw = (await createToken(t.db, A.members.analyst, { name: "script", scope: "read_write" })).token;
  tok.read = (await createToken(t.db, A.members.analyst, { name: "reader", scope: "read" })).token;
  tok.viewerRw = (await createToken(t.db, A.members.viewer, { name: "viewer rw", scope: "read_write" })).token;
  tok.b = (await createToken(t.db, B.members.owner, { name: "b", scope: "read_write" })).token;
});
afterAll(() => t.drop());
beforeEach(() => setApiLimiter(new PgTokenBucketLimiter(t.db, { capacity: 1000, refillPerSecond: 1000 })));

const CU = { label: "Cu ref", formula: "Cu", massMg: 12.5, densityGPerCm3: 8.96 };

describe("v1 token authentication", () => {
  it("GET /samples without a token answers 401 JSON with WWW-Authenticate", async () => {
    const r = await call(samples.GET, "/samples");
    expect(r.status).toBe(401);
    expect(r.body.error).toMatch(/Bearer/);
    expect(r.headers.get("www-authenticate")).toMatch(/Bearer/);
  });
  it("GET /samples with an unknown or malformed token answers 401", async () => {
    expect((await call(samples.GET, "/samples", { token: "hb_abcdef_" + "x".repeat(43) })).status).toBe(401);
    expect((await call(samples.GET, "/samples", { token: "nonsense" })).status).toBe(401);
  });
  it("a revoked token answers 401 saying it was revoked", async () => {
    const { token, info } = await createToken(t.db, A.members.analyst, { name: "soon revoked", scope: "read" });
    expect((await call(samples.GET, "/samples", { token })).status).toBe(200);
    await revokeToken(t.db, A.members.analyst, info.id);
    const r = await call(samples.GET, "/samples", { token });
    expect(r.status).toBe(401);
    expect(r.body.error).toMatch(/revoked/);
  });
  it("a token whose user left the group answers 401", async () => {
    const { makeUser } = await import("./fixtures");
    const u = await makeUser(t.db, "leaver");
    await t.db.membership.create({ data: { userId: u.id, groupId: A.groupId, role: "analyst" } });
    const { memberOf } = await import("../../lib/server/access");
    const { token } = await createToken(t.db, await memberOf(t.db, u.id, A.slug), { name: "x", scope: "read" });
    await t.db.membership.deleteMany({ where: { userId: u.id } });
    const r = await call(samples.GET, "/samples", { token });
    expect(r.status).toBe(401);
    expect(r.body.error).toMatch(/no longer a member/);
  });
  it("a successful call records the token's last use", async () => {
    const { token, info } = await createToken(t.db, A.members.analyst, { name: "used", scope: "read" });
    expect(info.lastUsedAt).toBeNull();
    await call(samples.GET, "/samples", { token });
    const row = await t.db.apiToken.findUniqueOrThrow({ where: { id: info.id } });
    expect(row.lastUsedAt).not.toBeNull();
  });
});

describe("v1 scopes, roles and group boundaries", () => {
  it("POST /samples with a read token answers 403", async () => {
    const r = await call(samples.POST, "/samples", { token: tok.read, json: CU });
    expect(r.status).toBe(403);
    expect(r.body.error).toMatch(/read-only/);
  });
  it("POST /samples with a read_write token of a viewer answers 403 (the role decides)", async () => {
    expect((await call(samples.POST, "/samples", { token: tok.viewerRw, json: CU })).status).toBe(403);
  });
  it("POST /samples with a read_write analyst token creates the sample (201)", async () => {
    const r = await call(samples.POST, "/samples", { token: tok.rw, json: CU });
    expect(r.status).toBe(201);
    expect(r.body.sample.molarMassGPerMol).toBeCloseTo(63.546, 3);
    expect(r.headers.get("x-ratelimit-limit")).toBe("1000");
  });
  it("GET /samples/{id} of another group's sample answers 404", async () => {
    const other = await createSample(t.db, B.members.owner, { label: "B only", formula: "Nb" });
    const r = await call(sample.GET, `/samples/${other.id}`, { token: tok.rw, params: { id: other.id } });
    expect(r.status).toBe(404);
    const own = await call(sample.GET, `/samples/${other.id}`, { token: tok.b, params: { id: other.id } });
    expect(own.status).toBe(200);
  });
  it("POST /samples with an invalid body answers 422 naming the field", async () => {
    const r = await call(samples.POST, "/samples", { token: tok.rw, json: { label: "x", formula: "Cu", massMg: -1 } });
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("massMg");
  });
  it("POST /samples/{id} updates with the version and answers 409 on a stale version", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "to edit", formula: "Ag" });
    const ok = await call(sample.POST, `/samples/${s.id}`, { token: tok.rw, params: { id: s.id }, json: { version: 1, notes: "annealed" } });
    expect(ok.status).toBe(200);
    expect(ok.body.sample.notes).toBe("annealed");
    expect((await call(sample.POST, `/samples/${s.id}`, { token: tok.rw, params: { id: s.id }, json: { version: 1, notes: "again" } })).status).toBe(409);
  });
});

describe("v1 pagination", () => {
  it("GET /samples?limit=2 walks every sample exactly once through nextCursor", async () => {
    for (let i = 0; i < 5; i++) await createSample(t.db, A.members.analyst, { label: `page ${i}`, formula: "Al" });
    const total = await t.db.sample.count({ where: { groupId: A.groupId, archivedAt: null } });
    const seen: string[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const r = await call(samples.GET, `/samples?limit=2${cursor ? `&cursor=${cursor}` : ""}`, { token: tok.read });
      expect(r.status).toBe(200);
      expect(r.body.samples.length).toBeLessThanOrEqual(2);
      seen.push(...r.body.samples.map((s: { id: string }) => s.id));
      cursor = r.body.nextCursor;
      pages++;
    } while (cursor);
    expect(seen.length).toBe(total);
    expect(new Set(seen).size).toBe(total);
    expect(pages).toBe(Math.max(1, Math.ceil(total / 2)));
  });
  it("GET /samples with limit=0 or a forged cursor answers 422 naming the field", async () => {
    expect((await call(samples.GET, "/samples?limit=0", { token: tok.read })).body.field).toBe("limit");
    const r = await call(samples.GET, "/samples?cursor=abc", { token: tok.read });
    expect(r.status).toBe(422);
    expect(r.body.field).toBe("cursor");
  });
});

describe("v1 rate limit", () => {
  it("the third request within a burst of 2 answers 429 with Retry-After", async () => {
    setApiLimiter(new PgTokenBucketLimiter(t.db, { capacity: 2, refillPerSecond: 0.5 }));
    expect((await call(samples.GET, "/samples", { token: tok.read })).status).toBe(200);
    expect((await call(samples.GET, "/samples", { token: tok.read })).status).toBe(200);
    const r = await call(samples.GET, "/samples", { token: tok.read });
    expect(r.status).toBe(429);
    expect(r.headers.get("retry-after")).toBe("2");
    expect(r.body.error).toMatch(/rate limit/);
    expect((await call(samples.GET, "/samples", { token: tok.b })).status).toBe(200);
  });
  it("PgTokenBucketLimiter refills at its rate", async () => {
    let now = Date.UTC(2026, 11, 4, 12, 0, 0);
    const l = new PgTokenBucketLimiter(t.db, { capacity: 1, refillPerSecond: 2 }, () => now);
    expect((await l.take("refill-k")).allowed).toBe(true);
    expect((await l.take("refill-k")).allowed).toBe(false);
    now += 499;
    expect((await l.take("refill-k")).allowed).toBe(false);
    now += 501;
    expect((await l.take("refill-k")).allowed).toBe(true);
  });
});

const FILE = "# invented demo data\nT (K),C (uJ/K),dC (uJ/K)\n2.0,1.5,0.01\n3.0,3.75,0.02\n4.0,7.25,0.03\n";

describe("v1 measurement upload", () => {
  it("POST /samples/{id}/measurements with a raw text body stores the file and SI points", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "raw upload", formula: "Cu" });
    const r = await call(sampleMeasurements.POST, `/samples/${s.id}/measurements?fileName=cu.csv&label=run%201`, { token: tok.rw, params: { id: s.id }, body: FILE, headers: { "content-type": "text/plain" } });
    expect(r.status).toBe(201);
    expect(r.body.measurement.pointCount).toBe(3);
    expect(r.body.measurement.units).toEqual({ temperature: "K", heatCapacity: "uJ/K" });
    const m = await call(measurement.GET, `/measurements/${r.body.measurement.id}`, { token: tok.read, params: { id: r.body.measurement.id } });
    expect(m.body.measurement.temperatureK).toEqual([2, 3, 4]);
    expect(m.body.measurement.heatCapacity[1]).toBeCloseTo(3.75e-6, 18);
    expect(m.body.measurement.sigma).not.toBeNull();
    const list = await call(sampleMeasurements.GET, `/samples/${s.id}/measurements`, { token: tok.read, params: { id: s.id } });
    expect(list.body.measurements.map((x: { id: string }) => x.id)).toEqual([r.body.measurement.id]);
  });
  it("POST /samples/{id}/measurements as multipart with options JSON works like the app's import", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "multipart", formula: "Cu" });
    const form = new FormData();
    form.set("file", new File([FILE], "cu.csv", { type: "text/csv" }));
    form.set("options", JSON.stringify({ kind: "sample", label: "mp", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "uJ/K" } }));
    const r = await call(sampleMeasurements.POST, `/samples/${s.id}/measurements`, { token: tok.rw, params: { id: s.id }, body: form });
    expect(r.status).toBe(201);
    expect(r.body.measurement.sigma).toBeUndefined();
    expect(r.body.measurement.fileName).toBe("cu.csv");
  });
  it("POST /samples/{id}/measurements names a missing column and a missing unit", async () => {
    const s = await createSample(t.db, A.members.analyst, { label: "bad upload", formula: "Cu" });
    const bad = await call(sampleMeasurements.POST, `/samples/${s.id}/measurements?tCol=Temp`, { token: tok.rw, params: { id: s.id }, body: FILE, headers: { "content-type": "text/plain" } });
    expect(bad.status).toBe(422);
    expect(bad.body.field).toBe("tCol");
    const noUnit = await call(sampleMeasurements.POST, `/samples/${s.id}/measurements`, { token: tok.rw, params: { id: s.id }, body: "T,C\n1,2\n2,3\n", headers: { "content-type": "text/plain" } });
    expect(noUnit.body.field).toBe("unit");
  });
  it("POST /samples/{id}/measurements for another group's sample answers 404", async () => {
    const other = await createSample(t.db, B.members.owner, { label: "B upload", formula: "Cu" });
    const r = await call(sampleMeasurements.POST, `/samples/${other.id}/measurements`, { token: tok.rw, params: { id: other.id }, body: FILE, headers: { "content-type": "text/plain" } });
    expect(r.status).toBe(404);
  });
});
