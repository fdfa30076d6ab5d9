/**
 * API token expiry and renewal, their audit rows, the v1 rate limit shared by two limiter
 * instances on separate connection pools (as two app processes would hold), and its answer
 * through a real v1 route.
 */
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { makeGroup, type GroupFixture } from "./fixtures";
import { authenticateToken, createToken, listTokens, renewToken, revokeToken } from "../../lib/server/tokens";
import { verifyAuditChain } from "../../lib/server/audit";
import { ConflictError, UnauthenticatedError } from "../../lib/engine/errors";
import { createDb, type Db } from "../../lib/server/db/client";
import { PgTokenBucketLimiter, setApiLimiter } from "../../lib/server/api";
import { call } from "./apiHelpers";
import * as samples from "../../app/api/v1/samples/route";

let t: TestDatabase;
let A: GroupFixture;
let second: Db;
const DAY = 24 * 3600 * 1000;

beforeAll(async () => {
  t = await freshDatabase();
  process.env.DATABASE_URL = t.url;
  A = await makeGroup(t.db, "Token expiry");
  second = createDb(`${t.url}?application_name=second-instance`, 4);
});
afterAll(async () => { await second.$disconnect(); await t.drop(); });

describe("token expiry", () => {
  it("createToken gives a token 90 days by default, or the days asked for, and lists the expiry", async () => {
    const before = Date.now();
    const { info } = await createToken(t.db, A.members.analyst, { name: "default", scope: "read" });
    const days = (Date.parse(info.expiresAt) - before) / DAY;
    expect(days).toBeGreaterThan(89.99);
    expect(days).toBeLessThan(90.01);
    const short = await createToken(t.db, A.members.analyst, { name: "short", scope: "read", days: 7 });
    expect(Math.round((Date.parse(short.info.expiresAt) - before) / DAY)).toBe(7);
    expect((await listTokens(t.db, A.members.analyst)).find((x) => x.id === short.info.id)?.expiresAt).toBe(short.info.expiresAt);
    await expect(createToken(t.db, A.members.analyst, { name: "long", scope: "read", days: 400 })).rejects.toMatchObject({ field: "days" });
  });

  it("authenticateToken refuses an expired token with the date, and renewToken brings it back for 90 days", async () => {
    const { token, info } = await createToken(t.db, A.members.analyst, { name: "expiring", scope: "read" });
    expect((await authenticateToken(t.db, token)).tokenId).toBe(info.id);
    await t.db.apiToken.update({ where: { id: info.id }, data: { expiresAt: new Date(Date.UTC(2026, 0, 5, 9, 30)) } });
    await expect(authenticateToken(t.db, token)).rejects.toThrow(UnauthenticatedError);
    await expect(authenticateToken(t.db, token)).rejects.toThrow("this API token expired on 2026-01-05 09:30 UTC: its owner can renew it in the group's Settings");
    const renewed = await renewToken(t.db, A.members.analyst, info.id, {});
    expect(Math.round((Date.parse(renewed.expiresAt) - Date.now()) / DAY)).toBe(90);
    expect(renewed.renewedAt).not.toBeNull();
    expect((await authenticateToken(t.db, token)).tokenId).toBe(info.id);
  });

  it("the v1 API answers 401 for an expired token", async () => {
    setApiLimiter(undefined);
    const { token, info } = await createToken(t.db, A.members.viewer, { name: "v1 expiring", scope: "read" });
    expect((await call(samples.GET, "/samples", { token })).status).toBe(200);
    await t.db.apiToken.update({ where: { id: info.id }, data: { expiresAt: new Date(Date.now() - 1000) } });
    const r = await call(samples.GET, "/samples", { token });
    expect(r.status).toBe(401);
    expect(r.body.error).toMatch(/expired/);
  });

  it("renewToken of a revoked token is refused, and of another member's token is not found for a non-owner", async () => {
    const { info } = await createToken(t.db, A.members.reviewer, { name: "to revoke", scope: "read" });
    await expect(renewToken(t.db, A.members.analyst, info.id)).rejects.toThrow(/not found/i);
    await renewToken(t.db, A.members.owner, info.id);
    await revokeToken(t.db, A.members.reviewer, info.id);
    await expect(renewToken(t.db, A.members.reviewer, info.id)).rejects.toThrow(ConflictError);
  });

  it("createToken, renewToken and revokeToken each append an audit row, and the chain verifies", async () => {
    const { info } = await createToken(t.db, A.members.analyst, { name: "audited", scope: "read_write" });
    await renewToken(t.db, A.members.analyst, info.id, { days: 30 });
    await revokeToken(t.db, A.members.analyst, info.id);
    const events = await t.db.auditEvent.findMany({ where: { objectId: info.id }, orderBy: { id: "asc" } });
    expect(events.map((e) => e.action)).toEqual(["token.create", "token.renew", "token.revoke"]);
    expect(JSON.stringify(events[1]!.detail)).toMatch(/expiresAt/);
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
  });
});

describe("rate limit shared across instances", () => {
  it("two limiters on separate pools of one database allow the burst once between them, not once each", async () => {
    const opts = { capacity: 10, refillPerSecond: 0.001 };
    const a = new PgTokenBucketLimiter(t.db, opts);
    const b = new PgTokenBucketLimiter(second, opts);
    const results = await Promise.all(Array.from({ length: 30 }, (_, i) => (i % 2 ? a : b).take("shared-token")));
    expect(results.filter((r) => r.allowed)).toHaveLength(10);
    const refused = results.find((r) => !r.allowed)!;
    expect(refused.retryAfterSeconds).toBeGreaterThan(0);
  });

  it("the v1 API's 429 counts requests made through another instance's limiter", async () => {
    const { token } = await createToken(t.db, A.members.viewer, { name: "limited", scope: "read" });
    const opts = { capacity: 3, refillPerSecond: 0.01 };
    setApiLimiter(new PgTokenBucketLimiter(second, opts));
    expect((await call(samples.GET, "/samples", { token })).status).toBe(200);
    expect((await call(samples.GET, "/samples", { token })).status).toBe(200);
    setApiLimiter(new PgTokenBucketLimiter(t.db, opts));
    expect((await call(samples.GET, "/samples", { token })).status).toBe(200);
    const r = await call(samples.GET, "/samples", { token });
    expect(r.status).toBe(429);
    expect(Number(r.headers.get("retry-after"))).toBeGreaterThan(0);
    setApiLimiter(undefined);
  });
});
